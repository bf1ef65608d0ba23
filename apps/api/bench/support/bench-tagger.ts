import { serializeModel, spansToTags, tokenizeText, trainTagger } from "@tagloom/tagger";
import { benchText } from "./seed-documents";

/**
 * A tagger (default configuration) trained on 300 invented documents of about `tokens` tokens
 * whose one PARTY span is "Ada Brightwater", as the JSON a run stores.
 */
export function benchModelText(tokens = 200): string {
  const docs = Array.from({ length: 300 }, (_, i) => {
    const text = benchText(100_000 + i, tokens);
    const at = text.lastIndexOf("Ada Brightwater");
    const tokenized = tokenizeText(text);
    const tags = spansToTags(tokenized.tokens, [{ start: at, end: at + 15, type: "PARTY" }]);
    return {
      sentences: tokenized.sentences.map((s) => ({
        words: tokenized.tokens.slice(s.start, s.end).map((t) => text.slice(t.start, t.end)),
        tags: tags.slice(s.start, s.end),
      })),
    };
  });
  return JSON.stringify(serializeModel(trainTagger(docs).model));
}
