import { describe, expect, it } from "vitest";
import { createWordClusters } from "./brown-clusters";
import { addClusterLogRatio, createClusterCollector } from "./cluster-emissions";
import { createVocabulary } from "./vocabulary";

describe("cluster prefixes in unknown-word emissions (Miller et al. 2004; successive abstraction as in Brants 2000 §2.3)", () => {
  // Clusters: "00" {kelm, dorra}, "01" {vish}, "1" {ost}. Word classes off: the group of an unknown
  // word is then its capitalisation (suffixGroupOf), 0 for these lower-case words.
  const clusters = createWordClusters(["kelm", "dorra", "vish", "ost"], Int32Array.from([0, 0, 1, 2]), ["00", "01", "1"]);
  const vocabulary = createVocabulary(["the"], "none", false);

  it("multiplies the class emission by P(t | class, bit string)/P̂(t | class), worked by hand", () => {
    const collector = createClusterCollector(clusters, 2);
    collector.add("kelm", 0, 1); // tag 1 (a name)
    collector.add("dorra", 0, 1);
    collector.add("vish", 0, 0); // tag 0 (not a name)
    collector.add("ost", 0, 0);
    collector.add("unclustered", 0, 1); // no bit string: not counted
    const theta = 1;
    const emissions = collector.finish(theta);
    // Root (the class): tags (0, 1) counted 2 and 2 → P̂ = (1/2, 1/2).
    // Prefix "0": kelm, dorra, vish → (1/3, 2/3); "00": kelm, dorra → (0, 1).
    // θ = 1: P("0") = ((1/3, 2/3) + (1/2, 1/2))/2 = (5/12, 7/12); P("00") = ((0, 1) + (5/12, 7/12))/2 = (5/24, 19/24).
    const row = new Float64Array([0.5, -0.25]);
    addClusterLogRatio(emissions, vocabulary, "kelm", false, 1, row, 0);
    expect(row[0]).toBeCloseTo(0.5 + Math.log(5 / 24 / 0.5), 14);
    expect(row[1]).toBeCloseTo(-0.25 + Math.log(19 / 24 / 0.5), 14);
    // "ost" = "1": (1, 0) → ((1, 0) + (1/2, 1/2))/2 = (3/4, 1/4).
    const other = new Float64Array(4);
    addClusterLogRatio(emissions, vocabulary, "ost", false, 1, other, 2);
    expect(Array.from(other)).toEqual([0, 0, Math.log(0.75 / 0.5), Math.log(0.25 / 0.5)]);
  });

  it("leaves known words, unclustered words and models without clusters alone", () => {
    const collector = createClusterCollector(clusters, 2);
    collector.add("kelm", 0, 1);
    collector.add("ost", 0, 0);
    const emissions = collector.finish(1);
    const row = new Float64Array([0.1, 0.2]);
    addClusterLogRatio(emissions, vocabulary, "kelm", false, 0, row, 0); // symbol 0 = the known word "the"
    addClusterLogRatio(emissions, vocabulary, "zzz", false, 1, row, 0);
    addClusterLogRatio(null, vocabulary, "kelm", false, 1, row, 0);
    expect(Array.from(row)).toEqual([0.1, 0.2]);
  });
});
