import { describe, expect, it } from "vitest";
import { tagsToChunks } from "../text/bio";
import { createSyntheticDocuments } from "../kernels/synthetic";
import { computePosteriors } from "../kernels/forward-backward";
import { computeScaledForwardBackward, createScaledWorkspace } from "../kernels/forward-backward-scaled";
import type { TrainingConfig } from "../estimation/training-config";
import { tinyDocuments } from "../testing/tiny-corpus";
import { enumeratePaths, randomHmm } from "../testing/hmm-fixtures";
import { createRng } from "../util/random";
import { buildFirstOrderProblem } from "./decode-input";
import { decodeSentence, sentencePosteriors } from "./decode";
import { buildSentenceLattice, fastLatticeApplies } from "./sentence-lattice";
import { stepMatrix } from "../testing/lattice-steps";
import { chunkConfidences } from "./span-confidence";
import { tagSentence, trainTagger } from "./tagger";
import { applyPlatt } from "../estimation/platt";
import { encodeWords } from "../estimation/vocabulary";

// The cached lattice must hold exactly the scores of the general builder (buildFirstOrderProblem,
// itself checked against brute-force enumeration in tagger.test.ts), and tagSentence's fast path
// the same tags, likelihood and chunk probabilities as the log-space kernels.
const configs: [string, Partial<TrainingConfig>][] = [
  ["default", {}],
  ["no context emissions", { contextEmissions: false }],
  ["no previous-word transitions", { prevWord: false }],
  ["neither", { prevWord: false, contextEmissions: false }],
  ["no suffixes, no end state, unconstrained", { suffixLength: 0, endState: false, constrainIob: false }],
  ["perceptron weights on the emissions", { perceptron: 2 }],
];

const synthetic = createSyntheticDocuments(6000, 400, 5);
const heldOut = createSyntheticDocuments(1500, 500, 6).flatMap((d) => d.sentences.map((s) => s.words));

describe("buildSentenceLattice", () => {
  it.each(configs)("equals buildFirstOrderProblem's log scores cell for cell (%s)", (_name, config) => {
    const { model } = trainTagger([...tinyDocuments, ...synthetic], { ...config, calibration: "none" });
    expect(fastLatticeApplies(model)).toBe(true);
    const K = model.tags.length;
    for (const words of heldOut.slice(0, 40)) {
      const { params, input } = buildFirstOrderProblem(model, words);
      const lattice = buildSentenceLattice(model, words);
      const T = words.length;
      expect(Array.from(lattice.logEmissions.subarray(0, T * K))).toEqual(Array.from(input.scores));
      expect(Array.from(lattice.logStart)).toEqual(Array.from(params.start));
      for (let t = 1; t < T; t++) {
        const m = input.transitionIndex === null ? 0 : input.transitionIndex[t];
        expect(Array.from(stepMatrix(lattice.logSteps, lattice.columns, t, K))).toEqual(Array.from(params.transitions.subarray(m * K * K, (m + 1) * K * K)));
      }
    }
  });

  it("reads every token as symbolOf does: known words, unknown words by class, sentence-initial words by their lower-case form", () => {
    const { model } = trainTagger([...tinyDocuments, ...synthetic], { calibration: "none" });
    const lower = model.vocabulary.words.filter((w) => /^[a-z][a-z0-9]*$/.test(w)).slice(0, 200);
    expect(lower.length).toBeGreaterThan(10);
    const capitalised = lower.map((w) => w[0].toUpperCase() + w.slice(1)).filter((w) => !model.vocabulary.index.has(w));
    expect(capitalised.length).toBeGreaterThan(5);
    const sentences = [...heldOut.slice(0, 40), ...capitalised.map((w, i) => [w, ...heldOut[i % 40].slice(1)]), ...capitalised.map((w, i) => [...heldOut[i % 40].slice(0, 2), w])];
    for (const words of sentences) {
      const lattice = buildSentenceLattice(model, words);
      expect(Array.from(lattice.symbols.subarray(0, words.length)), words.join(" ")).toEqual(Array.from(encodeWords(model.vocabulary, words)));
    }
  });

  it.each<[string, Partial<TrainingConfig>]>([
    ["with suffixes", {}],
    ["without suffixes, so unknown words of a class would share one row", { suffixLength: 0 }],
  ])("gives words the clustering knows their own rows, equal to buildFirstOrderProblem's cell for cell (%s)", (_name, config) => {
    // Unknown words of the held-out text are clustered from it as unlabelled text, so their rows
    // carry the cluster ratio (cluster-emissions.ts) and must not be shared with their class's row.
    const sentences = heldOut.slice(0, 40);
    const { model } = trainTagger([...tinyDocuments, ...synthetic], { ...config, clusters: 16, calibration: "none" }, { unlabelled: [sentences] });
    const { model: plain } = trainTagger([...tinyDocuments, ...synthetic], { ...config, calibration: "none" });
    expect(model.clusters).not.toBeNull();
    const K = model.tags.length;
    let differing = 0;
    for (const words of sentences) {
      const { input } = buildFirstOrderProblem(model, words);
      const lattice = buildSentenceLattice(model, words);
      expect(Array.from(lattice.logEmissions.subarray(0, words.length * K))).toEqual(Array.from(input.scores));
      const other = buildSentenceLattice(plain, words).logEmissions.subarray(0, words.length * K);
      if (other.some((v, i) => v !== input.scores[i])) differing++;
    }
    expect(differing).toBeGreaterThan(0);
  });

  it.each(configs)("tagSentence's fast path agrees with the log-space path (%s)", (_name, config) => {
    const { model } = trainTagger([...tinyDocuments, ...synthetic], { ...config, calibration: "none" });
    for (const words of heldOut.slice(0, 60)) {
      const fast = tagSentence(model, words);
      const tags = Array.from(decodeSentence(model, words).path, (k) => model.tags[k]);
      expect(fast.tags).toEqual(tags);
      const { logLikelihood } = sentencePosteriors(model, words);
      expect(fast.logLikelihood).toBeCloseTo(logLikelihood, 8);
      const reference = chunkConfidences(model, words, 0, tagsToChunks(tags), logLikelihood);
      expect(fast.chunks.length).toBe(reference.length);
      fast.chunks.forEach((c, i) => expect(c.confidence).toBeCloseTo(reference[i], 10));
    }
  });
});

