/**
 * Platt scaling of span confidences: p' = σ(a·logit(p) + b), fitted by maximum likelihood on
 * held-out (confidence, correct) pairs. Platt (1999), "Probabilistic outputs for support vector
 * machines and comparisons to regularized likelihood methods", in Advances in Large Margin
 * Classifiers, §2.1 (sigmoid on the raw score; targets t+ = (N+ + 1)/(N+ + 2), t− = 1/(N− + 2)
 * against overfitting); Newton's method with backtracking line search as in Lin, Lin & Weng
 * (2007), "A note on Platt's probabilistic outputs for support vector machines", Machine
 * Learning 68(3), Algorithm 1. Here the score is the logit of the model's own confidence, so
 * a = 1, b = 0 is the identity.
 */
export type PlattCalibration = { readonly method: "platt"; readonly a: number; readonly b: number };

/** Confidences are clamped to [ε, 1 − ε] before the logit so that 0 and 1 stay finite. */
const EPSILON = 1e-9;

/** logit(p) with p clamped to [ε, 1 − ε]. */
export function confidenceLogit(p: number): number {
  const q = Math.min(1 - EPSILON, Math.max(EPSILON, p));
  return Math.log(q / (1 - q));
}

/** σ(a·logit(p) + b). */
export function applyPlatt(calibration: PlattCalibration, p: number): number {
  const z = calibration.a * confidenceLogit(p) + calibration.b;
  return z >= 0 ? 1 / (1 + Math.exp(-z)) : Math.exp(z) / (1 + Math.exp(z));
}

/** log(1 + e^z) without overflow. */
function softplus(z: number): number {
  return z > 0 ? z + Math.log1p(Math.exp(-z)) : Math.log1p(Math.exp(z));
}

/**
 * Fits (a, b) on confidences and outcomes (Platt 1999 §2.1; Lin, Lin & Weng 2007, Algorithm 1).
 * Throws RangeError for no data or mismatched lengths.
 */
export function fitPlatt(confidences: ArrayLike<number>, correct: ArrayLike<boolean>): PlattCalibration {
  const n = confidences.length;
  if (n === 0 || correct.length !== n) throw new RangeError(`fitPlatt: need as many outcomes as confidences (≥ 1), got ${n} and ${correct.length}`);
  const f = Float64Array.from({ length: n }, (_, i) => confidenceLogit(confidences[i]));
  let positives = 0;
  for (let i = 0; i < n; i++) if (correct[i]) positives++;
  const hi = (positives + 1) / (positives + 2);
  const lo = 1 / (n - positives + 2);
  const t = Float64Array.from({ length: n }, (_, i) => (correct[i] ? hi : lo));
  // Negative log-likelihood of targets t under q_i = σ(a·f_i + b).
  const loss = (a: number, b: number) => {
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const z = a * f[i] + b;
      sum += softplus(z) - t[i] * z;
    }
    return sum;
  };
  let a = 1;
  let b = 0;
  let value = loss(a, b);
  for (let iteration = 0; iteration < 100; iteration++) {
    let ga = 0;
    let gb = 0;
    let haa = 1e-12;
    let hab = 0;
    let hbb = 1e-12;
    for (let i = 0; i < n; i++) {
      const z = a * f[i] + b;
      const q = z >= 0 ? 1 / (1 + Math.exp(-z)) : Math.exp(z) / (1 + Math.exp(z));
      const d = q - t[i];
      ga += d * f[i];
      gb += d;
      const w = q * (1 - q);
      haa += w * f[i] * f[i];
      hab += w * f[i];
      hbb += w;
    }
    if (Math.abs(ga) < 1e-7 && Math.abs(gb) < 1e-7) break;
    const det = haa * hbb - hab * hab;
    const da = -(hbb * ga - hab * gb) / det;
    const db = -(haa * gb - hab * ga) / det;
    const slope = ga * da + gb * db;
    let step = 1;
    let accepted = false;
    while (step >= 1e-10) {
      const next = loss(a + step * da, b + step * db);
      if (next < value + 1e-4 * step * slope) {
        a += step * da;
        b += step * db;
        value = next;
        accepted = true;
        break;
      }
      step /= 2;
    }
    if (!accepted) break;
  }
  return { method: "platt", a, b };
}
