import { zodResolver } from "@hookform/resolvers/zod";
import { type CreateInvitationInput, createInvitationInputSchema, roleLabels, roles } from "@tagloom/contracts";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/field";
import { useToast } from "@/components/ui/toaster";
import { applyApiErrors } from "@/lib/form-errors";
import { useCreateInvitation } from "../api/invitations";
import { SeatLimitNotice, isSeatLimitError } from "./seat-limit-notice";

export function InviteForm({ orgId }: { orgId: string }) {
  const create = useCreateInvitation(orgId);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const [seatError, setSeatError] = useState<string | null>(null);
  const form = useForm<CreateInvitationInput>({ resolver: zodResolver(createInvitationInputSchema), defaultValues: { email: "", role: "annotator" } });
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    setSeatError(null);
    try {
      const inv = await create.mutateAsync(values);
      toast.show(`Invitation sent to ${inv.email}.`, "success");
      form.reset({ email: "", role: values.role });
    } catch (err) {
      if (isSeatLimitError(err)) setSeatError(err.message);
      else setFormError(applyApiErrors(err, form.setError, ["email", "role"]));
    }
  });
  const { errors } = form.formState;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      {seatError ? <SeatLimitNotice orgId={orgId} message={seatError} /> : null}
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-start">
        <Field label="E-mail address" error={errors.email?.message}>
          {(id, d) => <Input id={id} type="email" placeholder="colleague@example.org" aria-describedby={d} aria-invalid={!!errors.email} {...form.register("email")} />}
        </Field>
        <Field label="Role" error={errors.role?.message}>
          {(id, d) => (
            <Select id={id} aria-describedby={d} {...form.register("role")}>
              {roles.map((r) => (
                <option key={r} value={r}>
                  {roleLabels[r]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <div className="sm:pt-6">
          <Button type="submit" busy={create.isPending}>
            Send invitation
          </Button>
        </div>
      </div>
    </form>
  );
}
