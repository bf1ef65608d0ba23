import { type Disagreement, type EntityType, type Span, countOf, spanKey } from "@tagloom/contracts";
import { useMemo } from "react";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { cn } from "@/lib/cn";
import { SpanContext } from "./span-context";
import { stepEdge } from "./word-edges";

/** A choice for one disagreement: one annotator's version, or spans picked, typed and cut by hand. */
export type Choice = { kind: "version"; key: string } | { kind: "edit"; spans: Span[] };

type Props = {
  index: number;
  d: Disagreement;
  text: string;
  types: readonly EntityType[];
  names: ReadonlyMap<string, string>;
  edges: { starts: number[]; ends: number[] };
  choice: Choice | undefined;
  onChoice: (c: Choice) => void;
};

const quote = (text: string, s: { start: number; end: number }) => `“${text.slice(s.start, s.end)}”`;

/**
 * One disagreement: the disputed words as its heading, each annotator's version to choose, or an
 * edit that keeps any of their spans, retypes them and moves their edges word by word. Nothing is
 * chosen until the reviewer chooses.
 */
export function DisagreementItem({ index, d, text, types, names, edges, choice, onChoice }: Props) {
  const candidates = useMemo(() => {
    const all = new Map<string, Span>();
    for (const v of d.versions) for (const s of v.spans) all.set(spanKey(s), s);
    return [...all.values()].sort((a, b) => a.start - b.start || a.end - b.end);
  }, [d]);
  const editSpans = choice?.kind === "edit" ? choice.spans : [];
  const group = `choice-${d.id}`;
  const setEdit = (spans: Span[]) => onChoice({ kind: "edit", spans: [...spans].sort((a, b) => a.start - b.start) });
  const replace = (i: number, s: Span) => setEdit(editSpans.map((x, j) => (j === i ? s : x)));
  const move = (i: number, edge: "start" | "end", dir: -1 | 1) => {
    const s = editSpans[i]!;
    if (edge === "start") {
      const start = stepEdge(edges.starts, s.start, dir);
      if (start < s.end) replace(i, { ...s, start });
    } else {
      const end = stepEdge(edges.ends, s.end, dir);
      if (end > s.start) replace(i, { ...s, end });
    }
  };
  const headingId = `disagreement-${d.id}`;
  return (
    <li className="rounded-md border border-ink-100 p-3" aria-labelledby={headingId}>
      <h3 id={headingId} className="text-sm font-semibold text-ink-800">
        {index + 1}. {quote(text, d)}
        {choice ? <span className="ml-2 text-xs font-normal text-moss-500">settled</span> : <span className="ml-2 text-xs font-normal text-thread-700">to settle</span>}
      </h3>
      <p className="mt-1 text-sm">
        <SpanContext text={text} start={d.start} end={d.end} spans={[]} types={types} />
      </p>
      <fieldset className="mt-2 space-y-1">
        <legend className="sr-only">Settle disagreement {index + 1}</legend>
        {d.versions.map((v) => (
          <label key={v.key} className={cn("flex items-start gap-2 rounded-md px-2 py-1 text-sm", choice?.kind === "version" && choice.key === v.key && "bg-ink-50")}>
            <input type="radio" name={group} checked={choice?.kind === "version" && choice.key === v.key} onChange={() => onChoice({ kind: "version", key: v.key })} className="mt-1.5" />
            <span>
              <span className="font-medium">{names.get(v.key) ?? "Annotator"}:</span>{" "}
              {v.spans.length ? (
                v.spans.map((s) => (
                  <span key={spanKey(s)} className="mr-3">
                    <SpanContext text={text} start={s.start} end={s.end} spans={[s]} types={types} pad={0} />
                  </span>
                ))
              ) : (
                <span className="text-ink-500">no span here</span>
              )}
            </span>
          </label>
        ))}
        <label className={cn("flex items-start gap-2 rounded-md px-2 py-1 text-sm", choice?.kind === "edit" && "bg-ink-50")}>
          <input
            type="radio"
            name={group}
            checked={choice?.kind === "edit"}
            onChange={() => setEdit(choice?.kind === "version" ? (d.versions.find((v) => v.key === choice.key)?.spans ?? []) : [])}
            className="mt-1"
          />
          <span className="font-medium">Edit: keep, retype or resize spans</span>
        </label>
        {choice?.kind === "edit" ? (
          <div className="ml-8 space-y-2">
            <p className="text-xs text-ink-500">{editSpans.length ? `Gold here: ${countOf(editSpans.length, "span")}.` : "Gold here: no span."}</p>
            <ul className="space-y-2">
              {editSpans.map((s, i) => (
                <li key={`${i}:${spanKey(s)}`} className="flex flex-wrap items-center gap-2 text-sm" data-testid="edit-span">
                  <span className="min-w-24 font-serif">{quote(text, s)}</span>
                  <Select aria-label={`Type of ${quote(text, s)}`} className="w-36 py-1" value={s.type} onChange={(e) => replace(i, { ...s, type: e.target.value })}>
                    {types.map((t) => (
                      <option key={t.id} value={t.name}>
                        {t.name}
                      </option>
                    ))}
                  </Select>
                  <span className="inline-flex gap-1" role="group" aria-label={`Edges of ${quote(text, s)}`}>
                    <Button size="sm" variant="ghost" aria-label="Start one word earlier" onClick={() => move(i, "start", -1)}>
                      ⇤ start
                    </Button>
                    <Button size="sm" variant="ghost" aria-label="Start one word later" onClick={() => move(i, "start", 1)}>
                      start ⇥
                    </Button>
                    <Button size="sm" variant="ghost" aria-label="End one word earlier" onClick={() => move(i, "end", -1)}>
                      ⇤ end
                    </Button>
                    <Button size="sm" variant="ghost" aria-label="End one word later" onClick={() => move(i, "end", 1)}>
                      end ⇥
                    </Button>
                  </span>
                  <Button size="sm" variant="ghost" onClick={() => setEdit(editSpans.filter((_, j) => j !== i))}>
                    Remove
                  </Button>
                </li>
              ))}
            </ul>
            {candidates.filter((c) => !editSpans.some((s) => spanKey(s) === spanKey(c))).length ? (
              <div className="flex flex-wrap items-center gap-2 text-sm">
                <span className="text-ink-500">Add an annotator's span:</span>
                {candidates
                  .filter((c) => !editSpans.some((s) => spanKey(s) === spanKey(c)))
                  .map((c) => (
                    <Button key={spanKey(c)} size="sm" variant="secondary" onClick={() => setEdit([...editSpans, c])}>
                      + {c.type} {quote(text, c)}
                    </Button>
                  ))}
              </div>
            ) : null}
          </div>
        ) : null}
      </fieldset>
    </li>
  );
}
