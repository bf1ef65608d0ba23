import { spawnSync } from "node:child_process";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { cohensKappa, entityAgreement } from "./agreement";

// NLTK from Debian's python3-nltk as a live reference; /usr/bin/python3 because another python3
// earlier on PATH may not see apt's packages.
const PYTHON = "/usr/bin/python3";
const hasNltk = spawnSync(PYTHON, ["-c", "import nltk"]).status === 0;

// Labels for a 2×2 agreement table: both yes, A yes B no, A no B yes, both no.
function table(yesYes: number, yesNo: number, noYes: number, noNo: number): [string[], string[]] {
  const a: string[] = [];
  const b: string[] = [];
  const add = (count: number, x: string, y: string): void => {
    for (let i = 0; i < count; i++) {
      a.push(x);
      b.push(y);
    }
  };
  add(yesYes, "yes", "yes");
  add(yesNo, "yes", "no");
  add(noYes, "no", "yes");
  add(noNo, "no", "no");
  return [a, b];
}

describe("cohensKappa", () => {
  it("matches the worked example of Wikipedia's \"Cohen's kappa\"", () => {
    // Wikipedia, "Cohen's kappa", section Examples, "Simple example": 50 items; both yes 20,
    // A yes/B no 5, A no/B yes 10, both no 15 → po = 0.7, pe = 0.5, κ = 0.4.
    const result = cohensKappa(...table(20, 5, 10, 15));
    expect(result.n).toBe(50);
    expect(result.observed).toBeCloseTo(0.7, 12);
    expect(result.expected).toBeCloseTo(0.5, 12);
    expect(result.kappa).toBeCloseTo(0.4, 12);
  });

  it("agrees with NLTK's AnnotationTask.kappa on random labellings (live, seed 6101)", () => {
    expect(hasNltk, "NLTK is needed for this live check: apt-get install python3-nltk (npm test installs it)").toBe(true);
    // nltk.metrics.agreement.AnnotationTask(data=[(coder, item, label)]).kappa(), NLTK 3.x
    // (Debian python3-nltk): Cohen's kappa with each coder's own label distribution.
    const rng = createRng(6101);
    const labels = ["O", "O", "O", "PER", "LOC", "ORG"];
    const pairs: Array<[string[], string[]]> = [];
    for (let k = 0; k < 20; k++) {
      const n = 5 + rng.nextInt(60);
      const a = Array.from({ length: n }, () => labels[rng.nextInt(labels.length)]);
      // B copies A most of the time, so kappa spreads over (0, 1) rather than sitting near 0.
      const b = a.map((x) => (rng.next() < 0.6 ? x : labels[rng.nextInt(labels.length)]));
      pairs.push([a, b]);
    }
    const script = [
      "import json, sys",
      "from nltk.metrics.agreement import AnnotationTask",
      "out = []",
      "for a, b in json.load(sys.stdin):",
      "    data = [('A', str(i), x) for i, x in enumerate(a)] + [('B', str(i), x) for i, x in enumerate(b)]",
      "    out.append(AnnotationTask(data=data).kappa())",
      "print(json.dumps(out))",
    ].join("\n");
    const run = spawnSync(PYTHON, ["-c", script], { input: JSON.stringify(pairs), encoding: "utf8" });
    expect(run.stderr).toBe("");
    const reference = JSON.parse(run.stdout) as number[];
    expect(reference).toHaveLength(pairs.length);
    pairs.forEach(([a, b], k) => expect(cohensKappa(a, b).kappa).toBeCloseTo(reference[k], 10));
  });

  it("approaches the F-measure as agreed negatives grow (Hripcsak & Rothschild 2005)", () => {
    // Hripcsak & Rothschild (2005), "Agreement, the F-measure, and reliability in information
    // retrieval", JAMIA 12(3): kappa tends to F = 2a/(2a+b+c) as the number of cases both raters
    // call negative grows. Here a = 30, b = 6, c = 10: F = 60/76.
    const f = 60 / 76;
    const few = cohensKappa(...table(30, 6, 10, 20)).kappa;
    const many = cohensKappa(...table(30, 6, 10, 1_000_000)).kappa;
    expect(Math.abs(many - f)).toBeLessThan(1e-3);
    expect(Math.abs(few - f)).toBeGreaterThan(Math.abs(many - f));
  });

  it("defines the degenerate cases", () => {
    // pe = 1 only when both used one and the same label throughout: κ defined as 1.
    expect(cohensKappa(["O", "O", "O"], ["O", "O", "O"])).toEqual({ kappa: 1, observed: 1, expected: 1, n: 3 });
    expect(cohensKappa([], [])).toEqual({ kappa: 1, observed: 1, expected: 1, n: 0 });
    // Worked by hand: one label each but different ones: po = 0, pe = 0, κ = 0.
    expect(cohensKappa(["X", "X"], ["Y", "Y"])).toEqual({ kappa: 0, observed: 0, expected: 0, n: 2 });
    // Worked by hand: perfect disagreement on a balanced 2-label set: po = 0, pe = 0.5, κ = −1.
    expect(cohensKappa(["X", "Y"], ["Y", "X"]).kappa).toBe(-1);
    expect(() => cohensKappa(["O"], [])).toThrow(RangeError);
  });
});

