import { describe, expect, it } from "vitest";
import { addFeatureWeights, createFeatureWeights, featureKey, wordShape, wordTypeFeatures } from "./word-type-features";
import { createWordClusters } from "./brown-clusters";

describe("word-type features (Ratnaparkhi 1996 Table 1 / §3 templates of the word itself, as Collins 2002 §3 uses them)", () => {
  it("lists a capitalised hyphenated word's features, written out by hand", () => {
    // "Vel-Mora": lower-cased "vel-mora", 8 characters, so affixes of 1–4 characters.
    expect(wordTypeFeatures("Vel-Mora", false, null)).toEqual([
      "lower=vel-mora",
      "prefix=v",
      "prefix=ve",
      "prefix=vel",
      "prefix=vel-",
      "suffix=a",
      "suffix=ra",
      "suffix=ora",
      "suffix=mora",
      "shape=Xxx-Xxxx",
      "class=initCapHyphen",
      "hyphen",
      "upper-inside",
    ]);
  });

  it("keeps affixes shorter than the word, marks digits and uses the informal classes and the first-word position", () => {
    expect(wordTypeFeatures("b4", true, null)).toEqual(["lower=b4", "prefix=b", "suffix=4", "shape=xd", "class=firstWord+lowerCaseDigit", "digit"]);
    expect(wordTypeFeatures("@zorvik", false, null)).toContain("class=handle");
    expect(wordTypeFeatures("#quorvel", false, null)).toContain("class=hashtag");
    expect(wordTypeFeatures("http://plumbrix.example", false, null)).toContain("class=url");
    expect(wordTypeFeatures("sooooo", false, null)).toContain("class=elongatedLower");
    expect(wordTypeFeatures("🙂", false, null)).toEqual(["lower=🙂", "shape=🙂", "class=emoticon"]);
  });

  it("cuts shape runs at four characters", () => {
    expect(wordShape("Velmora")).toBe("Xxxxx");
    expect(wordShape("ab")).toBe("xx");
    expect(wordShape("19")).toBe("dd");
    expect(wordShape("1990")).toBe("dddd");
    expect(wordShape("199000")).toBe("dddd");
    expect(wordShape("M.K.")).toBe("X.X.");
  });

  it("adds prefixes of even length and the whole bit string of a clustered word", () => {
    const clusters = createWordClusters(["velmora", "drussel"], Int32Array.from([0, 1]), ["10110", "0"]);
    expect(wordTypeFeatures("velmora", false, clusters).filter((f) => f.startsWith("cluster="))).toEqual(["cluster=10", "cluster=1011", "cluster=10110"]);
    expect(wordTypeFeatures("drussel", false, clusters).filter((f) => f.startsWith("cluster="))).toEqual(["cluster=0"]);
    expect(wordTypeFeatures("ostravel", false, clusters).some((f) => f.startsWith("cluster="))).toBe(false);
  });

  it("adds the sum of the features' weights for the word's kind (known or read by class), and nothing for unseen features", () => {
    const K = 2;
    const names = [featureKey("lower=ab", false), featureKey("suffix=b", false), featureKey("lower=ab", true), featureKey("shape=xx", false)];
    const table = createFeatureWeights(names, Float64Array.from([1, 2, 0.5, -1, 100, 100, 0.25, 0.25]), K);
    const row = Float64Array.from([10, 20]);
    // ab (read by class): lower=ab (1, 2) + prefix=a (absent) + suffix=b (0.5, −1) + shape=xx (0.25, 0.25) + class=lowerCase (absent).
    addFeatureWeights(table, null, "ab", false, false, row, 0);
    expect(Array.from(row)).toEqual([10 + 1.75, 20 + 1.25]);
    const known = Float64Array.from([0, 0]);
    addFeatureWeights(table, null, "ab", false, true, known, 0);
    expect(Array.from(known)).toEqual([100, 100]);
    expect(() => createFeatureWeights(["a", "a"], new Float64Array(4), 2)).toThrow(/distinct/);
    expect(() => createFeatureWeights(["a"], new Float64Array(3), 2)).toThrow(/3 weights for 1 features/);
  });
});
