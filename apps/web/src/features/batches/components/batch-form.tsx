import { zodResolver } from "@hookform/resolvers/zod";
import { type BatchSummary, type CorpusSummary, type CreateBatchParsed, type Member, createBatchInputSchema, roleLabels } from "@tagloom/contracts";
import { useCallback, useMemo, useState } from "react";
import { type Resolver, useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/field";
import { applyApiErrors } from "@/lib/form-errors";
import { useCreateBatch } from "../api/create-batch";
import { DocumentPicker } from "./document-picker";

/** The form's values: the API's shape, with both assignment modes' fields kept while switching. */
type FormValues = {
  name: string;
  dueDate: string | null;
  documentIds: string[];
  assignment: {
    mode: "round_robin" | "by_hand";
    annotatorIds: string[];
    annotatorsPerDocument: number;
    documents: Array<{ documentId: string; annotatorIds: string[] }>;
  };
};

const SERVER_FIELDS = ["name", "dueDate", "documentIds", "assignment.annotatorIds", "assignment.annotatorsPerDocument", "assignment.documents"] as const;

type Props = {
  orgId: string;
  corpora: CorpusSummary[];
  members: Member[];
  initialCorpusId: string | null;
  initialDocumentIds: string[];
  onCreated: (batch: BatchSummary) => void;
};

/**
 * A new batch: the corpus, the documents (from the Documents table's selection or picked here),
 * a name, a due date, and who annotates each document: k annotators in turn from a list, or
 * chosen by hand per document. Each assignee gets one e-mail for the whole batch.
 */
export function BatchForm({ orgId, corpora, members, initialCorpusId, initialDocumentIds, onCreated }: Props) {
  const usable = corpora.filter((c) => !c.archivedAt);
  const [corpusId, setCorpusId] = useState<string | null>(initialCorpusId ?? usable[0]?.id ?? null);
  const [titles, setTitles] = useState<Map<string, string>>(new Map());
  const [formError, setFormError] = useState<string | null>(null);
  const rememberTitles = useCallback((found: Map<string, string>) => setTitles((old) => new Map([...old, ...found])), []);
  const create = useCreateBatch(orgId);
  const form = useForm<FormValues, unknown, CreateBatchParsed>({
    resolver: zodResolver(createBatchInputSchema) as unknown as Resolver<FormValues, unknown, CreateBatchParsed>,
    defaultValues: {
      name: "",
      dueDate: null,
      documentIds: initialDocumentIds,
      assignment: { mode: "round_robin", annotatorIds: [], annotatorsPerDocument: 1, documents: [] },
    },
  });
  const { errors, isSubmitted } = form.formState;
  const documentIds = form.watch("documentIds");
  const mode = form.watch("assignment.mode");
  const annotatorIds = form.watch("assignment.annotatorIds");
  const byHand = form.watch("assignment.documents");
  const k = form.watch("assignment.annotatorsPerDocument");
  const set = (key: "documentIds" | "assignment.annotatorIds" | "assignment.documents", value: unknown) =>
    form.setValue(key, value as never, { shouldValidate: isSubmitted, shouldDirty: true });

  const byHandFor = useMemo(() => new Map(byHand.map((d) => [d.documentId, d.annotatorIds])), [byHand]);
  const setDocuments = (ids: string[]) => {
    set("documentIds", ids);
    set(
      "assignment.documents",
      ids.map((id) => ({ documentId: id, annotatorIds: byHandFor.get(id) ?? [] })),
    );
  };
  const toggleHand = (documentId: string, userId: string) => {
    const next = documentIds.map((id) => {
      const current = byHandFor.get(id) ?? [];
      if (id !== documentId) return { documentId: id, annotatorIds: current };
      return { documentId: id, annotatorIds: current.includes(userId) ? current.filter((u) => u !== userId) : [...current, userId] };
    });
    set("assignment.documents", next);
  };

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    if (!corpusId) return setFormError("Pick a corpus first.");
    try {
      onCreated(await create.mutateAsync({ corpusId, input: values }));
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError as never, SERVER_FIELDS));
    }
  });

  const perAnnotator = mode === "round_robin" && annotatorIds.length ? Math.ceil((documentIds.length * Math.min(k || 1, annotatorIds.length)) / annotatorIds.length) : 0;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Card className="space-y-4">
        <h2 className="font-semibold text-ink-900">1. Name, corpus and due date</h2>
        <div className="grid gap-4 sm:grid-cols-3">
          <Field label="Batch name" error={errors.name?.message}>
            {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.name} placeholder="e.g. Harbour reports, week 12" {...form.register("name")} />}
          </Field>
          <Field label="Corpus">
            {(id) => (
              <Select
                id={id}
                value={corpusId ?? ""}
                onChange={(e) => {
                  setCorpusId(e.target.value || null);
                  setDocuments([]);
                }}
              >
                {usable.length ? null : <option value="">No corpus yet</option>}
                {usable.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.name}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          <Field label="Due date" hint="Optional." error={errors.dueDate?.message}>
            {(id, d) => (
              <Input id={id} type="date" aria-describedby={d} aria-invalid={!!errors.dueDate} {...form.register("dueDate", { setValueAs: (v: string | null) => (v ? v : null) })} />
            )}
          </Field>
        </div>
      </Card>

      <Card className="space-y-3">
        <h2 className="font-semibold text-ink-900">2. Documents</h2>
        {errors.documentIds?.message ? <p role="alert" className="text-sm font-medium text-rust-500">{errors.documentIds.message}</p> : null}
        {corpusId ? (
          <DocumentPicker
            orgId={orgId}
            corpusId={corpusId}
            selected={documentIds}
            onChange={setDocuments}
            onTitles={rememberTitles}
          />
        ) : (
          <p className="text-sm text-ink-500">Create a corpus and upload documents first.</p>
        )}
      </Card>

      <Card className="space-y-4">
        <h2 className="font-semibold text-ink-900">3. Annotators</h2>
        <fieldset className="flex flex-wrap gap-4 text-sm">
          <legend className="sr-only">How to assign</legend>
          <label className="flex items-center gap-2">
            <input type="radio" value="round_robin" {...form.register("assignment.mode")} /> In turn from a list (round robin)
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" value="by_hand" {...form.register("assignment.mode")} /> By hand, per document
          </label>
        </fieldset>
        {mode === "round_robin" ? (
          <div className="space-y-3">
            <fieldset>
              <legend className="text-sm font-medium text-ink-800">Annotators</legend>
              {errors.assignment && "annotatorIds" in errors.assignment && errors.assignment.annotatorIds?.message ? (
                <p role="alert" className="text-xs font-medium text-rust-500">{errors.assignment.annotatorIds.message}</p>
              ) : null}
              <div className="mt-2 grid gap-1 sm:grid-cols-2 lg:grid-cols-3">
                {members.map((m) => (
                  <label key={m.userId} className="flex items-center gap-2 rounded-md px-2 py-1 text-sm hover:bg-ink-50">
                    <input
                      type="checkbox"
                      checked={annotatorIds.includes(m.userId)}
                      onChange={(e) => set("assignment.annotatorIds", e.target.checked ? [...annotatorIds, m.userId] : annotatorIds.filter((u) => u !== m.userId))}
                    />
                    <span>{m.name}</span>
                    <span className="text-xs text-ink-500">{roleLabels[m.role]}</span>
                  </label>
                ))}
              </div>
            </fieldset>
            <div className="max-w-xs">
              <Field
                label="Annotators per document"
                hint="2 or more gives overlap, so agreement can be measured and disagreements settled."
                error={errors.assignment && "annotatorsPerDocument" in errors.assignment ? errors.assignment.annotatorsPerDocument?.message : undefined}
              >
                {(id, d) => <Input id={id} type="number" min={1} max={10} aria-describedby={d} {...form.register("assignment.annotatorsPerDocument", { valueAsNumber: true })} />}
              </Field>
            </div>
            {perAnnotator ? (
              <p className="text-sm text-ink-500">
                {documentIds.length} document{documentIds.length === 1 ? "" : "s"} × {Math.min(k || 1, annotatorIds.length)} = about {perAnnotator} per annotator.
              </p>
            ) : null}
          </div>
        ) : (
          <div className="space-y-2">
            {handError(errors.assignment) ? <p role="alert" className="text-sm font-medium text-rust-500">{handError(errors.assignment)}</p> : null}
            {documentIds.length ? (
              <div className="max-h-96 overflow-auto rounded-md border border-ink-100">
                <table className="w-full text-sm">
                  <caption className="sr-only">Annotators per document</caption>
                  <thead className="sticky top-0 bg-ink-50 text-xs text-ink-500">
                    <tr>
                      <th scope="col" className="px-3 py-2 text-left">Document</th>
                      {members.map((m) => (
                        <th key={m.userId} scope="col" className="px-2 py-2 font-medium">
                          {m.name}
                        </th>
                      ))}
                    </tr>
                  </thead>
                  <tbody className="divide-y divide-ink-50">
                    {documentIds.map((docId) => (
                      <tr key={docId}>
                        <th scope="row" className="px-3 py-1.5 text-left font-normal text-ink-800">
                          {titles.get(docId) ?? docId.slice(0, 8)}
                        </th>
                        {members.map((m) => (
                          <td key={m.userId} className="px-2 py-1.5 text-center">
                            <input
                              type="checkbox"
                              aria-label={`${m.name} annotates ${titles.get(docId) ?? docId}`}
                              checked={(byHandFor.get(docId) ?? []).includes(m.userId)}
                              onChange={() => toggleHand(docId, m.userId)}
                            />
                          </td>
                        ))}
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            ) : (
              <p className="text-sm text-ink-500">Pick documents above, then tick who annotates each one.</p>
            )}
          </div>
        )}
      </Card>
      <div className="flex items-center gap-3">
        <Button type="submit" busy={create.isPending} disabled={!corpusId}>
          Create batch and notify annotators
        </Button>
        <span className="text-sm text-ink-500">Each annotator gets one e-mail with a link to their queue.</span>
      </div>
    </form>
  );
}

/** The by-hand table's error: the list's own, or the first document left without an annotator. */
function handError(e: unknown): string | null {
  const docs = (e as { documents?: { message?: string } & Array<{ annotatorIds?: { message?: string } } | undefined> } | undefined)?.documents;
  if (!docs) return null;
  if (docs.message) return docs.message;
  const first = Array.isArray(docs) ? docs.find((d) => d?.annotatorIds?.message) : undefined;
  return first?.annotatorIds?.message ?? null;
}
