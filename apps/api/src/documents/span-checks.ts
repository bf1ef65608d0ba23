/** A span as users send it: offsets into the text (end exclusive) and an entity type name. */
export type NamedSpan = { start: number; end: number; type: string };

/**
 * What is wrong with a document's spans, one message per problem (empty when all is well): each
 * span must lie inside the text, end after it starts and name a known type, and no two spans may
 * share a character. `label(i)` names span i in messages (e.g. "span 2").
 */
export function findSpanProblems(
  textLength: number,
  spans: readonly NamedSpan[],
  knownTypes: ReadonlySet<string>,
  label: (i: number) => string = (i) => `span ${i + 1}`,
): string[] {
  const problems: string[] = [];
  const valid: number[] = [];
  spans.forEach((s, i) => {
    const where = `${label(i)} [${s.start}, ${s.end})`;
    if (!(s.start < s.end)) problems.push(`${where} must end after it starts`);
    else if (s.start < 0 || s.end > textLength) problems.push(`${where} is outside the text (length ${textLength})`);
    else if (!knownTypes.has(s.type)) problems.push(`${where} has type ${JSON.stringify(s.type)}, which is not in the corpus's entity schema`);
    else valid.push(i);
  });
  valid.sort((a, b) => spans[a]!.start - spans[b]!.start || spans[a]!.end - spans[b]!.end);
  for (let k = 1; k < valid.length; k++) {
    const prev = spans[valid[k - 1]!]!;
    const cur = spans[valid[k]!]!;
    if (cur.start < prev.end) {
      problems.push(`${label(valid[k - 1]!)} [${prev.start}, ${prev.end}) ${prev.type} and ${label(valid[k]!)} [${cur.start}, ${cur.end}) ${cur.type} overlap`);
    }
  }
  return problems;
}
