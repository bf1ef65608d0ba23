import type { ColumnDocument } from "../text/conll";

/** How the data were split into folds. */
export type FoldUnit = "documents" | "sentence-blocks";

/**
 * k folds of contiguous documents (fold f holds documents [⌊f·n/k⌋, ⌊(f+1)·n/k⌋)). When there are
 * fewer documents than folds (e.g. files without -DOCSTART- lines), the sentences are cut into k
 * contiguous blocks instead, each treated as one document; neighbouring sentences usually come
 * from the same article, so this keeps most articles within one fold.
 */
export function planFolds(documents: readonly ColumnDocument[], k: number): { unit: FoldUnit; folds: ColumnDocument[][] } {
  if (!Number.isInteger(k) || k < 2) throw new RangeError(`folds must be an integer ≥ 2, got ${k}`);
  if (documents.length >= k) {
    const n = documents.length;
    return { unit: "documents", folds: Array.from({ length: k }, (_, f) => documents.slice(Math.floor((f * n) / k), Math.floor(((f + 1) * n) / k))) };
  }
  const sentences = documents.flatMap((d) => d.sentences);
  if (sentences.length < k) throw new RangeError(`cannot make ${k} folds from ${sentences.length} sentences`);
  const n = sentences.length;
  return {
    unit: "sentence-blocks",
    folds: Array.from({ length: k }, (_, f) => [{ sentences: sentences.slice(Math.floor((f * n) / k), Math.floor(((f + 1) * n) / k)) }]),
  };
}
