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
