import type { TaggedSpan } from "@tagloom/contracts";
import { type TaggerModel, documentUncertainty, tagSentence, tokenizeText } from "@tagloom/tagger";

/** A text as the documents pipeline tokenizes it: tokens (UTF-16 offsets) grouped into sentences. */
export type TextTokens = { starts: readonly number[]; ends: readonly number[]; sentenceStarts: readonly number[] };

export function tokensOfText(text: string): TextTokens {
  const { tokens, sentences } = tokenizeText(text);
  return { starts: tokens.map((t) => t.start), ends: tokens.map((t) => t.end), sentenceStarts: sentences.map((s) => s.start) };
}

/** The words of each sentence, cut from the text at the token offsets. */
export function sentenceWords(text: string, tokens: TextTokens): string[][] {
  const out: string[][] = [];
  const n = tokens.starts.length;
  for (let s = 0; s < tokens.sentenceStarts.length; s++) {
    const from = tokens.sentenceStarts[s]!;
    const to = s + 1 < tokens.sentenceStarts.length ? tokens.sentenceStarts[s + 1]! : n;
    const words: string[] = [];
    for (let i = from; i < to; i++) words.push(text.slice(tokens.starts[i], tokens.ends[i]));
    out.push(words);
  }
  return out;
}

/**
 * Tags a tokenized text: each sentence is decoded with Viterbi (its index in the text is the
 * sentence position position-aware models use), and each entity chunk becomes a span from its
 * first token's start to its last token's end, with the chunk's marginal probability.
 */
export function tagTokens(model: TaggerModel, text: string, tokens: TextTokens): TaggedSpan[] {
  const sentences = sentenceWords(text, tokens);
  const spans: TaggedSpan[] = [];
  sentences.forEach((words, s) => {
    if (words.length === 0) return;
    const first = tokens.sentenceStarts[s]!;
    for (const chunk of tagSentence(model, words, { sentenceIndex: s }).chunks) {
      const start = tokens.starts[first + chunk.start]!;
      const end = tokens.ends[first + chunk.end - 1]!;
      spans.push({ start, end, type: chunk.type, text: text.slice(start, end), confidence: chunk.confidence });
    }
  });
  return spans;
}

export function tagText(model: TaggerModel, text: string): TaggedSpan[] {
  return tagTokens(model, text, tokensOfText(text));
}

/** Spans and the document's uncertainty in one pass over its sentences. */
export function tagAndScore(model: TaggerModel, text: string, tokens: TextTokens) {
  return { spans: tagTokens(model, text, tokens), uncertainty: documentUncertainty(model, sentenceWords(text, tokens)) };
}
