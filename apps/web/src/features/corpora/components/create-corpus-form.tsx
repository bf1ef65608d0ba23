import { zodResolver } from "@hookform/resolvers/zod";
import { type CreateCorpusInput, createCorpusInputSchema } from "@tagloom/contracts";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, Input, TextArea } from "@/components/ui/field";
import { applyApiErrors } from "@/lib/form-errors";
import { useCreateCorpus } from "../api/create-corpus";

/** Names a new corpus (and says what it holds); calls `onCreated` with its id. */
export function CreateCorpusForm({ orgId, onCreated }: { orgId: string; onCreated: (corpusId: string) => void }) {
  const create = useCreateCorpus(orgId);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<CreateCorpusInput>({ resolver: zodResolver(createCorpusInputSchema), defaultValues: { name: "", description: "" } });
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      const corpus = await create.mutateAsync(values);
      form.reset();
      onCreated(corpus.id);
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ["name", "description"]));
    }
  });
  const { errors } = form.formState;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field label="Name" error={errors.name?.message} hint="For example: Supplier contracts 2026">
        {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.name} {...form.register("name")} />}
      </Field>
      <Field label="Description (optional)" error={errors.description?.message}>
        {(id, d) => <TextArea id={id} aria-describedby={d} rows={2} {...form.register("description")} />}
      </Field>
      <Button type="submit" busy={create.isPending}>
        Create corpus
      </Button>
    </form>
  );
}
