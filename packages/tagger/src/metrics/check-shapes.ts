/**
 * Throws a RangeError naming the first place where `gold` and `predicted` differ in shape:
 * the number of sentences, or the length of one sentence (0-based index).
 */
export function checkSameShape(
  gold: readonly (readonly string[])[],
  predicted: readonly (readonly string[])[],
  where = "",
): void {
  const prefix = where ? `${where}: ` : "";
  if (gold.length !== predicted.length) {
    throw new RangeError(`${prefix}gold has ${gold.length} sentences but predicted has ${predicted.length}`);
  }
  for (let s = 0; s < gold.length; s++) {
    if (gold[s].length !== predicted[s].length) {
      throw new RangeError(`${prefix}sentence ${s}: gold has ${gold[s].length} tags but predicted has ${predicted[s].length}`);
    }
  }
}
