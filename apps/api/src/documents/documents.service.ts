import type { AnnotationStatus, DocumentSplit, Span, SuggestedSpan } from "@tagloom/contracts";
import { listEntityTypes } from "@/corpora/corpora.service";
import { db as defaultDb } from "@/db/knex";
import { type Db, isUuid } from "@/db/types";
import { NotFoundError, ValidationError } from "@/errors";
import {
  type StoredSpan,
  findDocument,
  findDocumentText,
  findDocumentTokens,
  findDocumentsByIds,
  findGoldSpans,
  findSuggestedSpans,
  removeSpansOfType,
  summarizeSpansOfType,
  updateAnnotationStatus,
  upsertGoldSpans,
} from "./documents.repository";
import { findSpanProblems } from "./span-checks";

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
