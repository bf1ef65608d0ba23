import type { Corpus, CorpusDetail, CorpusListQuery, CorpusSummary, CreateCorpusInput, EntityType, Page, UpdateCorpusInput } from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";
import { isUuid } from "@/db/types";
import { ConflictError, NotFoundError, ValidationError } from "@/errors";
import {
  countCorpusContents,
  deleteCorpus,
  findCorpus,
  findCorpusByName,
  insertCorpus,
  listCorpora,
  lockCorpus,
  updateCorpus,
} from "./corpora.repository";
import { listEntityTypeRows } from "./entity-types.repository";
import { decodePageCursor, encodePageCursor } from "./page-cursor";

function afterOf(cursor: string | undefined): { createdAt: string; id: string } | undefined {
  const c = decodePageCursor(cursor, "timestamp");
  return c ? { createdAt: String(c.value), id: c.id } : undefined;
}

/** The corpus of the organization; NotFoundError when it is missing or another organization's. */
export async function getCorpus(organizationId: string, corpusId: string, db?: Db): Promise<Corpus> {
  if (!isUuid(corpusId)) throw new NotFoundError("corpus");
  const corpus = await findCorpus(organizationId, corpusId, db);
  if (!corpus) throw new NotFoundError("corpus");
  return corpus;
}

/** Like getCorpus, but an archived corpus answers 409: it must be unarchived before changes. */
export async function getWritableCorpus(organizationId: string, corpusId: string, db?: Db): Promise<Corpus> {
  const corpus = await getCorpus(organizationId, corpusId, db);
  if (corpus.archivedAt) throw new ConflictError(`The corpus "${corpus.name}" is archived. Unarchive it to change it.`, null, "corpus_archived");
  return corpus;
}

/** Like getWritableCorpus, and locks the corpus row so that concurrent changes to it queue up. */
export async function lockWritableCorpus(organizationId: string, corpusId: string, trx: Db): Promise<Corpus> {
  const corpus = await getWritableCorpus(organizationId, corpusId, trx);
  await lockCorpus(organizationId, corpusId, trx);
  return corpus;
}

/** The corpus's entity schema in display order: `{id, name, color, hotkey, guideline, position}`. */
export async function listEntityTypes(organizationId: string, corpusId: string, db?: Db): Promise<EntityType[]> {
  await getCorpus(organizationId, corpusId, db);
  return listEntityTypeRows(organizationId, corpusId, db);
}

export async function getCorporaPage(organizationId: string, query: CorpusListQuery): Promise<Page<CorpusSummary>> {
  const rows = await listCorpora(organizationId, { archived: query.archived, limit: query.limit + 1, after: afterOf(query.cursor) });
  const more = rows.length > query.limit;
  const page = more ? rows.slice(0, query.limit) : rows;
  const last = page[page.length - 1];
  return {
    items: page.map(({ cursorAt: _cursorAt, ...corpus }) => corpus),
    nextCursor: more && last ? encodePageCursor(last.cursorAt, last.id) : null,
  };
}

export async function getCorpusDetail(organizationId: string, corpusId: string): Promise<CorpusDetail> {
  const corpus = await getCorpus(organizationId, corpusId);
  const counts = await countCorpusContents(organizationId, corpusId);
  const documentCount = counts.splits.train + counts.splits.test + counts.splits.none;
  return {
    ...corpus,
    documentCount,
    entityTypeCount: counts.entityTypeCount,
    splits: counts.splits,
    statuses: counts.statuses,
    pendingFiles: counts.pendingFiles,
  };
}

function nameTaken(name: string): ConflictError {
  return new ConflictError(`A corpus named "${name}" already exists in this organization.`, { fields: { name: ["Choose another name."] } }, "name_taken");
}

export async function createCorpus(organizationId: string, input: CreateCorpusInput, actor: Actor): Promise<Corpus> {
  return defaultDb.transaction(async (trx) => {
    if (await findCorpusByName(organizationId, input.name, trx)) throw nameTaken(input.name);
    const corpus = await insertCorpus({ organizationId, name: input.name, description: input.description ?? "", createdBy: actor.userId }, trx);
    await recordAudit(trx, actor, organizationId, "corpus.created", { type: "corpus", id: corpus.id, label: corpus.name });
    return corpus;
  });
}

export async function changeCorpus(organizationId: string, corpusId: string, input: UpdateCorpusInput, actor: Actor): Promise<Corpus> {
  if (!isUuid(corpusId)) throw new NotFoundError("corpus");
  return defaultDb.transaction(async (trx) => {
    const current = await lockCorpus(organizationId, corpusId, trx);
    if (!current) throw new NotFoundError("corpus");
    if (input.name !== undefined && input.name.toLowerCase() !== current.name.toLowerCase()) {
      if (await findCorpusByName(organizationId, input.name, trx)) throw nameTaken(input.name);
    }
    const updated = await updateCorpus(organizationId, corpusId, input, trx);
    if (!updated) throw new NotFoundError("corpus");
    const target = { type: "corpus", id: corpusId, label: updated.name };
    if (input.name !== undefined && input.name !== current.name) {
      await recordAudit(trx, actor, organizationId, "corpus.renamed", target, { from: current.name, to: updated.name });
    }
    if (input.description !== undefined && input.description !== current.description) {
      await recordAudit(trx, actor, organizationId, "corpus.described", target);
    }
    if (input.archived !== undefined && input.archived !== (current.archivedAt !== null)) {
      await recordAudit(trx, actor, organizationId, input.archived ? "corpus.archived" : "corpus.unarchived", target);
    }
    return updated;
  });
}

/**
 * Deletes the corpus for good once the caller has typed its name: its documents, files, spans,
 * batches and taggers go with it through ON DELETE CASCADE.
 */
export async function deleteCorpusForGood(organizationId: string, corpusId: string, confirmName: string, actor: Actor): Promise<void> {
  if (!isUuid(corpusId)) throw new NotFoundError("corpus");
  await defaultDb.transaction(async (trx) => {
    const corpus = await lockCorpus(organizationId, corpusId, trx);
    if (!corpus) throw new NotFoundError("corpus");
    if (confirmName.trim() !== corpus.name) {
      throw new ValidationError("Type the corpus's name exactly to confirm.", { fields: { confirmName: ["Does not match the name."] } });
    }
    const counts = await countCorpusContents(organizationId, corpusId, trx);
    await deleteCorpus(organizationId, corpusId, trx);
    await recordAudit(trx, actor, organizationId, "corpus.deleted", { type: "corpus", id: corpusId, label: corpus.name }, {
      documents: counts.splits.train + counts.splits.test + counts.splits.none,
    });
  });
}
