import type { DocumentTokens } from "@tagloom/contracts";
import { tokenizeText } from "@tagloom/tagger";

/** Tokens of a text as stored: UTF-16 offsets from tokenizeText, sentences by their first token. */
export function tokenizeDocumentText(text: string): DocumentTokens {
  const { tokens, sentences } = tokenizeText(text);
  const starts = new Array<number>(tokens.length);
  const ends = new Array<number>(tokens.length);
  for (let i = 0; i < tokens.length; i++) {
    starts[i] = tokens[i]!.start;
    ends[i] = tokens[i]!.end;
  }
  return { starts, ends, sentenceStarts: sentences.map((s) => s.start) };
}
