import { zodResolver } from "@hookform/resolvers/zod";
import { type EntityType, createEntityTypeInputSchema } from "@tagloom/contracts";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, Input, TextArea } from "@/components/ui/field";
import { applyApiErrors } from "@/lib/form-errors";

export type EntityTypeFormValues = z.output<typeof createEntityTypeInputSchema>;
type FormInput = z.input<typeof createEntityTypeInputSchema>;

/**
 * The fields of an entity type: upper-case name, colour, one-key hotkey, guideline (Markdown).
 * Used to add a type (colour pre-filled with the next palette colour) and to edit one. When
 * `onSubmit` throws an API error, its field messages land on the fields.
 */
export function EntityTypeForm({
  initial,
  submitLabel,
  busy,
  onSubmit,
  onCancel,
}: {
  initial: Partial<EntityType> & { color: string };
  submitLabel: string;
  busy: boolean;
  onSubmit: (values: EntityTypeFormValues) => Promise<void>;
  onCancel?: () => void;
}) {
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<FormInput, unknown, EntityTypeFormValues>({
    resolver: zodResolver(createEntityTypeInputSchema),
    defaultValues: { name: initial.name ?? "", color: initial.color, hotkey: initial.hotkey ?? "", guideline: initial.guideline ?? "" },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSubmit({ ...values, hotkey: values.hotkey ? values.hotkey : null });
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ["name", "color", "hotkey", "guideline"]));
    }
  });
  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <div className="grid gap-3 sm:grid-cols-[1fr_8rem_7rem]">
        <Field label="Name" error={errors.name?.message} hint="Upper case, e.g. PARTY or DUE_DATE">
          {(id, d) => (
            <Input
              id={id}
              aria-describedby={d}
              aria-invalid={!!errors.name}
              autoComplete="off"
              className="font-mono uppercase"
              {...form.register("name", { setValueAs: (v: string) => v.toUpperCase() })}
            />
          )}
        </Field>
        <Field label="Colour" error={errors.color?.message}>
          {(id, d) => <Input id={id} type="color" aria-describedby={d} className="h-10 p-1" {...form.register("color")} />}
        </Field>
        <Field label="Key" error={errors.hotkey?.message} hint="A letter or digit">
          {(id, d) => (
            <Input
              id={id}
              maxLength={1}
              aria-describedby={d}
              aria-invalid={!!errors.hotkey}
              autoComplete="off"
              className="font-mono"
              {...form.register("hotkey", { setValueAs: (v: string | null) => (v ? v : null) })}
            />
          )}
        </Field>
      </div>
      <Field label="Guideline (Markdown)" error={errors.guideline?.message} hint="What counts as this type, with examples. Annotators see it while they work.">
        {(id, d) => <TextArea id={id} rows={4} aria-describedby={d} {...form.register("guideline")} />}
      </Field>
      <div className="flex gap-2">
        <Button type="submit" busy={busy}>
          {submitLabel}
        </Button>
        {onCancel ? (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
