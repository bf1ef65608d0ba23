import { createHash } from "node:crypto";
import type {
  AnnotationStatus,
  DocumentDetail,
  DocumentListItem,
  DocumentListQuery,
  DocumentSplit,
  DocumentTokens,
  EntityType,
  Page,
  SetSplitInput,
  SetSplitResult,
  Span,
  SpanMode,
  SuggestedSpan,
} from "@tagloom/contracts";
import { createRng } from "@tagloom/tagger";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { getCorpus, listEntityTypes, lockWritableCorpus } from "@/corpora/corpora.service";
import { decodePageCursor, encodePageCursor } from "@/corpora/page-cursor";
import { db as defaultDb } from "@/db/knex";
import { type Db, isUuid } from "@/db/types";
import { NotFoundError, ValidationError } from "@/errors";
import {
  type DocumentRow,
  type StoredSpan,
  deleteDocumentRow,
  findDocument,
  findDocumentText,
  findDocumentTokens,
  findDocumentsByIds,
  findGoldSpans,
  findSuggestedSpans,
  insertDocuments,
  listDocumentIds,
  listDocuments,
  removeSpansOfType,
  streamGoldDocumentRows,
  summarizeSpansOfType,
  toGoldDocumentRow,
  updateAnnotationStatus,
  assignSplits,
  updateSplit,
  upsertGoldSpans,
} from "./documents.repository";
import { findSpanProblems } from "./span-checks";

export { tokenizeDocumentText } from "./tokenize";

export type DocumentForAnnotation = {
  id: string;
  corpusId: string;
  title: string;
  text: string;
  split: DocumentSplit | null;
  tokens: { starts: number[]; ends: number[]; sentenceStarts: number[] };
};

export type DocumentSummary = {
  id: string;
  corpusId: string;
  title: string;
  tokenCount: number;
  split: DocumentSplit | null;
  annotationStatus: AnnotationStatus;
};

async function requireDocument(organizationId: string, documentId: string, db?: Db) {
  if (!isUuid(documentId)) throw new NotFoundError("document");
  const doc = await findDocument(organizationId, documentId, db);
  if (!doc) throw new NotFoundError("document");
  return doc;
}

/** The document's text and tokens (offsets as stored at import; never re-tokenized). */
export async function getDocumentForAnnotation(organizationId: string, documentId: string, db?: Db): Promise<DocumentForAnnotation> {
  const doc = await requireDocument(organizationId, documentId, db);
  const [text, tokens] = await Promise.all([findDocumentText(organizationId, documentId, db), findDocumentTokens(organizationId, documentId, db)]);
  return {
    id: doc.id,
    corpusId: doc.corpusId,
    title: doc.title,
    text: text ?? "",
    split: doc.split,
    tokens: tokens ?? { starts: [], ends: [], sentenceStarts: [] },
  };
}

/** Summaries of the organization's documents among the ids (unknown ids are left out), in the ids' order. */
export async function getDocumentSummaries(organizationId: string, documentIds: string[], db?: Db): Promise<DocumentSummary[]> {
  const ids = [...new Set(documentIds.filter(isUuid))];
  const rows = await findDocumentsByIds(organizationId, ids, db);
  const byId = new Map(rows.map((r) => [r.id, r]));
  return ids.flatMap((id) => {
    const r = byId.get(id);
    return r ? [{ id: r.id, corpusId: r.corpusId, title: r.title, tokenCount: r.tokenCount, split: r.split, annotationStatus: r.annotationStatus }] : [];
  });
}

/** Sets the annotation status of the organization's documents among the ids. */
export async function setAnnotationStatus(organizationId: string, documentIds: string[], status: AnnotationStatus, db?: Db): Promise<void> {
  await updateAnnotationStatus(organizationId, documentIds.filter(isUuid), status, db);
}

/** Maps stored spans (type ids) to contract spans (type names), dropping spans of unknown types. */
function namedSpans(stored: StoredSpan[], names: Map<string, string>): Span[] {
  return stored.flatMap((s) => {
    const type = names.get(s.typeId);
    return type ? [{ start: s.start, end: s.end, type }] : [];
  });
}

