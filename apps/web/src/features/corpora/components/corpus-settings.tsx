import { zodResolver } from "@hookform/resolvers/zod";
import { type Corpus, type UpdateCorpusInput, countOf, updateCorpusInputSchema } from "@tagloom/contracts";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Dialog } from "@/components/ui/dialog";
import { Field, Input, TextArea } from "@/components/ui/field";
import { useToast } from "@/components/ui/toaster";
import { applyApiErrors } from "@/lib/form-errors";
import { useDeleteCorpus } from "../api/delete-corpus";
import { useUpdateCorpus } from "../api/update-corpus";

/** Rename and describe, archive or unarchive, and delete for good (typing the name). */
export function CorpusSettings({ orgId, corpus, documentCount, onDeleted }: { orgId: string; corpus: Corpus; documentCount: number; onDeleted: () => void }) {
  const update = useUpdateCorpus(orgId, corpus.id);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const [deleteOpen, setDeleteOpen] = useState(false);
  const form = useForm<UpdateCorpusInput>({ resolver: zodResolver(updateCorpusInputSchema), values: { name: corpus.name, description: corpus.description } });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await update.mutateAsync({ name: values.name, description: values.description });
      toast.show("Corpus saved.", "success");
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ["name", "description"]));
    }
  });
  const archived = corpus.archivedAt !== null;
  return (
    <div className="max-w-2xl space-y-6">
      <Card>
        <h2 className="mb-3 font-semibold text-ink-900">Name and description</h2>
        <form onSubmit={onSubmit} noValidate className="space-y-3">
          {formError ? <Notice tone="error">{formError}</Notice> : null}
          <Field label="Name" error={errors.name?.message}>
            {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.name} {...form.register("name")} />}
          </Field>
          <Field label="Description" error={errors.description?.message}>
            {(id, d) => <TextArea id={id} rows={3} aria-describedby={d} {...form.register("description")} />}
          </Field>
          <Button type="submit" busy={update.isPending && !update.variables?.archived}>
            Save
          </Button>
        </form>
      </Card>
      <Card>
        <h2 className="mb-1 font-semibold text-ink-900">{archived ? "Archived" : "Archive"}</h2>
        <p className="mb-3 text-sm text-ink-500">
          {archived
            ? "This corpus is hidden from the list and takes no uploads or schema changes. Its documents stay readable and exportable."
            : "Archiving hides the corpus from the list and stops uploads and schema changes. Nothing is deleted; you can unarchive it at any time."}
        </p>
        <Button
          variant="secondary"
          busy={update.isPending && update.variables?.archived !== undefined}
          onClick={() =>
            update.mutate({ archived: !archived }, { onSuccess: () => toast.show(archived ? "Corpus unarchived." : "Corpus archived.", "success") })
          }
        >
          {archived ? "Unarchive" : "Archive"}
        </Button>
      </Card>
      <Card className="border-rust-500/30">
        <h2 className="mb-1 font-semibold text-rust-500">Delete for good</h2>
        <p className="mb-3 text-sm text-ink-700">
          Deletes the corpus with its {countOf(documentCount, "document")}, their spans, batches, assignments and taggers. This cannot be undone.
        </p>
        <Button variant="danger" onClick={() => setDeleteOpen(true)}>
          Delete corpus…
        </Button>
      </Card>
      <DeleteCorpusDialog orgId={orgId} corpus={corpus} open={deleteOpen} onClose={() => setDeleteOpen(false)} onDeleted={onDeleted} />
    </div>
  );
}

function DeleteCorpusDialog({ orgId, corpus, open, onClose, onDeleted }: { orgId: string; corpus: Corpus; open: boolean; onClose: () => void; onDeleted: () => void }) {
  const remove = useDeleteCorpus(orgId, corpus.id);
  const [typed, setTyped] = useState("");
  const [error, setError] = useState<string | null>(null);
  return (
    <Dialog open={open} title={`Delete ${corpus.name}?`} onClose={onClose}>
      <form
        className="space-y-4"
        onSubmit={async (e) => {
          e.preventDefault();
          setError(null);
          try {
            await remove.mutateAsync(typed);
            onDeleted();
          } catch (err) {
            setError((err as Error).message);
          }
        }}
      >
        <p className="text-sm text-ink-700">Everything in this corpus is deleted for good. Type its name to confirm.</p>
        <Field label={`Type "${corpus.name}"`} error={error ?? undefined}>
          {(id, d) => <Input id={id} aria-describedby={d} value={typed} autoComplete="off" onChange={(e) => setTyped(e.target.value)} />}
        </Field>
        <div className="flex gap-2">
          <Button type="submit" variant="danger" disabled={typed.trim() !== corpus.name} busy={remove.isPending}>
            Delete for good
          </Button>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
