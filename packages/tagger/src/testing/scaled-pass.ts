import { expect } from "vitest";
import type { ScaledWorkspace } from "../kernels/forward-backward-scaled";

/**
 * Holds a scaled forward-backward kernel's run to the reference kernel's, bit for bit: the
 * log-likelihood (NaN included), α̂ and ĉ of every token and β̂ from `from` on. Returns false when
 * both found the sequence impossible (NaN: nothing else to compare).
 */
export function expectSameScaledPass(got: number, expected: number, ws: ScaledWorkspace, reference: ScaledWorkspace, K: number, T: number, from: number, label: string): boolean {
  expect(Object.is(got, expected), `${label}: ${got} vs ${expected}`).toBe(true);
  if (Number.isNaN(expected)) return false;
  expect(Array.from(ws.alpha.subarray(0, T * K)), label).toEqual(Array.from(reference.alpha.subarray(0, T * K)));
  expect(Array.from(ws.scale.subarray(0, T + 1)), label).toEqual(Array.from(reference.scale.subarray(0, T + 1)));
  expect(Array.from(ws.beta.subarray(from * K, T * K)), label).toEqual(Array.from(reference.beta.subarray(from * K, T * K)));
  return true;
}
