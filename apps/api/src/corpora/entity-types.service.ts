import {
  type CreateEntityTypeInput,
  type EntityType,
  type EntityTypeInUse,
  type UpdateEntityTypeInput,
  nextEntityTypeColor,
} from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { db as defaultDb } from "@/db/knex";
import { type Db, isUuid } from "@/db/types";
import { countStoredSpansOfType, removeStoredSpansOfType } from "@/documents/documents.service";
import { ConflictError, NotFoundError } from "@/errors";
import { getCorpus, lockWritableCorpus } from "./corpora.service";
import { deleteEntityTypeRow, findEntityType, insertEntityType, listEntityTypeRows, updateEntityTypeRow } from "./entity-types.repository";
import { entityTypeSpanStores } from "./span-stores";

export { type EntityTypeSpanStore, registerEntityTypeSpanStore } from "./span-stores";

type CreateInput = { name: string; color?: string | undefined; hotkey?: string | null | undefined; guideline?: string | undefined };
type UpdateInput = Partial<Omit<EntityType, "id">>;

function assertUnique(types: EntityType[], candidate: { name?: string | undefined; hotkey?: string | null | undefined }, selfId?: string): void {
  const others = types.filter((t) => t.id !== selfId);
  if (candidate.name !== undefined && others.some((t) => t.name === candidate.name)) {
    throw new ConflictError(`The schema already has a type named ${candidate.name}.`, { fields: { name: ["Choose another name."] } }, "name_taken");
  }
  if (candidate.hotkey) {
    const holder = others.find((t) => t.hotkey === candidate.hotkey);
    if (holder) {
      throw new ConflictError(`The key "${candidate.hotkey}" already belongs to ${holder.name}.`, { fields: { hotkey: ["Choose another key."] } }, "hotkey_taken");
    }
  }
}

// Schema edits lock the corpus so that concurrent ones queue up.
const lockWritable = lockWritableCorpus;

/** Adds a type at the end of the schema; its colour defaults to the next free Okabe–Ito colour. */
export async function createEntityType(organizationId: string, corpusId: string, input: CreateEntityTypeInput & CreateInput, actor: Actor): Promise<EntityType> {
  return defaultDb.transaction(async (trx) => {
    const corpus = await lockWritable(organizationId, corpusId, trx);
    const types = await listEntityTypeRows(organizationId, corpusId, trx);
    assertUnique(types, input);
    const created = await insertEntityType(
      {
        organizationId,
        corpusId,
        name: input.name,
        color: input.color ?? nextEntityTypeColor(types.map((t) => t.color)),
        hotkey: input.hotkey ?? null,
        guideline: input.guideline ?? "",
        position: types.reduce((max, t) => Math.max(max, t.position + 1), 0),
      },
      trx,
    );
    await recordAudit(trx, actor, organizationId, "entity_type.created", { type: "entity_type", id: created.id, label: created.name }, {
      corpusId,
      corpus: corpus.name,
    });
    return created;
  });
}

/** Changes a type; a rename keeps every span, since spans refer to the type by id. */
export async function changeEntityType(
  organizationId: string,
  corpusId: string,
  typeId: string,
  input: UpdateEntityTypeInput & UpdateInput,
  actor: Actor,
): Promise<EntityType> {
  if (!isUuid(typeId)) throw new NotFoundError("entity type");
  return defaultDb.transaction(async (trx) => {
    const corpus = await lockWritable(organizationId, corpusId, trx);
    const types = await listEntityTypeRows(organizationId, corpusId, trx);
    const current = types.find((t) => t.id === typeId);
    if (!current) throw new NotFoundError("entity type");
    assertUnique(types, input, typeId);
    const updated = await updateEntityTypeRow(organizationId, corpusId, typeId, input, trx);
    if (!updated) throw new NotFoundError("entity type");
    const changed = (Object.keys(input) as Array<keyof UpdateInput>).filter((k) => input[k] !== undefined && input[k] !== current[k]);
    if (changed.length) {
      await recordAudit(trx, actor, organizationId, current.name !== updated.name ? "entity_type.renamed" : "entity_type.changed", {
        type: "entity_type",
        id: typeId,
        label: updated.name,
      }, { corpusId, corpus: corpus.name, changed, ...(current.name !== updated.name ? { from: current.name, to: updated.name } : {}) });
    }
    return updated;
  });
}

/** Spans of the type everywhere they are kept: gold, suggestions and registered stores. */
async function countSpans(organizationId: string, typeId: string, db: Db): Promise<EntityTypeInUse> {
  const stored = await countStoredSpansOfType(organizationId, typeId, db);
  const byStore: Record<string, number> = { gold: stored.gold.spans, suggestions: stored.suggestions.spans };
  let documentCount = Math.max(stored.gold.documents, stored.suggestions.documents);
  for (const store of entityTypeSpanStores()) {
    const c = await store.count(organizationId, typeId, db);
    byStore[store.name] = c.spans;
    documentCount = Math.max(documentCount, c.documents);
  }
  const spanCount = Object.values(byStore).reduce((a, b) => a + b, 0);
  return { spanCount, documentCount, byStore };
}

/** How many spans the type has, for the confirmation the web app shows before deleting. */
export async function getEntityTypeUsage(organizationId: string, corpusId: string, typeId: string): Promise<EntityTypeInUse> {
  if (!isUuid(typeId)) throw new NotFoundError("entity type");
  await getCorpus(organizationId, corpusId);
  if (!(await findEntityType(organizationId, corpusId, typeId))) throw new NotFoundError("entity type");
  return countSpans(organizationId, typeId, defaultDb);
}

/**
 * Deletes a type. When it has spans anywhere, the first call answers 409 with the count; with
 * `confirm` the spans are removed from gold, suggestions and every registered store, and the type
 * is deleted, all in one transaction.
 */
export async function deleteEntityType(organizationId: string, corpusId: string, typeId: string, confirm: boolean, actor: Actor): Promise<void> {
  if (!isUuid(typeId)) throw new NotFoundError("entity type");
  await defaultDb.transaction(async (trx) => {
    const corpus = await lockWritable(organizationId, corpusId, trx);
    const type = await findEntityType(organizationId, corpusId, typeId, trx);
    if (!type) throw new NotFoundError("entity type");
    const usage = await countSpans(organizationId, typeId, trx);
    if (usage.spanCount > 0 && !confirm) {
      throw new ConflictError(
        `${type.name} has ${usage.spanCount} span${usage.spanCount === 1 ? "" : "s"} in ${usage.documentCount} document${usage.documentCount === 1 ? "" : "s"}. Deleting it removes them.`,
        usage,
        "entity_type_in_use",
      );
    }
    if (usage.spanCount > 0) {
      await removeStoredSpansOfType(organizationId, typeId, trx);
      for (const store of entityTypeSpanStores()) await store.remove(organizationId, typeId, trx);
    }
    await deleteEntityTypeRow(organizationId, corpusId, typeId, trx);
    await recordAudit(trx, actor, organizationId, "entity_type.deleted", { type: "entity_type", id: typeId, label: type.name }, {
      corpusId,
      corpus: corpus.name,
      spansRemoved: usage.spanCount,
    });
  });
}
