import { spawnSync } from "node:child_process";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { toIob2 } from "../text/bio";
import { computePrf, scoreEntities, tokenAccuracy } from "./entity-scores";

// NLTK from Debian's python3-nltk as a live reference; /usr/bin/python3 because another python3
// earlier on PATH may not see apt's packages.
const PYTHON = "/usr/bin/python3";
const hasNltk = spawnSync(PYTHON, ["-c", "import nltk"]).status === 0;

describe("scoreEntities", () => {
  it("matches the seqeval README example", () => {
    // seqeval README (github.com/chakki-works/seqeval, 1.x), section "Usage": its
    // classification_report prints MISC P=R=F1=0.00 (support 1), PER 1.00 (support 1), micro
    // avg 0.50/0.50/0.50, and accuracy_score 0.80.
    const gold = [["O", "O", "O", "B-MISC", "I-MISC", "I-MISC", "O"], ["B-PER", "I-PER", "O"]];
    const predicted = [["O", "O", "B-MISC", "I-MISC", "I-MISC", "I-MISC", "O"], ["B-PER", "I-PER", "O"]];
    const scores = scoreEntities(gold, predicted);
    expect(scores.overall).toEqual({ precision: 0.5, recall: 0.5, f1: 0.5, correct: 1, predicted: 2, gold: 2 });
    expect(scores.types).toEqual({
      MISC: { precision: 0, recall: 0, f1: 0, support: 1, correct: 0, predicted: 1 },
      PER: { precision: 1, recall: 1, f1: 1, support: 1, correct: 1, predicted: 1 },
    });
    expect(scores.tokenAccuracy).toBeCloseTo(0.8, 12);
    expect(scores.tokens).toBe(10);
    expect(scores.sentences).toBe(2);
  });

  it("matches conlleval on edge cases (I-X after O, type change inside a chunk, B-X B-X, lone I-X)", () => {
    // Figures as conlleval (the CoNLL-2000 shared task's evaluation script, 2004 version) reports
    // them for these six sentences, and as they follow by hand from its chunk rules (a chunk
    // starts at B-X, at I-X after O and at a type change; it ends before B, O or a type change):
    // 18 tokens, 8 gold, 8 found, 4 correct (PER "B-PER I-PER" and LOC at token 3 of sentence 1,
    // MISC of sentence 4, PER of sentence 6) → P=R=F1=50.00; 12 of 18 tags equal → accuracy 66.67;
    // per type P/R/F1: LOC 50/50/50, MISC 100/100/100, ORG 0/0/0, PER 50/50/50.
    const gold = [["B-PER", "I-PER", "O", "B-LOC"], ["B-ORG", "I-ORG", "I-ORG", "O"], ["B-PER", "B-PER", "O"], ["O", "B-MISC", "I-MISC"], ["B-LOC", "O", "O"], ["I-PER"]];
    const predicted = [["B-PER", "I-PER", "O", "I-LOC"], ["B-ORG", "I-ORG", "I-LOC", "O"], ["B-PER", "I-PER", "O"], ["O", "B-MISC", "I-MISC"], ["O", "O", "B-PER"], ["B-PER"]];
    const scores = scoreEntities(gold, predicted);
    expect(scores.tokens).toBe(18);
    expect(scores.overall).toMatchObject({ gold: 8, predicted: 8, correct: 4 });
    expect(scores.overall.precision * 100).toBeCloseTo(50.0, 2);
    expect(scores.overall.recall * 100).toBeCloseTo(50.0, 2);
    expect(scores.overall.f1 * 100).toBeCloseTo(50.0, 2);
    expect(scores.tokenAccuracy * 100).toBeCloseTo(66.67, 2);
    const printed: Record<string, [number, number, number]> = { LOC: [50, 50, 50], MISC: [100, 100, 100], ORG: [0, 0, 0], PER: [50, 50, 50] };
    expect(Object.keys(scores.types)).toEqual(["LOC", "MISC", "ORG", "PER"]);
    for (const [type, [p, r, f]] of Object.entries(printed)) {
      expect(scores.types[type].precision * 100).toBeCloseTo(p, 2);
      expect(scores.types[type].recall * 100).toBeCloseTo(r, 2);
      expect(scores.types[type].f1 * 100).toBeCloseTo(f, 2);
    }
    // Supports worked by hand from the sequences above: PER 4, LOC 2, ORG 1, MISC 1.
    expect([scores.types.PER.support, scores.types.LOC.support, scores.types.ORG.support, scores.types.MISC.support]).toEqual([4, 2, 1, 1]);
  });

  it("ends chunks at sentence boundaries", () => {
    // Worked by hand: joined into one sentence the two I-PER tokens would be one chunk in both; split,
    // gold has two PER chunks and the prediction (a B-PER then I-LOC) matches only the first.
    const scores = scoreEntities([["O", "I-PER"], ["I-PER", "O"]], [["O", "B-PER"], ["I-LOC", "O"]]);
    expect(scores.overall).toMatchObject({ gold: 2, predicted: 2, correct: 1 });
    expect(scores.types.LOC).toEqual({ precision: 0, recall: 0, f1: 0, support: 0, correct: 0, predicted: 1 });
  });

  it("gives 0 for every ratio with a zero denominator, and handles empty input", () => {
    // conlleval's convention (the 2004 Perl script sets precision, recall and F to 0 when their
    // denominator is 0; from memory of the script).
    expect(scoreEntities([["O", "O"]], [["O", "O"]]).overall).toEqual({ precision: 0, recall: 0, f1: 0, correct: 0, predicted: 0, gold: 0 });
    expect(scoreEntities([["B-X"]], [["O"]]).types.X).toEqual({ precision: 0, recall: 0, f1: 0, support: 1, correct: 0, predicted: 0 });
    expect(scoreEntities([], [])).toEqual({
      overall: { precision: 0, recall: 0, f1: 0, correct: 0, predicted: 0, gold: 0 },
      types: {},
      tokenAccuracy: 0,
      tokens: 0,
      sentences: 0,
    });
  });

  it("throws RangeError naming the sentence whose lengths differ, and on non-IOB tags", () => {
    expect(() => scoreEntities([["O"], ["O"]], [["O"]])).toThrow("gold has 2 sentences but predicted has 1");
    expect(() => scoreEntities([["O"], ["O", "O"]], [["O"], ["O"]])).toThrow("sentence 1: gold has 2 tags but predicted has 1");
    expect(() => scoreEntities([["O", "NN"]], [["O", "O"]])).toThrow('sentence 0 token 1: tag "NN" is not an IOB tag');
  });

  it("agrees with NLTK's chunk scoring on random IOB1/IOB2 sequences (live, seed 4101), and IOB1 scores like its IOB2 form", () => {
    expect(hasNltk, "NLTK is needed for this live check: apt-get install python3-nltk (npm test installs it)").toBe(true);
    // nltk.chunk.util.conlltags2tree reads IOB tags as conlleval does (I-X after O or after another
    // type opens a chunk) and nltk.chunk.util.ChunkScore counts a guessed chunk correct only with
    // the same position, extent and label (NLTK 3.x, Debian python3-nltk). One ChunkScore per
    // case for all types, and one per type (chunk_label "^TYPE$").
    const tag = fc.constantFrom("O", "B-PER", "I-PER", "B-LOC", "I-LOC");
    const sentence = fc.array(tag, { maxLength: 12 });
    const cases = fc.sample(
      fc.array(sentence.chain((g) => fc.tuple(fc.constant(g), fc.array(tag, { minLength: g.length, maxLength: g.length }))), { maxLength: 8 }),
      { seed: 4101, numRuns: 300 },
    );
    const script = [
      "import json, sys",
      "from nltk.chunk.util import ChunkScore, conlltags2tree",
      "def score(gold, predicted, label):",
      "    cs = ChunkScore(chunk_label=label)",
      "    for g, p in zip(gold, predicted):",
      "        cs.score(conlltags2tree([(str(i), 'X', t) for i, t in enumerate(g)]), conlltags2tree([(str(i), 'X', t) for i, t in enumerate(p)]))",
      // correct() lists the gold chunks, guessed() the predicted ones, missed() gold ones not guessed.
      "    return [len(cs.correct()), len(cs.guessed()), len(cs.correct()) - len(cs.missed()), cs.precision(), cs.recall(), cs.f_measure()]",
      "out = []",
      "for pairs in json.load(sys.stdin):",
      "    gold = [g for g, _ in pairs]",
      "    predicted = [p for _, p in pairs]",
      "    out.append({label: score(gold, predicted, pattern) for label, pattern in [('all', '.*'), ('PER', '^PER$'), ('LOC', '^LOC$')]})",
      "print(json.dumps(out))",
    ].join("\n");
    const run = spawnSync(PYTHON, ["-c", script], { input: JSON.stringify(cases), encoding: "utf8", maxBuffer: 16 * 1024 * 1024 });
    expect(run.stderr).toBe("");
    const reference = JSON.parse(run.stdout) as Array<Record<"all" | "PER" | "LOC", [number, number, number, number, number, number]>>;
    expect(reference).toHaveLength(cases.length);
    cases.forEach((pairs, n) => {
      const gold = pairs.map((p) => p[0]);
      const predicted = pairs.map((p) => p[1]);
      const scores = scoreEntities(gold, predicted);
      const at = `case ${n}: ${JSON.stringify(pairs)}`;
      const [goldCount, found, correct, precision, recall, f1] = reference[n].all;
      expect([scores.overall.gold, scores.overall.predicted, scores.overall.correct], at).toEqual([goldCount, found, correct]);
      expect(scores.overall.precision, at).toBeCloseTo(precision, 12);
      expect(scores.overall.recall, at).toBeCloseTo(recall, 12);
      expect(scores.overall.f1, at).toBeCloseTo(f1, 12);
      for (const type of ["PER", "LOC"] as const) {
        const [g, p, c, tp, tr, tf] = reference[n][type];
        const mine = scores.types[type] ?? { support: 0, predicted: 0, correct: 0, precision: 0, recall: 0, f1: 0 };
        expect([mine.support, mine.predicted, mine.correct], `${at} ${type}`).toEqual([g, p, c]);
        expect([mine.precision, mine.recall, mine.f1].map((x) => Number(x.toFixed(12))), `${at} ${type}`).toEqual([tp, tr, tf].map((x) => Number(x.toFixed(12))));
      }
      expect(scoreEntities(gold.map(toIob2), predicted.map(toIob2)).overall, at).toEqual(scores.overall);
    });
  });

  it("adds up over many sentences: 5,000 sentences of 20 tokens score 625 times their first 8", () => {
    // The two patterns repeat every 8 sentences, so every count is 625 times that of the first 8.
    const tags = ["B-PER", "I-PER", "O", "B-LOC", "O", "I-ORG", "I-ORG", "O"];
    const gold: string[][] = [];
    const predicted: string[][] = [];
    for (let s = 0; s < 5000; s++) {
      const g: string[] = [];
      const p: string[] = [];
      for (let i = 0; i < 20; i++) {
        g.push(tags[(s + i) % tags.length]);
        p.push(tags[(s * 3 + i) % tags.length]);
      }
      gold.push(g);
      predicted.push(p);
    }
    const scores = scoreEntities(gold, predicted);
    const first = scoreEntities(gold.slice(0, 8), predicted.slice(0, 8));
    expect(scores.tokens).toBe(100_000);
    expect([scores.overall.gold, scores.overall.predicted, scores.overall.correct]).toEqual([first.overall.gold, first.overall.predicted, first.overall.correct].map((x) => 625 * x));
    expect(first.overall.correct).toBeGreaterThan(0);
    expect(scores.overall.f1).toBeCloseTo(first.overall.f1, 12);
  });
});

describe("computePrf", () => {
  it("is the harmonic mean of precision and recall", () => {
    // Worked by hand: P = 3/4, R = 3/5, F1 = 2·(3/4)(3/5)/(3/4 + 3/5) = 2/3.
    const prf = computePrf(3, 4, 5);
    expect(prf.precision).toBe(0.75);
    expect(prf.recall).toBe(0.6);
    expect(prf.f1).toBeCloseTo(2 / 3, 12);
  });
});

describe("tokenAccuracy", () => {
  it("counts whole-tag matches over any tag set", () => {
    // Worked by hand: 3 of 4 tags equal.
    expect(tokenAccuracy([["DT", "NN"], ["VBZ", "."]], [["DT", "NNS"], ["VBZ", "."]])).toBe(0.75);
    expect(tokenAccuracy([], [])).toBe(0);
    expect(() => tokenAccuracy([["O"]], [["O", "O"]])).toThrow(RangeError);
  });
});
