import { describe, expect, it } from "vitest";
import { bucketCount, fillTransitionBuckets, formatPositionBuckets, parsePositionBuckets, sentenceBucketOf } from "./position-buckets";

describe("position buckets", () => {
  it("maps token and sentence indices to buckets", () => {
    const buckets = parsePositionBuckets("token:2,4/sentence:1");
    expect(bucketCount(buckets)).toBe(6);
    expect(sentenceBucketOf(buckets, 0)).toBe(0);
    expect(sentenceBucketOf(buckets, 5)).toBe(1);
    expect(Array.from(fillTransitionBuckets(buckets, 6, 0, new Int32Array(6)))).toEqual([0, 0, 2, 2, 4, 4]);
    expect(Array.from(fillTransitionBuckets(buckets, 6, 3, new Int32Array(6)))).toEqual([0, 1, 3, 3, 5, 5]);
  });

  it("parses the CLI forms and round-trips them", () => {
    expect(parsePositionBuckets("none")).toEqual({ token: [], sentence: [] });
    expect(parsePositionBuckets("1,2,4")).toEqual({ token: [1, 2, 4], sentence: [] });
    expect(formatPositionBuckets(parsePositionBuckets("sentence:1,3"))).toBe("sentence:1,3");
    expect(formatPositionBuckets(parsePositionBuckets("none"))).toBe("none");
    expect(() => parsePositionBuckets("3,2")).toThrow(/must increase/);
    expect(() => parsePositionBuckets("0")).toThrow(/positive integer/);
    expect(() => parsePositionBuckets("word:1")).toThrow(/unknown part/);
    expect(() => parsePositionBuckets("1,x")).toThrow(/not an integer/);
  });
});
