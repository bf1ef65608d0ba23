import { describe, expect, it } from "vitest";
import { createSuffixCollector, suffixLogRatio, suffixTheta } from "./suffix-model";

describe("suffix statistics (Brants 2000 §2.3, successive abstraction)", () => {
  it("θ is the sample variance of the unconditional tag probabilities", () => {
    // P̂ = (0.5, 0.25, 0.25), P̄ = 1/3 → ((1/6)² + 2·(1/12)²)/2.
    expect(suffixTheta(Float64Array.from([2, 1, 1]))).toBeCloseTo(((1 / 6) ** 2 + 2 * (1 / 12) ** 2) / 2, 15);
  });

  it("combines suffix estimates from the group's distribution upwards", () => {
    const collector = createSuffixCollector(2, 3);
    collector.add("walked", 0, 1); // tag 1 (say VBD)
    collector.add("jumped", 0, 1);
    collector.add("bed", 0, 0); // tag 0 (say NN)
    collector.add("table", 0, 0);
    const theta = 0.5;
    const stats = collector.finish(theta);
    const out = new Float64Array(2);
    const scratch = new Float64Array(4);
    suffixLogRatio(stats, "hopped", 0, out, scratch);
    // root (0.5, 0.5); "d": (1/3, 2/3); "ed": (1/3, 2/3); "ped": (0, 1).
    let p = [0.5, 0.5];
    for (const node of [
      [1 / 3, 2 / 3],
      [1 / 3, 2 / 3],
      [0, 1],
    ]) {
      p = p.map((x, k) => (node[k] + theta * x) / (1 + theta));
    }
    expect(Math.exp(out[0]) * 0.5).toBeCloseTo(p[0], 15);
    expect(Math.exp(out[1]) * 0.5).toBeCloseTo(p[1], 15);
    // An unseen ending stops at the longest observed suffix: "xyz" has none → no information.
    suffixLogRatio(stats, "xyz", 0, out, scratch);
    expect(Array.from(out)).toEqual([0, 0]);
    // A group without statistics gives no information either.
    suffixLogRatio(stats, "hopped", 5, out, scratch);
    expect(Array.from(out)).toEqual([0, 0]);
  });
});
