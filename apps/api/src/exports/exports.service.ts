import { once } from "node:events";
import type { Writable } from "node:stream";
import type { ExportQuery } from "@tagloom/contracts";
import { type Token, formatTaggedSentences, spansToTags } from "@tagloom/tagger";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { getCorpus, listEntityTypes } from "@/corpora/corpora.service";
import { type GoldDocument, streamGoldDocuments } from "@/documents/documents.service";
import { logger } from "@/logger";

export type ExportPlan = { filename: string; contentType: string };

function slug(name: string): string {
  return (
    name
      .normalize("NFKD")
      .replace(/[\u0300-\u036f]/g, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 60) || "corpus"
  );
}

/** One JSONL line in the import shape: `{"title","text","split"?,"spans":[{start,end,type}]}`. */
export function formatJsonlDocument(doc: GoldDocument): string {
  const line: Record<string, unknown> = { title: doc.title, text: doc.text };
  if (doc.split) line.split = doc.split;
  line.spans = doc.spans.map((s) => ({ start: s.start, end: s.end, type: s.type }));
  return `${JSON.stringify(line)}\n`;
}

/**
 * One document as a column file in IOB2: `-DOCSTART-` and a blank line, then `token<TAB>tag` per
 * token with a blank line after each sentence. Tokens are the stored ones; a span that cuts
 * through a token covers the whole token (spansToTags).
 */
export function formatConllDocument(doc: GoldDocument): string {
  const { starts, ends, sentenceStarts } = doc.tokens;
  const tokens: Token[] = starts.map((start, i) => ({ start, end: ends[i]! }));
  const tags = spansToTags(tokens, doc.spans);
  const sentences = sentenceStarts.map((first, s) => {
    const last = sentenceStarts[s + 1] ?? tokens.length;
    return {
      words: tokens.slice(first, last).map((t) => doc.text.slice(t.start, t.end)),
      tags: tags.slice(first, last),
    };
  });
  return `-DOCSTART-\n\n${formatTaggedSentences(sentences)}`;
}

/** The file name and type an export is sent as, after checking the corpus exists. */
export async function planExport(organizationId: string, corpusId: string, query: ExportQuery): Promise<ExportPlan> {
  const corpus = await getCorpus(organizationId, corpusId);
  const base = `${slug(corpus.name)}-${query.split}-gold`;
  return query.format === "jsonl"
    ? { filename: `${base}.jsonl`, contentType: "application/x-ndjson; charset=utf-8" }
    : { filename: `${base}.conll`, contentType: "text/plain; charset=utf-8" };
}

/**
 * Writes the corpus's gold documents to `out` in the chosen format, reading them one by one from
 * a database cursor and waiting whenever `out` is full, so memory stays flat whatever the corpus
 * size. Returns how many documents were written (a document that cannot be written as a column
 * file is skipped and logged).
 */
export async function writeExport(organizationId: string, corpusId: string, query: ExportQuery, out: Writable, actor: Actor): Promise<number> {
  const corpus = await getCorpus(organizationId, corpusId);
  const types = await listEntityTypes(organizationId, corpusId);
  await recordAudit(undefined, actor, organizationId, "corpus.exported", { type: "corpus", id: corpusId, label: corpus.name }, {
    format: query.format,
    split: query.split,
  });
  const format = query.format === "jsonl" ? formatJsonlDocument : formatConllDocument;
  let written = 0;
  for await (const doc of streamGoldDocuments(organizationId, corpusId, query.split, types)) {
    let chunk: string;
    try {
      chunk = format(doc);
    } catch (err) {
      logger.warn({ err, documentId: doc.id }, "document skipped in export");
      continue;
    }
    if (!out.write(chunk)) await once(out, "drain");
    written++;
  }
  return written;
}
