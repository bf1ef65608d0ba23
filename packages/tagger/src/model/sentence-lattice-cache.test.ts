import { describe, expect, it } from "vitest";
import { createSyntheticDocuments } from "../kernels/synthetic";
import { buildFirstOrderProblem } from "./decode-input";
import { buildSentenceLattice } from "./sentence-lattice";
import { stepMatrix } from "../testing/lattice-steps";
import { trainTagger } from "./tagger";

// The lattice cache keeps word types, emission rows, suffix rows and a direct-mapped pool of
// patched step matrices across sentences, replacing pool places between sentences and giving a
// step its own matrix when its place is taken within the sentence. Over a few thousand sentences
// with many distinct word pairs every one of those paths runs; the scores must stay exactly the
// general builder's (decode-input.ts), sentence after sentence.
describe("buildSentenceLattice's caches over many sentences", () => {
  it("hold buildFirstOrderProblem's log scores cell for cell for every sentence", () => {
    const { model } = trainTagger(createSyntheticDocuments(30000, 3000, 21), { calibration: "none" });
    const K = model.tags.length;
    const sentences = createSyntheticDocuments(60000, 6000, 22).flatMap((d) => d.sentences.map((s) => s.words));
    expect(sentences.length).toBeGreaterThan(2500);
    let steps = 0;
    for (const [n, words] of sentences.entries()) {
      const { params, input } = buildFirstOrderProblem(model, words);
      const lattice = buildSentenceLattice(model, words);
      const T = words.length;
      const label = `sentence ${n}`;
      const same = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((x, i) => Object.is(x, b[i]));
      expect(same(lattice.logEmissions.subarray(0, T * K), input.scores), label).toBe(true);
      expect(same(lattice.logStart, params.start), label).toBe(true);
      for (let t = 1; t < T; t++) {
        const m = input.transitionIndex === null ? 0 : input.transitionIndex[t];
        const logs = stepMatrix(lattice.logSteps, lattice.columns, t, K);
        expect(same(logs, params.transitions.subarray(m * K * K, (m + 1) * K * K)), `${label} step ${t}`).toBe(true);
        // The probabilities the forward-backward reads are the exps of those scores.
        const probabilities = stepMatrix(lattice.steps, lattice.columns, t, K);
        expect(same(probabilities, logs.map(Math.exp)), `${label} step ${t}: probabilities`).toBe(true);
        steps++;
      }
    }
    expect(steps).toBeGreaterThan(50000);
  });
});
