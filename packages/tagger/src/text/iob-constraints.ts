/**
 * IOB2 validity as transition constraints: I-X may only follow B-X or I-X, and never starts a
 * sentence (conlleval's reading, CoNLL-2000 shared task evaluation script, would otherwise open a
 * chunk at I-X after O or after another type, a sequence IOB2 training data never contains).
 */
export type IobConstraints = {
  /** K×K, 1 where from → to is allowed. */
  readonly allowed: Uint8Array;
  /** K, 1 where a sentence may start. */
  readonly allowedStart: Uint8Array;
};

/** Constraints for a tag list of O / B-X / I-X tags (other tags are left unconstrained). */
export function iobConstraints(tags: readonly string[]): IobConstraints {
  const K = tags.length;
  const allowed = new Uint8Array(K * K).fill(1);
  const allowedStart = new Uint8Array(K).fill(1);
  for (let j = 0; j < K; j++) {
    const to = tags[j];
    if (!to.startsWith("I-")) continue;
    const type = to.slice(2);
    allowedStart[j] = 0;
    for (let i = 0; i < K; i++) {
      const from = tags[i];
      const sameType = (from.startsWith("B-") || from.startsWith("I-")) && from.slice(2) === type;
      if (!sameType) allowed[i * K + j] = 0;
    }
  }
  return { allowed, allowedStart };
}
