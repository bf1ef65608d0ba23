// wink-tokenizer ships no types and @types/wink-tokenizer is not installed; this covers the part
// the package uses (wink-tokenizer 5.3.0, src/wink-tokenizer.js).
declare module "wink-tokenizer" {
  type WinkToken = { value: string; tag: string };
  type WinkTokenizer = {
    /** Tokens in text order; `value` is usually, but not always, a verbatim slice of the input. */
    tokenize(sentence: string): WinkToken[];
    defineConfig(config: Record<string, boolean>): number;
    getTokensFP(): string;
  };
  function createTokenizer(): WinkTokenizer;
  export = createTokenizer;
}
