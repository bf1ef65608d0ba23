/** One bin of a reliability diagram: predictions with confidence in (lower, upper]. */
export type CalibrationBin = { readonly lower: number; readonly upper: number; readonly count: number; readonly meanConfidence: number; readonly accuracy: number };

/** Expected calibration error and its bins. */
export type CalibrationReport = { readonly ece: number; readonly count: number; readonly bins: CalibrationBin[] };

/**
 * Expected calibration error with M equal-width bins (Guo, Pleiss, Sun & Weinberger 2017, "On
 * calibration of modern neural networks", ICML, §2 eq. 3; Naeini, Cooper & Hauskrecht 2015):
 * ECE = Σ_m |B_m|/n · |acc(B_m) − conf(B_m)|, bin m holding confidences in ((m−1)/M, m/M] (0 goes
 * to the first bin). `correct[i]` says whether prediction i was right. ECE is 0 for no predictions.
 */
export function expectedCalibrationError(confidences: ArrayLike<number>, correct: ArrayLike<boolean>, binCount = 10): CalibrationReport {
  if (confidences.length !== correct.length) throw new RangeError(`expectedCalibrationError: ${confidences.length} confidences for ${correct.length} outcomes`);
  if (!Number.isInteger(binCount) || binCount < 1) throw new RangeError(`expectedCalibrationError: binCount must be a positive integer, got ${binCount}`);
  const n = confidences.length;
  const counts = new Float64Array(binCount);
  const sums = new Float64Array(binCount);
  const hits = new Float64Array(binCount);
  for (let i = 0; i < n; i++) {
    const p = confidences[i];
    if (!(p >= 0 && p <= 1)) throw new RangeError(`expectedCalibrationError: confidence ${p} at ${i} is outside [0, 1]`);
    const m = Math.max(0, Math.ceil(p * binCount) - 1);
    counts[m]++;
    sums[m] += p;
    if (correct[i]) hits[m]++;
  }
  let ece = 0;
  const bins: CalibrationBin[] = [];
  for (let m = 0; m < binCount; m++) {
    const c = counts[m];
    const meanConfidence = c === 0 ? 0 : sums[m] / c;
    const accuracy = c === 0 ? 0 : hits[m] / c;
    if (c > 0) ece += (c / n) * Math.abs(accuracy - meanConfidence);
    bins.push({ lower: m / binCount, upper: (m + 1) / binCount, count: c, meanConfidence, accuracy });
  }
  return { ece, count: n, bins };
}
