import type { DocumentTokens } from "@tagloom/contracts";

/**
 * Where words start and end in a text: the document's own token offsets when it has them, else
 * runs of letters and digits and single other characters (the same cut the tokenizer makes for
 * plain prose, close enough for moving a span's edge by one word).
 */
export function wordEdges(text: string, tokens: Pick<DocumentTokens, "starts" | "ends">): { starts: number[]; ends: number[] } {
  if (tokens.starts.length) return { starts: [...tokens.starts], ends: [...tokens.ends] };
  const starts: number[] = [];
  const ends: number[] = [];
  for (const m of text.matchAll(/[\p{L}\p{N}]+|[^\s\p{L}\p{N}]/gu)) {
    starts.push(m.index);
    ends.push(m.index + m[0].length);
  }
  return { starts, ends };
}

/** The next word start before (`dir` −1) or after (+1) `at`, or `at` when there is none. */
export function stepEdge(edges: readonly number[], at: number, dir: -1 | 1): number {
  if (dir < 0) {
    for (let i = edges.length - 1; i >= 0; i--) if (edges[i]! < at) return edges[i]!;
    return at;
  }
  for (const e of edges) if (e > at) return e;
  return at;
}
