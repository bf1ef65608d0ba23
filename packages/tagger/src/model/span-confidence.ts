import type { Chunk } from "../text/bio";
import { buildFirstOrderProblem, buildSecondOrderLattice } from "./decode-input";
import { computeForward } from "../kernels/forward";
import { computeForwardSecondOrder } from "../kernels/forward-second-order";
import type { TaggerModel } from "./tagger-model";

/**
 * Marginal probability of each chunk given the sentence, P(tokens start..end−1 are exactly one
 * X chunk | words) = Z(constrained)/Z: the forward algorithm run with the lattice restricted to
 * B-X at the chunk's first token, I-X inside it and anything but I-X right after it (constrained
 * forward-backward, Culotta & McCallum 2004, "Confidence estimation for information extraction",
 * HLT-NAACL). Exact for IOB2-constrained models; without the constraints a chunk opened by I-X is
 * scored in its IOB2 form.
 *
 * @param logLikelihood log P(words) of the sentence under the model (from forward-backward).
 * @returns one probability in [0, 1] per chunk.
 */
export function chunkConfidences(model: TaggerModel, words: readonly string[], sentenceIndex: number, chunks: readonly Chunk[], logLikelihood: number): number[] {
  if (chunks.length === 0) return [];
  const K = model.tags.length;
  const T = words.length;
  const index = new Map(model.tags.map((t, k) => [t, k]));
  // allowedAt(chunk, t, k): may state k stand at token t inside the constrained region?
  const allowedAt = (chunk: Chunk, t: number, k: number): boolean => {
    const tag = model.tags[k];
    if (t === chunk.start) return tag === `B-${chunk.type}`;
    if (t < chunk.end) return tag === `I-${chunk.type}`;
    return tag !== `I-${chunk.type}`;
  };
  const confidence = (constrained: number) => (constrained === -Infinity ? 0 : Math.min(1, Math.exp(constrained - logLikelihood)));
  if (model.config.order === 2) {
    const { lattice } = buildSecondOrderLattice(model, words, sentenceIndex);
    return chunks.map((chunk) => {
      if (!index.has(`B-${chunk.type}`)) return 0;
      const emissions = lattice.emissions.slice();
      for (let t = chunk.start; t <= Math.min(chunk.end, T - 1); t++) {
        for (let x = lattice.offsets[t]; x < lattice.offsets[t + 1]; x++) if (!allowedAt(chunk, t, lattice.candidates[x])) emissions[x] = -Infinity;
      }
      return confidence(computeForwardSecondOrder({ ...lattice, emissions }).logLikelihood);
    });
  }
  const { params, input } = buildFirstOrderProblem(model, words, sentenceIndex);
  return chunks.map((chunk) => {
    if (!index.has(`B-${chunk.type}`)) return 0;
    const scores = input.scores.slice();
    for (let t = chunk.start; t <= Math.min(chunk.end, T - 1); t++) {
      for (let k = 0; k < K; k++) if (!allowedAt(chunk, t, k)) scores[t * K + k] = -Infinity;
    }
    return confidence(computeForward(params, { ...input, scores }).logLikelihood);
  });
}

/** B-X and I-X state ids per chunk type of a model (−1 when the model lacks the tag). */
const chunkStates = new WeakMap<TaggerModel, Map<string, { begin: number; inside: number }>>();

function statesOf(model: TaggerModel, type: string): { begin: number; inside: number } {
  let byType = chunkStates.get(model);
  if (byType === undefined) {
    byType = new Map();
    chunkStates.set(model, byType);
  }
  let states = byType.get(type);
  if (states === undefined) {
    states = { begin: model.tags.indexOf(`B-${type}`), inside: model.tags.indexOf(`I-${type}`) };
    byType.set(type, states);
  }
  return states;
}

/**
 * The same chunk probabilities as {@link chunkConfidences}, read off a scaled forward-backward
 * lattice (see forward-backward-scaled.ts) instead of one constrained forward pass per chunk:
 * for a chunk over tokens a..b−1,
 *   P = [Σ_i α̂_{a−1}(i)·M_a(i, B)·e_a(B) (or start(B)·e_0(B) at a = 0)] · Π_{t=a+1..b−1} M_t(·, I)·e_t(I)
 *       · [Σ_{k ≠ I} M_b(last, k)·e_b(k)·β̂_b(k) (or end(last) at b = T)] / Π_{t=a..b} ĉ_t,
 * the constrained sum of Culotta & McCallum (2004) split at the chunk's edges; each factor is
 * divided by its ĉ_t as it is multiplied in, so nothing underflows.
 *
 * @param start, steps, columns, emissions, end the lattice as given to the kernel (probabilities;
 *   P(j | i) at step t is steps[columns[t·K + j] + i], see forward-backward-scaled-columns.ts).
 */
export function chunkConfidencesScaled(
  model: TaggerModel,
  chunks: readonly Chunk[],
  T: number,
  start: Float64Array,
  steps: Float64Array,
  columns: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  lattice: { alpha: Float64Array; beta: Float64Array; scale: Float64Array },
): number[] {
  const K = model.tags.length;
  const { alpha, beta, scale } = lattice;
  const out = new Array<number>(chunks.length);
  for (let c = 0; c < chunks.length; c++) {
    const chunk = chunks[c];
    const { begin, inside } = statesOf(model, chunk.type);
    const a = chunk.start;
    const b = chunk.end;
    if (begin < 0 || (b - a > 1 && inside < 0)) {
      out[c] = 0;
      continue;
    }
    let v: number;
    if (a === 0) v = start[begin] * emissions[begin];
    else {
      v = 0;
      const m = columns[a * K + begin];
      for (let i = 0, p = (a - 1) * K; i < K; i++, p++) v += alpha[p] * steps[m + i];
      v *= emissions[a * K + begin];
    }
    v /= scale[a];
    let last = begin;
    for (let t = a + 1; t < b; t++) {
      v *= (steps[columns[t * K + inside] + last] * emissions[t * K + inside]) / scale[t];
      last = inside;
    }
    if (b < T) {
      let tail = 0;
      for (let k = 0; k < K; k++) if (k !== inside) tail += steps[columns[b * K + k] + last] * emissions[b * K + k] * beta[b * K + k];
      v *= tail / scale[b];
    } else {
      v *= (end === null ? 1 : end[last]) / scale[T];
    }
    out[c] = Math.min(1, v);
  }
  return out;
}
