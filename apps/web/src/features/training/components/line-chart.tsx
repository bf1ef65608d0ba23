import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

type Series = { key: string; name: string; color: string; dash?: string };

/**
 * The product's line chart (recharts): a labelled figure whose numbers are also in a table next
 * to it, so nothing is carried by the drawing alone. Lines differ by dash as well as colour.
 */
export function LineFigure<T extends Record<string, number | string>>({
  title,
  data,
  x,
  xLabel,
  series,
  yDomain,
  yFormat,
}: {
  title: string;
  data: T[];
  x: keyof T & string;
  xLabel: string;
  series: Series[];
  yDomain?: [number | "auto", number | "auto"];
  yFormat?: (v: number) => string;
}) {
  return (
    <figure className="rounded-lg border border-ink-100 bg-white p-3" aria-label={title}>
      <figcaption className="mb-2 text-sm font-medium text-ink-800">{title}</figcaption>
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 520, height: 224 }}>
          <LineChart data={data} margin={{ top: 4, right: 16, bottom: 20, left: 8 }}>
            <CartesianGrid stroke="#e6e8ec" strokeDasharray="3 3" />
            <XAxis dataKey={x as string} tick={{ fontSize: 12 }} label={{ value: xLabel, position: "insideBottom", offset: -8, fontSize: 12 }} />
            <YAxis domain={yDomain ?? ["auto", "auto"]} tick={{ fontSize: 12 }} tickFormatter={yFormat} width={64} />
            <Tooltip formatter={(v) => (typeof v === "number" && yFormat ? yFormat(v) : String(v))} />
            {/* Above the plot: below it the legend sat on the x-axis label. */}
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 12 }} />
            {series.map((s) => (
              <Line key={s.key} type="monotone" dataKey={s.key} name={s.name} stroke={s.color} strokeWidth={2} strokeDasharray={s.dash} dot={{ r: 3 }} isAnimationActive={false} />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
