// How far past the padding a cut may move to reach a space, so a long word is not shown whole.
const WORD_SLACK = 20;

/** Moves a cut at `at` outwards (by `dir`) to the nearest space, so an excerpt shows whole words. */
function toWordEdge(text: string, at: number, dir: -1 | 1): number {
  let i = at;
  for (let n = 0; n < WORD_SLACK; n++) {
    if (dir < 0 ? i <= 0 || /\s/.test(text[i - 1]!) : i >= text.length || /\s/.test(text[i]!)) return i;
    i += dir;
  }
  return at;
}

/** The stretch [from, to) of `text` around [start, end) with `pad` characters either side, widened to whole words. */
export function excerptBounds(text: string, start: number, end: number, pad: number): { from: number; to: number } {
  return { from: toWordEdge(text, Math.max(0, start - pad), -1), to: toWordEdge(text, Math.min(text.length, end + pad), 1) };
}
