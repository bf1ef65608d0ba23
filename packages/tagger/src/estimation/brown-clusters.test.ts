import { describe, expect, it } from "vitest";
import { clusterOf, createWordClusters, learnBrownClusters, rankWordTypes, type MergeEvent } from "./brown-clusters";
import { createRng } from "../util/random";

/**
 * Brute-force AMI (Brown et al. 1992, §3): I = Σ p(l,r) log(p(l,r) / (pl(l) pr(r))) over the
 * bigrams of the boundary-padded sentences (B w1 … wn B, B a class of its own), counting only
 * bigrams whose words have both entered (`label` ≥ 0 or the boundary); the marginals count every
 * bigram. Written independently of the incremental bookkeeping it checks.
 */
function bruteForceAmi(encoded: readonly Int32Array[], label: (rank: number) => number): number {
  const BOUNDARY = -2;
  const joint = new Map<string, number>();
  const left = new Map<number, number>();
  const right = new Map<number, number>();
  let N = 0;
  for (const s of encoded) {
    if (s.length === 0) continue;
    const padded = [BOUNDARY, ...s, BOUNDARY];
    for (let i = 1; i < padded.length; i++) {
      const a = padded[i - 1] === BOUNDARY ? BOUNDARY : label(padded[i - 1]);
      const b = padded[i] === BOUNDARY ? BOUNDARY : label(padded[i]);
      N++;
      left.set(a, (left.get(a) ?? 0) + 1);
      right.set(b, (right.get(b) ?? 0) + 1);
      if (a === -1 || b === -1) continue;
      joint.set(`${a} ${b}`, (joint.get(`${a} ${b}`) ?? 0) + 1);
    }
  }
  let ami = 0;
  for (const [pair, c] of joint) {
    const [a, b] = pair.split(" ").map(Number);
    ami += (c / N) * Math.log((c * N) / (left.get(a)! * right.get(b)!));
  }
  return ami;
}

const sentences = (lines: string[]) => lines.map((l) => l.split(" "));

