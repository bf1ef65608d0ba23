import { describe, expect, it } from "vitest";
import { wordClassNames, wordClassOf } from "./word-features";

const name = (word: string, first = false, scheme: "bikel" | "extended" | "informal" = "bikel") => wordClassNames(scheme)[wordClassOf(word, first, scheme)];

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

describe("informal word classes (handles, hashtags and URLs as in Ritter et al. 2011 §2.1; emoticons as in Gimpel et al. 2011; lengthening as in Brody & Diakopoulos 2011; from memory)", () => {
  const informal = (word: string, first = false) => name(word, first, "informal");

  it("gives chat and post tokens their own classes", () => {
    expect(informal("https://quorvel.example/a?b=1")).toBe("url");
    expect(informal("www.quorvel.example")).toBe("url");
    expect(informal("nessa@quorvel.example")).toBe("email");
    expect(informal("@nessa_arvell")).toBe("handle");
    expect(informal("#zerithfest")).toBe("hashtag");
    expect(informal("#2026")).toBe("otherNum");
    expect(informal("😀")).toBe("emoticon");
    expect(informal("👍🏽")).toBe("emoticon");
    expect(informal(":-)")).toBe("emoticon");
    expect(informal("<3")).toBe("emoticon");
    expect(informal("sooo")).toBe("elongatedLower");
    expect(informal("Yesss")).toBe("elongatedCap");
    expect(informal("gr8")).toBe("lowerCaseDigit");
    expect(informal("@nessa", true)).toBe("firstWord+handle");
  });

  it("leaves edited-text words in their extended class", () => {
    for (const word of ["Sally", "can", "BBN", "III", "M.", "1990", "A8956-67", "Anglo-Saxon", "McDonald", ",", "#", "@", "bookkeeper"]) {
      expect(informal(word), word).toBe(name(word, false, "extended"));
      expect(informal(word, true), word).toBe(name(word, true, "extended"));
    }
    expect(new Set(wordClassNames("informal")).size).toBe(wordClassNames("informal").length);
  });
});
