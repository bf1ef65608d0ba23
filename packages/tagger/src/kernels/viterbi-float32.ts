/**
 * Viterbi with single-precision arithmetic: every sum is rounded to float32, and ties go to the
 * lowest state index. This reproduces NLTK's HiddenMarkovModelTagger._best_path (nltk/tag/hmm.py,
 * NLTK 3.8), which keeps its log2 tables and its lattice in numpy float32 arrays; rounding there
 * creates exact ties a float64 decoder would break differently. Used only by the NLTK-compatible
 * configuration; the tagger's own decoder is {@link decodeViterbi}.
 *
 * @param start K float32 log-scores; @param transitions K×K [from][to]; @param emissions T×K rows.
 */
export function decodeViterbiFloat32(states: number, start: Float32Array, transitions: Float32Array, emissions: Float32Array, length: number): Int32Array {
  const K = states;
  const T = length;
  if (start.length !== K) throw new RangeError(`decodeViterbiFloat32: start has length ${start.length}, expected K=${K}`);
  if (transitions.length !== K * K) throw new RangeError(`decodeViterbiFloat32: transitions has length ${transitions.length}, expected K×K=${K * K}`);
  if (emissions.length < T * K) throw new RangeError(`decodeViterbiFloat32: emissions has length ${emissions.length}, expected T×K=${T * K}`);
  const path = new Int32Array(T);
  if (T === 0) return path;
  const delta = new Float32Array(T * K);
  const back = new Int32Array(T * K);
  for (let j = 0; j < K; j++) delta[j] = start[j] + emissions[j];
  for (let t = 1; t < T; t++) {
    const prev = (t - 1) * K;
    const cur = t * K;
    for (let j = 0; j < K; j++) {
      let best = Math.fround(delta[prev] + transitions[j]);
      let arg = 0;
      for (let i = 1; i < K; i++) {
        const s = Math.fround(delta[prev + i] + transitions[i * K + j]);
        if (s > best) {
          best = s;
          arg = i;
        }
      }
      delta[cur + j] = best + emissions[cur + j];
      back[cur + j] = arg;
    }
  }
  const last = (T - 1) * K;
  let arg = 0;
  for (let j = 1; j < K; j++) if (delta[last + j] > delta[last + arg]) arg = j;
  path[T - 1] = arg;
  for (let t = T - 1; t > 0; t--) {
    arg = back[t * K + arg];
    path[t - 1] = arg;
  }
  return path;
}
