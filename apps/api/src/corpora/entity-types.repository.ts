import type { EntityType } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

type Raw = { id: string; name: string; color: string; hotkey: string | null; guideline: string; position: number };
const columns = ["id", "name", "color", "hotkey", "guideline", "position"];
const toEntityType = (r: Raw): EntityType => ({
  id: r.id,
  name: r.name,
  color: r.color,
  hotkey: r.hotkey,
  guideline: r.guideline,
  position: r.position,
});

/** The corpus's types in schema order (position, then creation). */
export async function listEntityTypeRows(organizationId: string, corpusId: string, db: Db = defaultDb): Promise<EntityType[]> {
  const rows = await db("entity_types")
    .where({ organization_id: organizationId, corpus_id: corpusId })
    .orderBy([{ column: "position" }, { column: "created_at" }, { column: "id" }])
    .select(columns);
  return rows.map(toEntityType);
}

export async function findEntityType(organizationId: string, corpusId: string, typeId: string, db: Db = defaultDb): Promise<EntityType | null> {
  const r = await db("entity_types").where({ organization_id: organizationId, corpus_id: corpusId, id: typeId }).first(columns);
  return r ? toEntityType(r) : null;
}

export async function insertEntityType(
  row: { organizationId: string; corpusId: string; name: string; color: string; hotkey: string | null; guideline: string; position: number },
  db: Db = defaultDb,
): Promise<EntityType> {
  const [r] = await db("entity_types")
    .insert({
      organization_id: row.organizationId,
      corpus_id: row.corpusId,
      name: row.name,
      color: row.color,
      hotkey: row.hotkey,
      guideline: row.guideline,
      position: row.position,
    })
    .returning(columns);
  return toEntityType(r);
}

export async function updateEntityTypeRow(
  organizationId: string,
  corpusId: string,
  typeId: string,
  patch: Partial<Omit<EntityType, "id">>,
  db: Db = defaultDb,
): Promise<EntityType | null> {
  const changes: Record<string, unknown> = {};
  for (const key of ["name", "color", "hotkey", "guideline", "position"] as const) {
    if (patch[key] !== undefined) changes[key] = patch[key];
  }
  const [r] = await db("entity_types").where({ organization_id: organizationId, corpus_id: corpusId, id: typeId }).update(changes).returning(columns);
  return r ? toEntityType(r) : null;
}

export async function deleteEntityTypeRow(organizationId: string, corpusId: string, typeId: string, db: Db = defaultDb): Promise<boolean> {
  return (await db("entity_types").where({ organization_id: organizationId, corpus_id: corpusId, id: typeId }).delete()) > 0;
}