describe("calibrated span confidences", () => {
  it("are the Platt map (fitted on 5-fold CV of the training data) of the raw chunk marginals", () => {
    const docs = [...tinyDocuments, ...synthetic];
    const { model } = trainTagger(docs);
    const raw = trainTagger(docs, { calibration: "none" }).model;
    expect(model.calibration).not.toBeNull();
    for (const words of heldOut.slice(0, 20)) {
      const a = tagSentence(model, words);
      const b = tagSentence(raw, words);
      expect(a.tags).toEqual(b.tags);
      a.chunks.forEach((c, i) => expect(c.confidence).toBeCloseTo(applyPlatt(model.calibration!, b.chunks[i].confidence, b.chunks[i].end - b.chunks[i].start), 12));
    }
  });
});

describe("computeScaledForwardBackward", () => {
  it("gives Rabiner's posteriors and likelihood on random models, checked by enumerating every path", () => {
    // Reference: brute-force sums over all K^T paths (definition of P(O) and γ_t, Rabiner 1989 §III).
    const seed = 41;
    const rng = createRng(seed);
    for (let trial = 0; trial < 20; trial++) {
      const K = 2 + rng.nextInt(2);
      const T = 1 + rng.nextInt(4);
      const { params, emissionTable } = randomHmm(rng, K, 4, { end: trial % 2 === 0, matrices: T });
      const rows = Int32Array.from({ length: T }, () => rng.nextInt(4));
      const index = Int32Array.from({ length: T }, (_, t) => t);
      const input = { length: T, scores: emissionTable, rows, transitionIndex: index };
      const brute = enumeratePaths(params, input);
      const steps = Float64Array.from(params.transitions, Math.exp);
      const emissions = new Float64Array(T * K);
      for (let t = 0; t < T; t++) for (let k = 0; k < K; k++) emissions[t * K + k] = Math.exp(emissionTable[rows[t] * K + k]);
      const ws = createScaledWorkspace(K, T);
      const end = params.end === null ? null : Float64Array.from(params.end, Math.exp);
      const ll = computeScaledForwardBackward(K, T, Float64Array.from(params.start, Math.exp), steps, index, emissions, end, ws);
      expect(ll, `seed ${seed} trial ${trial}`).toBeCloseTo(brute.logLikelihood, 10);
      for (let x = 0; x < T * K; x++) expect(ws.alpha[x] * ws.beta[x], `seed ${seed} trial ${trial}`).toBeCloseTo(brute.posteriors[x], 10);
      expect(computePosteriors(params, input).logLikelihood).toBeCloseTo(ll, 10);
    }
  });

  it("returns NaN when a step underflows or has probability 0, and scales anything above that", () => {
    const ws = createScaledWorkspace(2, 2);
    const steps = new Float64Array(8).fill(0.5);
    const index = Int32Array.of(0, 1);
    // 1e-200 · 1e-200 is below the smallest double: the first scale factor is 0.
    expect(computeScaledForwardBackward(2, 2, Float64Array.of(1e-200, 1e-200), steps, index, Float64Array.of(1e-200, 1e-200, 1, 1), null, ws)).toBeNaN();
    expect(computeScaledForwardBackward(2, 2, Float64Array.of(0.5, 0.5), steps, index, Float64Array.of(1, 1, 0, 0), null, ws)).toBeNaN();
    // Per-token factors keep tiny probabilities representable: log(0.5·1e-200·0.5·1e-200 + …) over 2 tokens.
    const ll = computeScaledForwardBackward(2, 2, Float64Array.of(0.5, 0.5), steps, index, Float64Array.of(1e-200, 1e-200, 1e-200, 1e-200), null, ws);
    expect(ll).toBeCloseTo(2 * Math.log(1e-200), 8);
  });
});
