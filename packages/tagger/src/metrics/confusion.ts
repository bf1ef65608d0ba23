import { checkSameShape } from "./check-shapes";

/** Rows are gold labels, columns predicted labels, both in the order of `labels`. */
export type ConfusionMatrix = { labels: string[]; counts: number[][] };

function labelOf(tag: string): string {
  const first = tag.charCodeAt(0);
  return (first === 0x42 || first === 0x49) && tag.charCodeAt(1) === 0x2d && tag.length > 2 ? tag.slice(2) : tag;
}

/**
 * Token-level confusion matrix over labels: entity types with the B-/I- prefix stripped, and `O`;
 * any other tag (e.g. a POS tag) is its own label. `labels` holds every label seen in gold or
 * predicted, sorted in code-unit order with `O` moved last; `counts[g][p]` is the number of tokens
 * with gold label g and predicted label p (labels × labels). Throws RangeError when the shapes
 * (sentences × tokens) differ.
 */
export function computeConfusionMatrix(
  gold: readonly (readonly string[])[],
  predicted: readonly (readonly string[])[],
): ConfusionMatrix {
  checkSameShape(gold, predicted);
  const labelOfTag = new Map<string, string>();
  const note = (tag: string): void => {
    if (!labelOfTag.has(tag)) labelOfTag.set(tag, labelOf(tag));
  };
  for (let s = 0; s < gold.length; s++) {
    for (let i = 0; i < gold[s].length; i++) {
      note(gold[s][i]);
      note(predicted[s][i]);
    }
  }
  const labels = [...new Set(labelOfTag.values())].sort((a, b) => (a === "O" ? 1 : b === "O" ? -1 : a < b ? -1 : a > b ? 1 : 0));
  const labelIndex = new Map(labels.map((label, k) => [label, k]));
  const indexOfTag = new Map<string, number>();
  for (const [tag, label] of labelOfTag) indexOfTag.set(tag, labelIndex.get(label)!);
  const counts = labels.map(() => new Array<number>(labels.length).fill(0));
  for (let s = 0; s < gold.length; s++) {
    const g = gold[s];
    const p = predicted[s];
    for (let i = 0; i < g.length; i++) counts[indexOfTag.get(g[i])!][indexOfTag.get(p[i])!]++;
  }
  return { labels, counts };
}
