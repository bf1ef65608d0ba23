/**
 * Forward-backward in probability space with one scale factor per token (Rabiner 1989, "A
 * tutorial on hidden Markov models", §V-A, eq. 91-94), over a first-order lattice whose every
 * step has its own K×K matrix. This is the tagging path's kernel: the caller has already turned
 * the log scores into probabilities once per word type, so the inner loops only multiply.
 *
 * Scaled quantities: ĉ_t = Σ_j α'_t(j), α̂_t = α'_t/ĉ_t (t = 0..T−1), and ĉ_T = Σ_k α̂_{T−1}(k)·end(k)
 * (end = 1 without an end state), so P(observations) = Π_{t=0..T} ĉ_t. The backward pass uses the
 * same factors: β̂_{T−1}(k) = end(k)/ĉ_T, β̂_t(i) = Σ_j M_{t+1}(i,j)·e_{t+1}(j)·β̂_{t+1}(j)/ĉ_{t+1},
 * so that α̂_t(k)·β̂_t(k) = P(s_t = k | observations).
 */

/** Reusable buffers: T×K α̂ and β̂, T+1 scale factors, K scratch numbers. */
export type ScaledWorkspace = { alpha: Float64Array; beta: Float64Array; scale: Float64Array; weighted: Float64Array };

/** Buffers for sequences of up to `maxLength` tokens over K states. */
export function createScaledWorkspace(states: number, maxLength: number): ScaledWorkspace {
  return { alpha: new Float64Array(states * maxLength), beta: new Float64Array(states * maxLength), scale: new Float64Array(maxLength + 1), weighted: new Float64Array(states) };
}

/**
 * Fills `workspace` with α̂, β̂ and ĉ for one sequence and returns log P(observations).
 *
 * @param start K start probabilities (of the first state, before its emission).
 * @param steps probabilities: K×K matrices, row = from state.
 * @param stepIndex matrix number of each step t ≥ 1: P(j | i) at t is steps[stepIndex[t]·K² + i·K + j].
 * @param emissions T×K emission probabilities.
 * @param end K end probabilities, or null for no end state.
 * @returns the log-likelihood, or NaN when a scale factor is 0 or not finite (the probability
 *   underflowed or is 0): the caller then uses the log-space kernels, which do not underflow.
 */
export function computeScaledForwardBackward(
  K: number,
  T: number,
  start: Float64Array,
  steps: Float64Array,
  stepIndex: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  workspace: ScaledWorkspace,
): number {
  const KK = K * K;
  if (start.length < K) throw new RangeError(`computeScaledForwardBackward: start has length ${start.length}, expected K=${K}`);
  if (emissions.length < T * K) throw new RangeError(`computeScaledForwardBackward: emissions have length ${emissions.length}, expected T×K=${T * K}`);
  if (stepIndex.length < T) throw new RangeError(`computeScaledForwardBackward: stepIndex has length ${stepIndex.length}, expected T=${T}`);
  for (let t = 1; t < T; t++) {
    const m = stepIndex[t];
    if (!(m >= 0 && (m + 1) * KK <= steps.length)) throw new RangeError(`computeScaledForwardBackward: stepIndex[${t}]=${m} outside the ${steps.length / KK} matrices`);
  }
  if (end !== null && end.length < K) throw new RangeError(`computeScaledForwardBackward: end has length ${end.length}, expected K=${K}`);
  const { alpha, beta, scale, weighted } = workspace;
  if (alpha.length < T * K || beta.length < T * K || scale.length < T + 1 || weighted.length < K) {
    throw new RangeError(`computeScaledForwardBackward: workspace holds ${Math.min(alpha.length, beta.length) / K} tokens, sequence has T=${T}`);
  }
  if (T === 0) return 0;
  let sum = 0;
  for (let j = 0; j < K; j++) {
    const v = start[j] * emissions[j];
    alpha[j] = v;
    sum += v;
  }
  if (!(sum > 0 && sum < Infinity)) return NaN;
  scale[0] = sum;
  let logLikelihood = Math.log(sum);
  for (let j = 0; j < K; j++) alpha[j] /= sum;
  for (let t = 1; t < T; t++) {
    const prev = (t - 1) * K;
    const cur = t * K;
    const m = stepIndex[t] * KK;
    sum = 0;
    for (let j = 0; j < K; j++) {
      let s = 0;
      for (let i = 0, a = m + j; i < K; i++, a += K) s += alpha[prev + i] * steps[a];
      const v = s * emissions[cur + j];
      alpha[cur + j] = v;
      sum += v;
    }
    if (!(sum > 0 && sum < Infinity)) return NaN;
    scale[t] = sum;
    logLikelihood += Math.log(sum);
    const inv = 1 / sum;
    for (let j = 0; j < K; j++) alpha[cur + j] *= inv;
  }
  const last = (T - 1) * K;
  sum = 0;
  for (let k = 0; k < K; k++) sum += alpha[last + k] * (end === null ? 1 : end[k]);
  if (!(sum > 0 && sum < Infinity)) return NaN;
  scale[T] = sum;
  logLikelihood += Math.log(sum);
  for (let k = 0; k < K; k++) beta[last + k] = (end === null ? 1 : end[k]) / sum;
  for (let t = T - 2; t >= 0; t--) {
    const cur = t * K;
    const next = (t + 1) * K;
    const m = stepIndex[t + 1] * KK;
    const inv = 1 / scale[t + 1];
    for (let j = 0; j < K; j++) weighted[j] = emissions[next + j] * beta[next + j] * inv;
    for (let i = 0; i < K; i++) {
      let s = 0;
      for (let j = 0, a = m + i * K; j < K; j++, a++) s += steps[a] * weighted[j];
      beta[cur + i] = s;
    }
  }
  return logLikelihood;
}