describe("Brown clustering (Brown et al. 1992 §3; window of Liang 2005 §3)", () => {
  /*
   * Worked by hand. Corpus: "the cat", "the cat runs", "the dog", "the dog runs". With the
   * boundary B the 14 bigrams are (B,the)×4, (the,cat)×2, (the,dog)×2, (cat,B), (cat,runs),
   * (dog,B), (dog,runs), (runs,B)×2. Left marginals: B 4, the 4, cat 2, dog 2, runs 2; right:
   * the 4, cat 2, dog 2, runs 2, B 4. Each term is c/14 · ln(14c / (left·right)):
   *   (B,the) 4/14 ln(56/16) = 4/14 ln 3.5; (the,cat), (the,dog) 2/14 ln(28/8) = 2/14 ln 3.5 each;
   *   (cat,runs), (dog,runs) 1/14 ln(14/4) = 1/14 ln 3.5 each; (runs,B) 2/14 ln(28/8) = 2/14 ln 3.5;
   *   (cat,B), (dog,B) 1/14 ln(14/8) = 1/14 ln 1.75 each;
   * so I₀ = (12/14) ln 3.5 + (2/14) ln 1.75 = 1.153742.
   * Merging cat and dog into C: (the,C) 4/14 ln(56/16), (C,runs) 2/14 ln(28/8), (C,B) 2/14 ln(28/16)
   * — the same sum, because cat and dog have the same left and right context distributions: the
   * merge loses nothing. No merge can gain (a merge is a function of the classes, and mutual
   * information cannot grow under one: Cover & Thomas, "Elements of Information Theory", 2nd ed.,
   * §2.8), so cat+dog is a best merge. The runner-up, cat+runs = X (left 4, right 4):
   *   (B,the) 4/14 ln 3.5, (the,X) 2/14 ln(28/16), (the,dog) 2/14 ln 3.5, (X,B) 3/14 ln(42/16),
   *   (X,X) 1/14 ln(14/16), (dog,B) 1/14 ln 1.75, (dog,X) 1/14 ln(14/8)
   *   = (6/14) ln 3.5 + (4/14) ln 1.75 + (3/14) ln 2.625 + (1/14) ln 0.875 = 0.894054,
   * a loss of 0.259688 (dog+runs loses the same; every other pair loses more), so the best merge
   * is unique.
   */
  const handCorpus = sentences(["the cat", "the cat runs", "the dog", "the dog runs"]);
  const I0 = (12 / 14) * Math.log(3.5) + (2 / 14) * Math.log(1.75);

  it("makes the hand-worked best first merge (cat + dog, no loss of AMI)", () => {
    const events: MergeEvent[] = [];
    const clusters = learnBrownClusters(handCorpus, { clusters: 4, onMerge: (e) => events.push(e) });
    // Ranks: the (4), cat (2, seen first), runs (2), dog (2).
    expect(clusters.words).toEqual(["the", "cat", "runs", "dog"]);
    expect(bruteForceAmi(rankWordTypes(handCorpus).encoded, (r) => r)).toBeCloseTo(I0, 12);
    expect(events[0].phase).toBe("tree");
    expect(events[0].merged).toEqual([1, 3]);
    expect(events[0].ami).toBeCloseTo(I0, 12);
    // The runner-up's AMI, from the comment: the chosen merge beats it by 0.259688.
    const runnerUp = (6 / 14) * Math.log(3.5) + (4 / 14) * Math.log(1.75) + (3 / 14) * Math.log(2.625) + (1 / 14) * Math.log(0.875);
    expect(events[0].ami - runnerUp).toBeCloseTo(0.259688, 6);
    expect(clusters.paths).toHaveLength(4);
  });

  it("with a window of 3 the last type to enter (dog) joins cat, and the bit paths tell the clusters apart", () => {
    const clusters = learnBrownClusters(handCorpus, { clusters: 3 });
    expect(clusterOf(clusters, "cat")).toBe(clusterOf(clusters, "dog"));
    expect(new Set(["the", "cat", "runs"].map((w) => clusterOf(clusters, w))).size).toBe(3);
    expect(clusterOf(clusters, "unseen")).toBe(-1);
    expect(new Set(clusters.paths).size).toBe(3);
    for (const p of clusters.paths) expect(p).toMatch(/^[01]+$/);
    // A binary tree over 3 leaves: one path of length 1 and two of length 2 sharing their first bit.
    expect(clusters.paths.map((p) => p.length).sort()).toEqual([1, 2, 2]);
  });

  it("keeps the AMI bookkeeping equal to a brute-force recomputation after every merge, and each merge is the best one", () => {
    const rng = createRng(12);
    // A random text over 18 types with a Zipf-like skew, so that types enter in a clear order.
    const vocabulary = Array.from({ length: 18 }, (_, i) => `w${i}`);
    const corpus = Array.from({ length: 40 }, () =>
      Array.from({ length: 2 + rng.nextInt(6) }, () => vocabulary[Math.min(rng.nextInt(18), rng.nextInt(18), rng.nextInt(18))]),
    );
    const { encoded, words } = rankWordTypes(corpus);
    const V = words.length;
    for (const m of [4, 7]) {
      let before: Int32Array = new Int32Array(V).fill(-1);
      for (let r = 0; r < Math.min(m, V); r++) before[r] = r;
      let entered = Math.min(m, V);
      let merges = 0;
      learnBrownClusters(corpus, {
        clusters: m,
        onMerge: (event) => {
          if (event.phase === "window") {
            before[entered] = entered;
            entered++;
          }
          const after = event.assignment();
          expect(event.ami, `m=${m}, merge ${merges}`).toBeCloseTo(bruteForceAmi(encoded, (r) => after[r]), 10);
          // Greedy optimality: no other pair of the clusters before this merge gives a higher AMI.
          const labels = [...new Set(Array.from(before).filter((x) => x >= 0))];
          let best = -Infinity;
          for (let i = 0; i < labels.length; i++) {
            for (let j = i + 1; j < labels.length; j++) {
              const [a, b] = [labels[i], labels[j]];
              best = Math.max(best, bruteForceAmi(encoded, (r) => (before[r] === b ? a : before[r])));
            }
          }
          expect(event.ami, `m=${m}, merge ${merges} is not the best`).toBeCloseTo(best, 10);
          before = after;
          merges++;
        },
      });
      // V − m window merges, then m − 1 merges of the tree.
      expect(merges).toBe(V - 1);
    }
  });

  it("is deterministic and gives every type exactly one cluster", () => {
    const rng = createRng(5);
    const corpus = Array.from({ length: 60 }, () => Array.from({ length: 3 + rng.nextInt(5) }, () => `t${rng.nextInt(30)}`));
    const a = learnBrownClusters(corpus, { clusters: 6 });
    const b = learnBrownClusters(corpus, { clusters: 6 });
    expect(a.words).toEqual(b.words);
    expect(Array.from(a.cluster)).toEqual(Array.from(b.cluster));
    expect(a.paths).toEqual(b.paths);
    expect(new Set(a.cluster).size).toBe(6);
    const rebuilt = createWordClusters(a.words, a.cluster, a.paths);
    for (const w of a.words) expect(clusterOf(rebuilt, w)).toBe(clusterOf(a, w));
  });

  it("refuses a cluster count below 1 and a malformed stored clustering", () => {
    expect(() => learnBrownClusters(handCorpus, { clusters: 0 })).toThrow(RangeError);
    expect(() => createWordClusters(["a"], Int32Array.from([1]), ["0"])).toThrow(/outside 1 clusters/);
    expect(() => createWordClusters(["a"], Int32Array.from([0]), ["02"])).toThrow(/bit string/);
    expect(learnBrownClusters([], { clusters: 3 }).words).toEqual([]);
  });
});