async function typeNames(organizationId: string, corpusId: string, db?: Db): Promise<Map<string, string>> {
  return new Map((await listEntityTypes(organizationId, corpusId, db)).map((t) => [t.id, t.name]));
}

/** The document's gold spans sorted by offset (empty when it has none). */
export async function getGoldSpans(organizationId: string, documentId: string, db?: Db): Promise<Span[]> {
  const doc = await requireDocument(organizationId, documentId, db);
  const stored = (await findGoldSpans(organizationId, documentId, db)) ?? [];
  return namedSpans(stored, await typeNames(organizationId, doc.corpusId, db));
}

/** The document's suggested spans with their confidence (1 when an import gave none). */
export async function getSuggestions(organizationId: string, documentId: string, db?: Db): Promise<SuggestedSpan[]> {
  const doc = await requireDocument(organizationId, documentId, db);
  const stored = (await findSuggestedSpans(organizationId, documentId, db)) ?? [];
  const names = await typeNames(organizationId, doc.corpusId, db);
  return stored.flatMap((s) => {
    const type = names.get(s.typeId);
    return type ? [{ start: s.start, end: s.end, type, confidence: s.confidence ?? 1 }] : [];
  });
}

/**
 * Replaces the document's gold spans and marks it `gold`. Spans must lie inside the text, end
 * after they start, name a type of the corpus and not overlap (ValidationError listing every
 * problem otherwise; nothing is saved).
 */
export async function saveGoldSpans(
  organizationId: string,
  documentId: string,
  spans: Span[],
  source: "import" | "review",
  userId: string | null,
  db?: Db,
): Promise<void> {
  const run = async (trx: Db) => {
    const doc = await requireDocument(organizationId, documentId, trx);
    const types = await listEntityTypes(organizationId, doc.corpusId, trx);
    const idByName = new Map(types.map((t) => [t.name, t.id]));
    const problems = findSpanProblems(doc.charCount, spans, new Set(idByName.keys()));
    if (problems.length) throw new ValidationError("Some spans are not valid.", { spans: problems });
    const stored = [...spans]
      .sort((a, b) => a.start - b.start)
      .map((s) => ({ start: s.start, end: s.end, typeId: idByName.get(s.type)! }));
    await upsertGoldSpans(organizationId, documentId, stored, source, userId, trx);
    await updateAnnotationStatus(organizationId, [documentId], "gold", trx);
  };
  if (db) await run(db);
  else await defaultDb.transaction(run);
}

/** Spans of an entity type in gold and suggestions: how many, and in how many documents. */
export async function countStoredSpansOfType(
  organizationId: string,
  typeId: string,
  db?: Db,
): Promise<{ gold: { spans: number; documents: number }; suggestions: { spans: number; documents: number } }> {
  const [gold, suggestions] = await Promise.all([
    summarizeSpansOfType("document_gold", organizationId, typeId, db),
    summarizeSpansOfType("document_suggestions", organizationId, typeId, db),
  ]);
  return { gold, suggestions };
}

/** Removes an entity type's spans from gold and suggestions; returns how many were removed. */
export async function removeStoredSpansOfType(organizationId: string, typeId: string, db: Db): Promise<number> {
  const gold = await removeSpansOfType("document_gold", organizationId, typeId, db);
  const suggestions = await removeSpansOfType("document_suggestions", organizationId, typeId, db);
  return gold + suggestions;
}

const toListItem = (r: DocumentRow): DocumentListItem => ({
  id: r.id,
  corpusId: r.corpusId,
  title: r.title,
  split: r.split,
  annotationStatus: r.annotationStatus,
  charCount: r.charCount,
  tokenCount: r.tokenCount,
  sentenceCount: r.sentenceCount,
  filename: r.filename,
  createdAt: r.createdAt,
});

