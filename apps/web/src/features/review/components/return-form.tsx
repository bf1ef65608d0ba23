import { zodResolver } from "@hookform/resolvers/zod";
import { type ReturnAssignmentInput, returnAssignmentInputSchema } from "@tagloom/contracts";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, TextArea } from "@/components/ui/field";
import { applyApiErrors } from "@/lib/form-errors";
import { useReturnAssignment } from "../api/return-assignment";

/** Sends one annotator's submitted work back with a comment; they get an e-mail and can edit again. */
export function ReturnForm({ orgId, corpusId, assignmentId, annotatorName, onDone }: { orgId: string; corpusId: string; assignmentId: string; annotatorName: string; onDone: () => void }) {
  const send = useReturnAssignment(orgId, corpusId);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<ReturnAssignmentInput>({ resolver: zodResolver(returnAssignmentInputSchema), defaultValues: { comment: "" } });
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await send.mutateAsync({ assignmentId, comment: values.comment });
      onDone();
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ["comment"]));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-2">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field label={`Comment for ${annotatorName}`} hint="Say what to fix. They receive it by e-mail." error={form.formState.errors.comment?.message}>
        {(id, d) => <TextArea id={id} aria-describedby={d} aria-invalid={!!form.formState.errors.comment} {...form.register("comment")} />}
      </Field>
      <Button type="submit" variant="secondary" busy={send.isPending}>
        Send back to {annotatorName}
      </Button>
    </form>
  );
}
