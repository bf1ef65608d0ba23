import { describe, expect, it } from "vitest";
import { wordClassNames, wordClassOf } from "./word-features";

const name = (word: string, first = false, scheme: "bikel" | "extended" = "bikel") => wordClassNames(scheme)[wordClassOf(word, first, scheme)];

describe("wordClassOf (Bikel et al. 1997, Nymble, word-feature table)", () => {
  it("gives each example of the feature table its class", () => {
    expect(name("90")).toBe("twoDigitNum");
    expect(name("1990")).toBe("fourDigitNum");
    expect(name("A8956-67")).toBe("containsDigitAndAlpha");
    expect(name("09-96")).toBe("containsDigitAndDash");
    expect(name("11/9/89")).toBe("containsDigitAndSlash");
    expect(name("23,000.00")).toBe("containsDigitAndComma");
    expect(name("1.00")).toBe("containsDigitAndPeriod");
    expect(name("456789")).toBe("otherNum");
    expect(name("BBN")).toBe("allCaps");
    expect(name("M.")).toBe("capPeriod");
    expect(name("Sally")).toBe("initCap");
    expect(name("can")).toBe("lowerCase");
    expect(name(",")).toBe("other");
  });

  it("applies firstWord after the number, all-caps and initial tests, as the table's order implies", () => {
    expect(name("Sally", true)).toBe("firstWord");
    expect(name("can", true)).toBe("firstWord");
    expect(name("1990", true)).toBe("fourDigitNum");
    expect(name("BBN", true)).toBe("allCaps");
    expect(name("M.", true)).toBe("capPeriod");
  });

  it("extended scheme keeps the first word's own class and splits punctuation and hyphenated words", () => {
    expect(name("Sally", true, "extended")).toBe("firstWord+initCap");
    expect(name("can", true, "extended")).toBe("firstWord+lowerCase");
    expect(name(",", false, "extended")).toBe("punctuation");
    expect(name("Anglo-Saxon", false, "extended")).toBe("initCapHyphen");
    expect(name("McDonald", false, "extended")).toBe("mixedCaps");
    expect(name("techno-based", false, "extended")).toBe("lowerCaseHyphen");
    expect(name("É", false, "extended")).toBe("initCap");
    expect(new Set(wordClassNames("extended")).size).toBe(wordClassNames("extended").length);
  });
});
