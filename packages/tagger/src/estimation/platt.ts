/**
 * Platt scaling of span confidences: p' = σ(a·logit(p) + b), fitted by maximum likelihood on
 * held-out (confidence, correct) pairs. Platt (1999), "Probabilistic outputs for support vector
 * machines and comparisons to regularized likelihood methods", in Advances in Large Margin
 * Classifiers, §2.1 (sigmoid on the raw score; targets t+ = (N+ + 1)/(N+ + 2), t− = 1/(N− + 2)
 * against overfitting); Newton's method with backtracking line search as in Lin, Lin & Weng
 * (2007), "A note on Platt's probabilistic outputs for support vector machines", Machine
 * Learning 68(3), Algorithm 1. Here the score is the logit of the model's own confidence, so
 * a = 1, b = 0 is the identity.
 *
 * With span lengths, the sigmoid takes one extra input, the log of the span's length in tokens:
 * p' = σ(a·logit(p) + b + c·ln(length)) (Platt's sigmoid with an added feature, i.e. a
 * three-input logistic regression fitted by the same Newton iterations; c = 0 is plain Platt).
 * Chosen over plain Platt and isotonic regression by nested 5-fold cross-validation on wikigold
 * train+dev (bench/calibration.ts): long predicted spans are right less often than their marginal
 * says.
 */
export type PlattCalibration = { readonly method: "platt"; readonly a: number; readonly b: number; readonly c: number };

/** Confidences are clamped to [ε, 1 − ε] before the logit so that 0 and 1 stay finite. */
const EPSILON = 1e-9;

/** logit(p) with p clamped to [ε, 1 − ε]. */
export function confidenceLogit(p: number): number {
  const q = Math.min(1 - EPSILON, Math.max(EPSILON, p));
  return Math.log(q / (1 - q));
}

/** σ(a·logit(p) + b + c·ln(length)); `length` (tokens, ≥ 1) defaults to 1. */
export function applyPlatt(calibration: PlattCalibration, p: number, length = 1): number {
  const z = calibration.a * confidenceLogit(p) + calibration.b + (calibration.c === 0 ? 0 : calibration.c * Math.log(length));
  return z >= 0 ? 1 / (1 + Math.exp(-z)) : Math.exp(z) / (1 + Math.exp(z));
}

/** log(1 + e^z) without overflow. */
function softplus(z: number): number {
  return z > 0 ? z + Math.log1p(Math.exp(-z)) : Math.log1p(Math.exp(z));
}

/** Solves the d×d system H x = g (row-major H, d ≤ 3) by Gaussian elimination with partial pivoting. */
function solve(H: number[], g: number[], d: number): number[] {
  const m = H.slice();
  const x = g.slice();
  for (let col = 0; col < d; col++) {
    let pivot = col;
    for (let r = col + 1; r < d; r++) if (Math.abs(m[r * d + col]) > Math.abs(m[pivot * d + col])) pivot = r;
    if (pivot !== col) {
      for (let k = 0; k < d; k++) [m[col * d + k], m[pivot * d + k]] = [m[pivot * d + k], m[col * d + k]];
      [x[col], x[pivot]] = [x[pivot], x[col]];
    }
    for (let r = col + 1; r < d; r++) {
      const factor = m[r * d + col] / m[col * d + col];
      for (let k = col; k < d; k++) m[r * d + k] -= factor * m[col * d + k];
      x[r] -= factor * x[col];
    }
  }
  for (let r = d - 1; r >= 0; r--) {
    let sum = x[r];
    for (let k = r + 1; k < d; k++) sum -= m[r * d + k] * x[k];
    x[r] = sum / m[r * d + r];
  }
  return x;
}

/**
 * Fits (a, b) — and c when `lengths` (span lengths in tokens, ≥ 1) are given — on confidences and
 * outcomes (Platt 1999 §2.1; Lin, Lin & Weng 2007, Algorithm 1, here with two or three
 * parameters). Throws RangeError for no data, mismatched lengths or a length below 1.
 */
export function fitPlatt(confidences: ArrayLike<number>, correct: ArrayLike<boolean>, lengths?: ArrayLike<number>): PlattCalibration {
  const n = confidences.length;
  if (n === 0 || correct.length !== n) throw new RangeError(`fitPlatt: need as many outcomes as confidences (≥ 1), got ${n} and ${correct.length}`);
  if (lengths !== undefined && lengths.length !== n) throw new RangeError(`fitPlatt: ${lengths.length} span lengths for ${n} confidences`);
  const d = lengths === undefined ? 2 : 3;
  // Inputs per example: logit(p), 1, ln(length).
  const x = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    x[i * d] = confidenceLogit(confidences[i]);
    x[i * d + 1] = 1;
    if (lengths !== undefined) {
      if (!(lengths[i] >= 1)) throw new RangeError(`fitPlatt: span length ${lengths[i]} at ${i} is below 1`);
      x[i * d + 2] = Math.log(lengths[i]);
    }
  }
  let positives = 0;
  for (let i = 0; i < n; i++) if (correct[i]) positives++;
  const hi = (positives + 1) / (positives + 2);
  const lo = 1 / (n - positives + 2);
  const t = Float64Array.from({ length: n }, (_, i) => (correct[i] ? hi : lo));
  const score = (w: number[], i: number) => {
    let z = 0;
    for (let k = 0; k < d; k++) z += w[k] * x[i * d + k];
    return z;
  };
  // Negative log-likelihood of targets t under q_i = σ(w·x_i).
  const loss = (w: number[]) => {
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const z = score(w, i);
      sum += softplus(z) - t[i] * z;
    }
    return sum;
  };
  let w = d === 2 ? [1, 0] : [1, 0, 0];
  let value = loss(w);
  for (let iteration = 0; iteration < 100; iteration++) {
    const g = new Array<number>(d).fill(0);
    const H = new Array<number>(d * d).fill(0);
    for (let k = 0; k < d; k++) H[k * d + k] = 1e-12;
    for (let i = 0; i < n; i++) {
      const z = score(w, i);
      const q = z >= 0 ? 1 / (1 + Math.exp(-z)) : Math.exp(z) / (1 + Math.exp(z));
      const r = q - t[i];
      const v = q * (1 - q);
      for (let k = 0; k < d; k++) {
        g[k] += r * x[i * d + k];
        for (let l = 0; l < d; l++) H[k * d + l] += v * x[i * d + k] * x[i * d + l];
      }
    }
    if (g.every((gk) => Math.abs(gk) < 1e-7)) break;
    const step0 = solve(H, g.map((gk) => -gk), d);
    if (!step0.every(Number.isFinite)) break;
    const slope = g.reduce((sum, gk, k) => sum + gk * step0[k], 0);
    let step = 1;
    let accepted = false;
    while (step >= 1e-10) {
      const next = w.map((wk, k) => wk + step * step0[k]);
      const nextValue = loss(next);
      if (nextValue < value + 1e-4 * step * slope) {
        w = next;
        value = nextValue;
        accepted = true;
        break;
      }
      step /= 2;
    }
    if (!accepted) break;
  }
  return { method: "platt", a: w[0], b: w[1], c: d === 3 ? w[2] : 0 };
}
