import { type ColumnDocument, type Token, spansToTags } from "@tagloom/tagger";
import type { RunDocumentRow } from "./training-runs.repository";

/**
 * A stored document as the engine's labelled document: sentences of words with IOB2 tags, built
 * exactly as the CoNLL export writes it (stored tokens; a span cutting a token covers the whole
 * token), so that a run trains on what an export of the same split holds.
 */
export function toColumnDocument(row: RunDocumentRow, typeNames: ReadonlyMap<string, string>): ColumnDocument {
  const tokens: Token[] = row.starts.map((start, i) => ({ start, end: row.ends[i]! }));
  const spans = row.spans.flatMap((s) => {
    const type = typeNames.get(s.typeId);
    return type === undefined ? [] : [{ start: s.start, end: s.end, type }];
  });
  const tags = spansToTags(tokens, spans);
  return {
    sentences: row.sentenceStarts.map((first, s) => {
      const last = row.sentenceStarts[s + 1] ?? tokens.length;
      return { words: tokens.slice(first, last).map((t) => row.text.slice(t.start, t.end)), tags: tags.slice(first, last) };
    }),
  };
}

/** Sentences of words only (unlabelled documents). */
export function toWordSentences(row: RunDocumentRow): string[][] {
  return row.sentenceStarts.map((first, s) => {
    const last = row.sentenceStarts[s + 1] ?? row.starts.length;
    const words: string[] = [];
    for (let i = first; i < last; i++) words.push(row.text.slice(row.starts[i]!, row.ends[i]!));
    return words;
  });
}
