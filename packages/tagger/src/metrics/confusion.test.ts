import { spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { computeConfusionMatrix } from "./confusion";

// NLTK from Debian's python3-nltk as a live reference; /usr/bin/python3 because another python3
// earlier on PATH may not see apt's packages.
const PYTHON = "/usr/bin/python3";
const hasNltk = spawnSync(PYTHON, ["-c", "import nltk"]).status === 0;

describe("computeConfusionMatrix", () => {
  it("counts tokens by gold and predicted entity type, prefixes stripped, O last", () => {
    // Worked by hand: tokens (gold→predicted) PER→PER, PER→PER, O→LOC, LOC→LOC, O→O, ORG→PER.
    const { labels, counts } = computeConfusionMatrix([["B-PER", "I-PER", "O", "B-LOC"], ["O", "I-ORG"]], [["B-PER", "B-PER", "B-LOC", "I-LOC"], ["O", "B-PER"]]);
    expect(labels).toEqual(["LOC", "ORG", "PER", "O"]);
    expect(counts).toEqual([
      [1, 0, 0, 0],
      [0, 0, 1, 0],
      [0, 0, 2, 0],
      [1, 0, 0, 1],
    ]);
  });

  it("keeps plain tags as labels, handles empty input and checks shapes", () => {
    expect(computeConfusionMatrix([["DT", "NN"]], [["DT", "VB"]])).toEqual({
      labels: ["DT", "NN", "VB"],
      counts: [
        [1, 0, 0],
        [0, 0, 1],
        [0, 0, 0],
      ],
    });
    expect(computeConfusionMatrix([], [])).toEqual({ labels: [], counts: [] });
    expect(() => computeConfusionMatrix([["O"]], [["O"], ["O"]])).toThrow(RangeError);
  });

  it("agrees with NLTK's ConfusionMatrix on random tags (live, seed 5101)", () => {
    expect(hasNltk, "NLTK is needed for this live check: apt-get install python3-nltk (npm test installs it)").toBe(true);
    // nltk.metrics.ConfusionMatrix(reference, test), NLTK 3.x (Debian python3-nltk); cm[r, t] is the
    // number of positions with reference r and test t.
    const rng = createRng(5101);
    const tags = ["O", "O", "O", "B-PER", "I-PER", "B-LOC", "I-LOC", "B-ORG", "I-MISC"];
    const gold: string[][] = [];
    const predicted: string[][] = [];
    for (let s = 0; s < 40; s++) {
      const length = 1 + rng.nextInt(15);
      gold.push(Array.from({ length }, () => tags[rng.nextInt(tags.length)]));
      predicted.push(Array.from({ length }, () => tags[rng.nextInt(tags.length)]));
    }
    const strip = (t: string): string => (t === "O" ? t : t.slice(2));
    const script = [
      "import json, sys",
      "from nltk.metrics import ConfusionMatrix",
      "data = json.load(sys.stdin)",
      "cm = ConfusionMatrix(data['gold'], data['predicted'])",
      "print(json.dumps([[cm[g, p] for p in data['labels']] for g in data['labels']]))",
    ].join("\n");
    const mine = computeConfusionMatrix(gold, predicted);
    const run = spawnSync(PYTHON, ["-c", script], {
      input: JSON.stringify({ gold: gold.flat().map(strip), predicted: predicted.flat().map(strip), labels: mine.labels }),
      encoding: "utf8",
    });
    expect(run.stderr).toBe("");
    expect(mine.counts).toEqual(JSON.parse(run.stdout));
  });
});