describe("entityAgreement", () => {
  const per = (start: number, end: number, type = "PER") => ({ start, end, type });

  it("scores exact matches only", () => {
    // Worked by hand in each case below.
    expect(entityAgreement([per(0, 5), per(10, 14, "LOC")], [per(10, 14, "LOC"), per(0, 5)])).toEqual({
      f1: 1, precision: 1, recall: 1, matched: 2, onlyA: 0, onlyB: 0,
    });
    // Partial overlap is no match: A has 3 spans, B 2, one shared: P 1/2, R 1/3, F1 2/5.
    const partial = entityAgreement([per(0, 5), per(10, 14), per(20, 25)], [per(0, 5), per(11, 14)]);
    expect(partial).toMatchObject({ matched: 1, onlyA: 2, onlyB: 1, precision: 0.5 });
    expect(partial.recall).toBeCloseTo(1 / 3, 12);
    expect(partial.f1).toBeCloseTo(0.4, 12);
    // Type mismatch is no match.
    expect(entityAgreement([per(0, 5)], [per(0, 5, "ORG")])).toEqual({ f1: 0, precision: 0, recall: 0, matched: 0, onlyA: 1, onlyB: 1 });
  });

  it("defines the empty cases: both empty agree fully, one empty not at all", () => {
    expect(entityAgreement([], [])).toEqual({ f1: 1, precision: 1, recall: 1, matched: 0, onlyA: 0, onlyB: 0 });
    expect(entityAgreement([per(0, 1)], [])).toEqual({ f1: 0, precision: 0, recall: 0, matched: 0, onlyA: 1, onlyB: 0 });
    expect(entityAgreement([], [per(0, 1)])).toEqual({ f1: 0, precision: 0, recall: 0, matched: 0, onlyA: 0, onlyB: 1 });
  });

  it("matches duplicates once per copy", () => {
    expect(entityAgreement([per(0, 5), per(0, 5)], [per(0, 5)])).toMatchObject({ matched: 1, onlyA: 1, onlyB: 0 });
  });

  it("property: F1 is symmetric and equals 2a/(2a+b+c) with a, b, c counted independently (Hripcsak & Rothschild 2005)", () => {
    // Hripcsak & Rothschild (2005), "Agreement, the F-measure, and reliability in information
    // retrieval", JAMIA 12(3): with a agreed positives and b, c positives found by only one rater,
    // F = 2a/(2a+b+c), the same whichever rater is the reference. a, b and c are counted here by
    // brute force over copies (each span of A matched at most once to an equal, unused span of B),
    // not taken from the function.
    const span = fc.record({ start: fc.integer({ min: 0, max: 6 }), end: fc.integer({ min: 7, max: 9 }), type: fc.constantFrom("PER", "LOC") });
    fc.assert(
      fc.property(fc.array(span, { maxLength: 8 }), fc.array(span, { maxLength: 8 }), (a, b) => {
        const used = b.map(() => false);
        let agreed = 0;
        for (const x of a) {
          const j = b.findIndex((y, k) => !used[k] && y.start === x.start && y.end === x.end && y.type === x.type);
          if (j >= 0) {
            used[j] = true;
            agreed++;
          }
        }
        const onlyA = a.length - agreed;
        const onlyB = b.length - agreed;
        const ab = entityAgreement(a, b);
        const ba = entityAgreement(b, a);
        expect([ab.matched, ab.onlyA, ab.onlyB]).toEqual([agreed, onlyA, onlyB]);
        expect(ab.f1).toBeCloseTo(ba.f1, 12);
        expect(ab.precision).toBeCloseTo(ba.recall, 12);
        expect(ab.f1).toBeCloseTo(a.length + b.length === 0 ? 1 : (2 * agreed) / (2 * agreed + onlyA + onlyB), 12);
      }),
      { seed: 6102, numRuns: 300 },
    );
  });

  it("agrees with NLTK's f_measure on sets of spans (live, seed 6103)", () => {
    expect(hasNltk, "NLTK is needed for this live check: apt-get install python3-nltk (npm test installs it)").toBe(true);
    // nltk.metrics.scores.precision/recall/f_measure(reference, test) on Python sets (NLTK 3.x,
    // Debian python3-nltk), with A as the reference; spans are distinct within each side, so sets
    // and the function's copies agree. NLTK returns None when a set is empty: those cases are left
    // out here and covered by "defines the empty cases".
    const rng = createRng(6103);
    const cases: Array<[Array<{ start: number; end: number; type: string }>, Array<{ start: number; end: number; type: string }>]> = [];
    const draw = () => {
      const keys = new Set<string>();
      const n = 1 + rng.nextInt(8);
      for (let i = 0; i < n; i++) keys.add(`${rng.nextInt(5)}:${5 + rng.nextInt(4)}:${rng.next() < 0.5 ? "PER" : "LOC"}`);
      return [...keys].map((k) => {
        const [start, end, type] = k.split(":");
        return { start: Number(start), end: Number(end), type };
      });
    };
    for (let k = 0; k < 40; k++) cases.push([draw(), draw()]);
    const script = [
      "import json, sys",
      "from nltk.metrics.scores import f_measure, precision, recall",
      "out = []",
      "for a, b in json.load(sys.stdin):",
      "    ref = {(s['start'], s['end'], s['type']) for s in a}",
      "    test = {(s['start'], s['end'], s['type']) for s in b}",
      "    out.append([precision(ref, test), recall(ref, test), f_measure(ref, test)])",
      "print(json.dumps(out))",
    ].join("\n");
    const run = spawnSync(PYTHON, ["-c", script], { input: JSON.stringify(cases), encoding: "utf8" });
    expect(run.stderr).toBe("");
    const reference = JSON.parse(run.stdout) as Array<[number, number, number]>;
    expect(reference).toHaveLength(cases.length);
    cases.forEach(([a, b], k) => {
      const mine = entityAgreement(a, b);
      expect(mine.precision, `case ${k}`).toBeCloseTo(reference[k][0], 12);
      expect(mine.recall, `case ${k}`).toBeCloseTo(reference[k][1], 12);
      expect(mine.f1, `case ${k}`).toBeCloseTo(reference[k][2], 12);
    });
  });
});