/** A page of the Documents table: filtered, sorted, searched, by keyset cursor. */
export async function getDocumentsPage(organizationId: string, corpusId: string, query: DocumentListQuery): Promise<Page<DocumentListItem>> {
  await getCorpus(organizationId, corpusId);
  const kind = query.sort === "created" ? "timestamp" : query.sort === "tokens" ? "integer" : "text";
  const rows = await listDocuments(
    organizationId,
    corpusId,
    { sort: query.sort, dir: query.dir, split: query.split, status: query.status, q: query.q || undefined },
    { limit: query.limit + 1, after: decodePageCursor(query.cursor, kind) },
  );
  const more = rows.length > query.limit;
  const page = more ? rows.slice(0, query.limit) : rows;
  const last = page[page.length - 1];
  return { items: page.map(toListItem), nextCursor: more && last ? encodePageCursor(last.cursorValue, last.id) : null };
}

async function requireDocumentInCorpus(organizationId: string, corpusId: string, documentId: string): Promise<DocumentRow> {
  await getCorpus(organizationId, corpusId);
  const doc = await requireDocument(organizationId, documentId);
  if (doc.corpusId !== corpusId) throw new NotFoundError("document");
  return doc;
}

/** The document page: text, tokens, gold spans and suggestions. */
export async function getDocumentDetail(organizationId: string, corpusId: string, documentId: string): Promise<DocumentDetail> {
  const doc = await requireDocumentInCorpus(organizationId, corpusId, documentId);
  const [full, gold, suggestions] = await Promise.all([
    getDocumentForAnnotation(organizationId, documentId),
    getGoldSpans(organizationId, documentId),
    getSuggestions(organizationId, documentId),
  ]);
  return { ...toListItem(doc), text: full.text, tokens: full.tokens, gold, suggestions };
}

/** Deletes a document for good, with its tokens and spans (audit-logged). */
export async function deleteDocumentForGood(organizationId: string, corpusId: string, documentId: string, actor: Actor): Promise<void> {
  await defaultDb.transaction(async (trx) => {
    const corpus = await getCorpus(organizationId, corpusId, trx);
    if (!isUuid(documentId)) throw new NotFoundError("document");
    const doc = await findDocument(organizationId, documentId, trx);
    if (!doc || doc.corpusId !== corpusId) throw new NotFoundError("document");
    await deleteDocumentRow(organizationId, documentId, trx);
    await recordAudit(trx, actor, organizationId, "document.deleted", { type: "document", id: documentId, label: doc.title }, {
      corpusId,
      corpus: corpus.name,
      filename: doc.filename,
    });
  });
}

