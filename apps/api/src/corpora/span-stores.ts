import type { Db } from "@/db/types";

/**
 * A place outside documents' gold and suggestions that keeps spans by entity type id (issue 6's
 * assignments, for one). Deleting a type counts its spans in every store first, and once the
 * user confirms, removes them from every store in the same transaction that deletes the type.
 */
export type EntityTypeSpanStore = {
  /** A plain plural name for messages and the 409 details, e.g. "assignments". */
  name: string;
  /** How many spans of the type the store holds in the organization, and in how many documents. */
  count(organizationId: string, typeId: string, db: Db): Promise<{ spans: number; documents: number }>;
  /** Removes every span of the type (inside the caller's transaction). */
  remove(organizationId: string, typeId: string, db: Db): Promise<void>;
};

const stores = new Map<string, EntityTypeSpanStore>();

/** Registers a span store (once per name; registering the same name again replaces it). */
export function registerEntityTypeSpanStore(store: EntityTypeSpanStore): void {
  stores.set(store.name, store);
}

export function entityTypeSpanStores(): readonly EntityTypeSpanStore[] {
  return [...stores.values()];
}
