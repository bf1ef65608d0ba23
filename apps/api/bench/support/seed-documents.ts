import type { Knex } from "knex";

// Invented words with a long tail, so that some words are in most documents and many in few.
const common = ["the", "of", "and", "harbour", "ledger", "signed", "board", "cargo", "tide", "clerk"];
function rareWord(k: number): string {
  const syllables = ["ka", "lo", "ri", "mu", "sen", "tai", "vor", "el", "qui", "bra", "nes", "dro"];
  let w = "";
  for (let i = 0; i < 3; i++) {
    w += syllables[k % syllables.length];
    k = Math.floor(k / syllables.length);
  }
  return w;
}

/** An invented document of about `tokens` tokens; word k of the rare vocabulary appears in few. */
export function benchText(n: number, tokens: number): string {
  const out: string[] = [`Record ${n}:`];
  let k = n * 7919 + 17;
  for (let i = 0; i < tokens; i++) {
    k = (k * 1103515245 + 12345) & 0x7fffffff;
    out.push(k % 3 === 0 ? rareWord(k % 1700) : common[k % common.length]!);
    if (i % 20 === 19) out.push(".");
  }
  out.push("Ada Brightwater signed it at Lowmere.");
  return out.join(" ");
}

/**
 * Inserts `count` documents into a corpus through the documents repository (tokens from the
 * real tokenizer), in transactions of 1,000. With `goldTypeId`, every `goldEvery`-th document
 * (default 1: all) is gold with one span ("Ada Brightwater") of that type. Splits cycle train, train, train, test, none.
 */
export async function seedDocuments(
  db: Knex,
  opts: { organizationId: string; corpusId: string; count: number; tokens: number; goldTypeId?: string; goldEvery?: number; userId?: string },
  progress?: (done: number) => void,
): Promise<void> {
  const { insertDocuments } = await import("../../src/documents/documents.repository");
  type NewDocument = Parameters<typeof insertDocuments>[0][number];
  const { tokenizeDocumentText } = await import("../../src/documents/tokenize");
  const splits = ["train", "train", "train", "test", null] as const;
  const every = opts.goldEvery ?? 1;
  for (let from = 0; from < opts.count; from += 1000) {
    const docs: NewDocument[] = [];
    for (let n = from; n < Math.min(opts.count, from + 1000); n++) {
      const text = benchText(n, opts.tokens);
      const at = text.lastIndexOf("Ada Brightwater");
      docs.push({
        organizationId: opts.organizationId,
        corpusId: opts.corpusId,
        uploadFileId: null,
        sourceIndex: n,
        title: `Record ${String(n).padStart(6, "0")} ${rareWord(n % 1700)}`,
        text,
        contentHash: String(n),
        split: splits[n % splits.length]!,
        annotationStatus: opts.goldTypeId && n % every === 0 ? ("gold" as const) : ("none" as const),
        tokens: tokenizeDocumentText(text),
        gold: opts.goldTypeId && n % every === 0 ? { spans: [{ start: at, end: at + 15, typeId: opts.goldTypeId }], userId: opts.userId ?? null } : undefined,
      });
    }
    await db.transaction((trx) => insertDocuments(docs, trx));
    progress?.(Math.min(opts.count, from + 1000));
  }
  await db.raw("ANALYZE documents");
  await db.raw("ANALYZE document_gold");
  await db.raw("ANALYZE document_tokens");
}
