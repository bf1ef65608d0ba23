import type { Evaluation } from "@tagloom/contracts";
import { formatCount } from "@/lib/format";

/**
 * Token-level confusion between types as a heat map: rows are gold types, columns predicted
 * types, plus "missed" (gold tokens tagged as no entity) and "spurious" (tokens outside every gold
 * entity tagged as a type). Every cell prints its count; the tint only repeats it.
 */
export function ConfusionGrid({ confusion }: { confusion: Evaluation["confusion"] }) {
  const { types, counts, missed, spurious } = confusion;
  const max = Math.max(1, ...counts.flat(), ...missed, ...spurious);
  const cell = (n: number, diagonal: boolean) => {
    const alpha = n === 0 ? 0 : 0.08 + 0.6 * (n / max);
    const bg = diagonal ? `rgba(79, 138, 91, ${alpha})` : `rgba(184, 102, 28, ${alpha})`;
    return (
      <td className="border border-ink-100 px-2 py-1.5 text-right tabular-nums" style={{ backgroundColor: bg }}>
        {formatCount(n)}
      </td>
    );
  };
  if (types.length === 0) return <p className="text-sm text-ink-500">No entity tokens in the test split.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="text-sm" aria-label="Confusion between types (tokens)">
        <caption className="mb-1 text-left text-xs text-ink-500">Rows: gold type · columns: tagged as. Green cells agree; amber cells are errors.</caption>
        <thead>
          <tr>
            <th scope="col" className="px-2 py-1 text-left text-xs text-ink-500">
              gold ↓ / tagged →
            </th>
            {types.map((t) => (
              <th key={t} scope="col" className="px-2 py-1 text-right font-mono text-xs">
                {t}
              </th>
            ))}
            <th scope="col" className="px-2 py-1 text-right text-xs italic">
              missed
            </th>
          </tr>
        </thead>
        <tbody>
          {types.map((g, gi) => (
            <tr key={g}>
              <th scope="row" className="px-2 py-1 text-left font-mono text-xs">
                {g}
              </th>
              {types.map((p, pi) => (
                <Cell key={p} n={counts[gi]?.[pi] ?? 0} diagonal={gi === pi} render={cell} />
              ))}
              <Cell n={missed[gi] ?? 0} diagonal={false} render={cell} />
            </tr>
          ))}
          <tr>
            <th scope="row" className="px-2 py-1 text-left text-xs italic">
              spurious
            </th>
            {types.map((p, pi) => (
              <Cell key={p} n={spurious[pi] ?? 0} diagonal={false} render={cell} />
            ))}
            <td className="border border-ink-100 px-2 py-1.5 text-right text-ink-300">—</td>
          </tr>
        </tbody>
      </table>
    </div>
  );
}

function Cell({ n, diagonal, render }: { n: number; diagonal: boolean; render: (n: number, d: boolean) => React.ReactNode }) {
  return <>{render(n, diagonal)}</>;
}
