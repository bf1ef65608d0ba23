// Public surface of @tagloom/tagger. Anything not exported here is internal.
export * from "./random";
// -- text, encoding, column files and metrics (exports below this line) --
export { splitSentences, tokenizeText, tokenizeWords, type Token, type TokenizedText } from "./tokens";
export { chunksToTags, isIobTag, spansToTags, tagsToChunks, tagsToSpans, toIob2, type CharSpan, type Chunk } from "./bio";
export { ColumnFormatError, formatTaggedSentences, parseColumnText, type ColumnDocument, type TaggedSentence, type TagScheme } from "./conll";
export * from "./metrics";
// -- model, decoding, training, serialization (exports below this line) --
