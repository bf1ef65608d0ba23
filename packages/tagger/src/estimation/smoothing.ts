/**
 * Count-to-probability estimators shared by every distribution of the model. All return
 * natural-log probabilities.
 */

/**
 * Add-λ (Lidstone) estimate of each row of an R×C count table:
 *   P(c | r) = (n(r, c) + λ(r, c)) / (n(r) + Σ_c' λ(r, c'))
 * with n(r) = Σ_c n(r, c) and |B| = C outcomes, so a scalar λ gives the familiar
 * (n + λ)/(n(r) + λ·C) (Chen & Goodman 1998, "An Empirical Study of Smoothing Techniques for
 * Language Modeling", §2.1 additive smoothing; Manning & Schütze 1999, ch. 6, Lidstone's law).
 * `prior` is a scalar λ or an R×C table of per-cell pseudo-counts (0 forbids a cell that has no
 * data). A row with no counts and no pseudo-counts gets the uniform distribution.
 *
 * `extra` optionally adds one more outcome per row that is not a column of the table (the end
 * state): its R counts enter n(r) with pseudo-count `extra.prior`, so the C + 1 outcomes sum to 1,
 * and its log-probabilities are returned separately.
 *
 * @returns `table`: R×C log-probabilities; `extra`: R log-probabilities or null.
 */
export function estimateAddLambda(
  counts: Float64Array,
  rows: number,
  cols: number,
  prior: number | Float64Array,
  extra: { counts: Float64Array; prior: number } | null = null,
): { table: Float64Array; extra: Float64Array | null } {
  if (counts.length !== rows * cols) throw new RangeError(`estimateAddLambda: counts has length ${counts.length}, expected ${rows}×${cols}`);
  if (typeof prior !== "number" && prior.length !== rows * cols) {
    throw new RangeError(`estimateAddLambda: prior has length ${prior.length}, expected ${rows}×${cols}`);
  }
  if (extra !== null && extra.counts.length !== rows) {
    throw new RangeError(`estimateAddLambda: extra counts have length ${extra.counts.length}, expected R=${rows}`);
  }
  const table = new Float64Array(rows * cols);
  const extraLog = extra === null ? null : new Float64Array(rows);
  const scalar = typeof prior === "number";
  for (let r = 0; r < rows; r++) {
    const base = r * cols;
    let total = extra === null ? 0 : extra.counts[r] + extra.prior;
    for (let c = 0; c < cols; c++) total += counts[base + c] + (scalar ? prior : prior[base + c]);
    if (total <= 0) {
      const uniform = -Math.log(cols + (extra === null ? 0 : 1));
      for (let c = 0; c < cols; c++) table[base + c] = uniform;
      if (extraLog !== null) extraLog[r] = uniform;
      continue;
    }
    const logTotal = Math.log(total);
    for (let c = 0; c < cols; c++) {
      const numerator = counts[base + c] + (scalar ? prior : prior[base + c]);
      table[base + c] = numerator > 0 ? Math.log(numerator) - logTotal : -Infinity;
    }
    if (extra !== null && extraLog !== null) {
      const numerator = extra.counts[r] + extra.prior;
      extraLog[r] = numerator > 0 ? Math.log(numerator) - logTotal : -Infinity;
    }
  }
  return { table, extra: extraLog };
}

/**
 * Shrinks a sparse count vector toward a parent distribution with a Dirichlet prior of strength β
 * centred on the parent (MacKay & Peto 1995, "A hierarchical Dirichlet language model", Natural
 * Language Engineering 1(3):289–307, the predictive distribution of their Dirichlet model with
 * mean m and concentration α, P(i | j) = (F_{i|j} + α·m_i)/(F_j + α); §3, section number from
 * memory): P(c) = (n(c) + β·parent(c)) / (n + β). With n = 0 it returns the
 * parent; as n grows the data take over. `parentLog` and the result are log-probabilities over C
 * outcomes; `scale` multiplies the result (log added), for rows that share mass with an end state.
 */
export function shrinkTowardParent(
  counts: Float64Array,
  offset: number,
  cols: number,
  strength: number,
  parentLog: Float64Array,
  parentOffset: number,
  out: Float64Array,
  outOffset: number,
  logScale = 0,
): void {
  let n = 0;
  for (let c = 0; c < cols; c++) n += counts[offset + c];
  if (n + strength <= 0) {
    for (let c = 0; c < cols; c++) out[outOffset + c] = parentLog[parentOffset + c] + logScale;
    return;
  }
  const logDenominator = Math.log(n + strength);
  for (let c = 0; c < cols; c++) {
    const numerator = counts[offset + c] + strength * Math.exp(parentLog[parentOffset + c]);
    out[outOffset + c] = (numerator > 0 ? Math.log(numerator) - logDenominator : -Infinity) + logScale;
  }
}

/**
 * Witten–Bell interpolation of a sparse context's counts with a back-off distribution (Witten &
 * Bell 1991, "The Zero-Frequency Problem: Estimating the Probabilities of Novel Events in Adaptive
 * Text Compression", IEEE Trans. Information Theory 37(4):1085–1094, method C: a novel event gets
 * t/(n+t) with t distinct symbols seen; as an interpolated n-gram estimate in Chen & Goodman 1998,
 * "An Empirical Study of Smoothing Techniques for Language Modeling", Harvard TR-10-98, §2.5
 * "Witten-Bell smoothing"; method letter and section from memory):
 * P(c) = (n(c) + u·backoff(c)) / (n + u), u = number of distinct
 * outcomes seen in the context. Bikel et al. (1997) back off their context-conditioned
 * distributions with weights of this kind. `entries`/`values` list the non-zero counts; the
 * result overwrites `out[outOffset..+cols]` (log), starting from the back-off row `backoffLog`.
 */
export function interpolateWittenBell(
  entries: Int32Array,
  values: Float64Array,
  from: number,
  to: number,
  backoffLog: Float64Array,
  backoffOffset: number,
  cols: number,
  out: Float64Array,
  outOffset: number,
): void {
  let n = 0;
  for (let x = from; x < to; x++) n += values[x];
  const u = to - from;
  if (n <= 0) {
    for (let c = 0; c < cols; c++) out[outOffset + c] = backoffLog[backoffOffset + c];
    return;
  }
  const backoffWeight = Math.log(u / (n + u));
  for (let c = 0; c < cols; c++) out[outOffset + c] = backoffLog[backoffOffset + c] + backoffWeight;
  for (let x = from; x < to; x++) {
    const c = entries[x];
    const p = (values[x] + u * Math.exp(backoffLog[backoffOffset + c])) / (n + u);
    out[outOffset + c] = p > 0 ? Math.log(p) : -Infinity;
  }
}