/** Shuffles ids with a seeded Fisher–Yates shuffle (Knuth, TAOCP vol. 2, 3rd ed., section 3.4.2, Algorithm P). */
function shuffled(ids: string[], seed: number): string[] {
  const out = [...ids];
  const rng = createRng(seed);
  for (let i = out.length - 1; i > 0; i--) {
    const j = rng.nextInt(i + 1);
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}

/**
 * Sets the split of chosen documents, or splits the corpus at random: with a seed, documents (in
 * id order) are shuffled and the first round(n × testPercent / 100) go to test, the rest to train,
 * so the same seed over the same documents always gives the same split.
 */
export async function setDocumentSplit(organizationId: string, corpusId: string, input: SetSplitInput, actor: Actor): Promise<SetSplitResult> {
  return defaultDb.transaction(async (trx) => {
    // Two splits of one corpus at once would overwrite each other row by row: the second waits.
    const corpus = await lockWritableCorpus(organizationId, corpusId, trx);
    const target = { type: "corpus", id: corpusId, label: corpus.name };
    if ("documentIds" in input) {
      const ids = [...new Set(input.documentIds)];
      const changed = await updateSplit(organizationId, corpusId, ids, input.split, trx);
      if (changed !== ids.length) {
        throw new NotFoundError(`document (${ids.length - changed} of the chosen documents are not in this corpus)`);
      }
      await recordAudit(trx, actor, organizationId, "documents.split_set", target, { split: input.split, documents: changed });
      return { train: input.split === "train" ? changed : 0, test: input.split === "test" ? changed : 0, cleared: input.split === null ? changed : 0 };
    }
    const scope = input.scope ?? "all";
    const ids = shuffled(await listDocumentIds(organizationId, corpusId, scope === "unassigned", trx), input.seed);
    const testCount = Math.round((ids.length * input.testPercent) / 100);
    const test = ids.slice(0, testCount);
    const train = ids.slice(testCount);
    await assignSplits(organizationId, corpusId, test, train, trx);
    await recordAudit(trx, actor, organizationId, "documents.split_random", target, {
      testPercent: input.testPercent,
      seed: input.seed,
      scope,
      train: train.length,
      test: test.length,
    });
    return { train: train.length, test: test.length, cleared: 0 };
  });
}

/** A document read from an uploaded file, tokenized, with spans by type name (already checked). */
export type DocumentToImport = {
  uploadFileId: string;
  sourceIndex: number;
  title: string;
  text: string;
  split: DocumentSplit | null;
  tokens: DocumentTokens;
  spans?: Array<{ start: number; end: number; type: string; confidence?: number | undefined }> | undefined;
};

/**
 * Stores imported documents inside the caller's transaction. Spans become gold (the document is
 * then `gold`) or suggestions, as the uploader chose. A document already stored for the same file
 * and index is skipped, so a retried import adds nothing twice. Returns how many were added.
 */
export async function importDocuments(
  organizationId: string,
  corpusId: string,
  docs: DocumentToImport[],
  options: { spanMode: SpanMode; userId: string | null; types: EntityType[] },
  db: Db,
): Promise<number> {
  const idByName = new Map(options.types.map((t) => [t.name, t.id]));
  const stored = (spans: NonNullable<DocumentToImport["spans"]>, withConfidence: boolean): StoredSpan[] =>
    [...spans]
      .sort((a, b) => a.start - b.start)
      .map((s) => {
        const span: StoredSpan = { start: s.start, end: s.end, typeId: idByName.get(s.type)! };
        if (withConfidence) span.confidence = s.confidence ?? 1;
        return span;
      });
  const inserted = await insertDocuments(
    docs.map((d) => ({
      organizationId,
      corpusId,
      uploadFileId: d.uploadFileId,
      sourceIndex: d.sourceIndex,
      title: d.title,
      text: d.text,
      contentHash: createHash("sha256").update(d.text).digest("hex"),
      split: d.split,
      annotationStatus: d.spans && options.spanMode === "gold" ? "gold" : "none",
      tokens: d.tokens,
      gold: d.spans && options.spanMode === "gold" ? { spans: stored(d.spans, false), userId: options.userId } : undefined,
      suggestions: d.spans && options.spanMode === "suggested" ? stored(d.spans, true) : undefined,
    })),
    db,
  );
  return inserted.length;
}

/** A gold document as exports read it: text, stored tokens and spans by type name. */
export type GoldDocument = {
  id: string;
  title: string;
  text: string;
  split: DocumentSplit | null;
  tokens: DocumentTokens;
  spans: Span[];
};

/**
 * The corpus's gold documents (one split or all) in creation order, read from a database cursor
 * one batch at a time: memory stays flat however many there are. `types` is the corpus's schema.
 */
export async function* streamGoldDocuments(
  organizationId: string,
  corpusId: string,
  split: DocumentSplit | "all",
  types: EntityType[],
): AsyncGenerator<GoldDocument> {
  const names = new Map(types.map((t) => [t.id, t.name]));
  for await (const raw of streamGoldDocumentRows(organizationId, corpusId, split)) {
    const r = toGoldDocumentRow(raw);
    yield {
      id: r.id,
      title: r.title,
      text: r.text,
      split: r.split,
      tokens: { starts: r.starts, ends: r.ends, sentenceStarts: r.sentenceStarts },
      spans: namedSpans(r.spans, names),
    };
  }
}
