import type { EntityType } from "@tagloom/contracts";
import { tokenizeText } from "@tagloom/tagger";
import { createCorpus } from "@/corpora/corpora.service";
import { createEntityType } from "@/corpora/entity-types.service";
import { db } from "@/db/knex";
import { insertDocuments } from "@/documents/documents.repository";

export type AnnotationData = { corpusId: string; types: Record<string, EntityType>; documentIds: string[] };

let counter = 0;

/**
 * A corpus with entity types and documents, made through the corpus services and (for the
 * documents, which uploads would otherwise make) a direct insert with tokens from tokenizeText.
 * Suggestions are given with type names.
 */
export async function createAnnotationData(
  orgId: string,
  actor: { userId: string; email: string },
  spec: {
    corpusName?: string;
    types: Array<{ name: string; hotkey?: string }>;
    documents: Array<{ title: string; text: string; suggestions?: Array<{ start: number; end: number; type: string; confidence: number }> }>;
  },
): Promise<AnnotationData> {
  counter += 1;
  const corpus = await createCorpus(orgId, { name: spec.corpusName ?? `Field notes ${counter}` }, actor);
  const types: Record<string, EntityType> = {};
  for (const t of spec.types) types[t.name] = await createEntityType(orgId, corpus.id, { name: t.name, hotkey: t.hotkey ?? null }, actor);
  const documentIds = await insertDocuments(
    spec.documents.map((d, i) => {
      const { tokens, sentences } = tokenizeText(d.text);
      return {
        organizationId: orgId,
        corpusId: corpus.id,
        uploadFileId: null,
        sourceIndex: i,
        title: d.title,
        text: d.text,
        contentHash: `test-${counter}-${i}`,
        split: null,
        annotationStatus: "none" as const,
        tokens: { starts: tokens.map((t) => t.start), ends: tokens.map((t) => t.end), sentenceStarts: sentences.map((s) => s.start) },
        suggestions: d.suggestions?.map((s) => ({ start: s.start, end: s.end, typeId: types[s.type]!.id, confidence: s.confidence })),
      };
    }),
    db,
  );
  return { corpusId: corpus.id, types, documentIds };
}

/** Character offsets of the first occurrence of `phrase` in `text`. */
export function find(text: string, phrase: string): { start: number; end: number } {
  const start = text.indexOf(phrase);
  if (start < 0) throw new Error(`"${phrase}" is not in the text`);
  return { start, end: start + phrase.length };
}
