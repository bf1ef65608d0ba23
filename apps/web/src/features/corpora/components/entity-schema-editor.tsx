import { TypeKey } from "@/components/spans";
import { type EntityType, nextEntityTypeColor } from "@tagloom/contracts";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, EmptyState, Notice, Skeleton } from "@/components/ui/card";
import { Dialog } from "@/components/ui/dialog";
import { useToast } from "@/components/ui/toaster";
import { formatCount } from "@/lib/format";
import { useCreateEntityType } from "../api/create-entity-type";
import { useDeleteEntityType } from "../api/delete-entity-type";
import { useEntityTypeUsage } from "../api/get-entity-type-usage";
import { useEntityTypes } from "../api/get-entity-types";
import { useUpdateEntityType } from "../api/update-entity-type";
import { EntityTypeForm } from "./entity-type-form";
import { GuidelineText } from "@/components/markdown/guideline-text";

/** A type's name on its colour, as spans show it. */
export function TypeChip({ type }: { type: Pick<EntityType, "name" | "color"> }) {
  return <TypeKey type={type} />;
}

/**
 * The corpus's entity schema: every type with its colour, key and guideline. Managers add,
 * edit, reorder and delete types; deleting one that has spans says how many first.
 */
export function EntitySchemaEditor({ orgId, corpusId, canManage }: { orgId: string; corpusId: string; canManage: boolean }) {
  const types = useEntityTypes(orgId, corpusId);
  const create = useCreateEntityType(orgId, corpusId);
  const update = useUpdateEntityType(orgId, corpusId);
  const toast = useToast();
  const [editing, setEditing] = useState<EntityType | null>(null);
  const [deleting, setDeleting] = useState<EntityType | null>(null);

  if (types.isPending) return <Skeleton />;
  if (types.isError) return <Notice tone="error">{types.error.message}</Notice>;
  const list = types.data;

  // Moving a type gives every type its place in the new order as its position; only types whose
  // position changes are saved (usually the two that swap).
  const move = async (index: number, by: -1 | 1) => {
    const order = [...list];
    const [self] = order.splice(index, 1);
    if (!self) return;
    order.splice(index + by, 0, self);
    for (const [position, t] of order.entries()) {
      if (t.position !== position) await update.mutateAsync({ typeId: t.id, input: { position } });
    }
  };

  return (
    <div className="space-y-6">
      {list.length === 0 ? (
        <EmptyState title="No entity types yet">{canManage ? "Add the first type below, e.g. PARTY for people and companies." : "A manager defines the types to mark."}</EmptyState>
      ) : (
        <ul className="divide-y divide-ink-50 rounded-lg border border-ink-100 bg-white" aria-label="Entity types">
          {list.map((t, i) => (
            <li key={t.id} className="grid gap-3 p-4 sm:grid-cols-[12rem_1fr_auto]">
              <div className="flex items-start gap-3">
                <TypeChip type={t} />
                {t.hotkey ? (
                  <kbd className="rounded border border-ink-200 bg-ink-50 px-1.5 font-mono text-xs text-ink-700" title="Key">
                    {t.hotkey}
                  </kbd>
                ) : null}
              </div>
              <GuidelineText source={t.guideline} />
              {canManage ? (
                <div className="flex items-start gap-1">
                  <Button size="sm" variant="ghost" aria-label={`Move ${t.name} up`} disabled={i === 0 || update.isPending} onClick={() => void move(i, -1)}>
                    ↑
                  </Button>
                  <Button size="sm" variant="ghost" aria-label={`Move ${t.name} down`} disabled={i === list.length - 1 || update.isPending} onClick={() => void move(i, 1)}>
                    ↓
                  </Button>
                  <Button size="sm" variant="secondary" onClick={() => setEditing(t)}>
                    Edit
                  </Button>
                  <Button size="sm" variant="ghost" className="text-rust-500" onClick={() => setDeleting(t)}>
                    Delete
                  </Button>
                </div>
              ) : null}
            </li>
          ))}
        </ul>
      )}

      {canManage ? (
        <Card>
          <h2 className="mb-3 font-semibold text-ink-900">Add an entity type</h2>
          <EntityTypeForm
            // A fresh form in the same render as the list that shows the new type, so nothing typed
            // after the type appears is wiped by a later reset.
            key={`new-${list.length}`}
            initial={{ color: nextEntityTypeColor(list.map((t) => t.color)) }}
            submitLabel="Add type"
            busy={create.isPending}
            onSubmit={async (values) => {
              const created = await create.mutateAsync(values);
              toast.show(`${created.name} added.`, "success");
            }}
          />
        </Card>
      ) : null}

      <Dialog open={editing !== null} title={`Edit ${editing?.name ?? ""}`} onClose={() => setEditing(null)}>
        {editing ? (
          <>
            <p className="mb-3 text-sm text-ink-500">Renaming keeps every span of this type.</p>
            <EntityTypeForm
              initial={editing}
              submitLabel="Save"
              busy={update.isPending}
              onCancel={() => setEditing(null)}
              onSubmit={async (values) => {
                await update.mutateAsync({ typeId: editing.id, input: values });
                toast.show("Type saved.", "success");
                setEditing(null);
              }}
            />
          </>
        ) : null}
      </Dialog>

      <DeleteTypeDialog orgId={orgId} corpusId={corpusId} type={deleting} onClose={() => setDeleting(null)} />
    </div>
  );
}

function DeleteTypeDialog({ orgId, corpusId, type, onClose }: { orgId: string; corpusId: string; type: EntityType | null; onClose: () => void }) {
  const usage = useEntityTypeUsage(orgId, corpusId, type?.id ?? null);
  const remove = useDeleteEntityType(orgId, corpusId);
  const toast = useToast();
  const [error, setError] = useState<string | null>(null);
  const spans = usage.data?.spanCount ?? 0;
  return (
    <Dialog
      open={type !== null}
      title={`Delete ${type?.name ?? ""}?`}
      onClose={() => {
        setError(null);
        onClose();
      }}
    >
      {usage.isPending ? (
        <Skeleton label="Counting its spans" />
      ) : usage.isError ? (
        <Notice tone="error">{usage.error.message}</Notice>
      ) : (
        <div className="space-y-4 text-sm">
          {spans > 0 ? (
            <Notice tone="warn">
              {type?.name} has <strong>{formatCount(spans)}</strong> span{spans === 1 ? "" : "s"} in {formatCount(usage.data.documentCount)} document
              {usage.data.documentCount === 1 ? "" : "s"} (gold, suggestions and assignments). Deleting the type removes them for good.
            </Notice>
          ) : (
            <p className="text-ink-700">No span uses this type. It is removed from the schema.</p>
          )}
          {error ? <Notice tone="error">{error}</Notice> : null}
          <div className="flex gap-2">
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={async () => {
                if (!type) return;
                try {
                  await remove.mutateAsync({ typeId: type.id, confirm: spans > 0 });
                  toast.show(`${type.name} deleted.`, "success");
                  onClose();
                } catch (err) {
                  setError((err as Error).message);
                }
              }}
            >
              {spans > 0 ? `Delete ${type?.name} and ${formatCount(spans)} span${spans === 1 ? "" : "s"}` : `Delete ${type?.name}`}
            </Button>
            <Button variant="secondary" onClick={onClose}>
              Keep it
            </Button>
          </div>
        </div>
      )}
    </Dialog>
  );
}
