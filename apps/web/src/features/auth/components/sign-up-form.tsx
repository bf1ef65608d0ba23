import { zodResolver } from "@hookform/resolvers/zod";
import { type Me, type SignUpInput, signUpInputSchema } from "@tagloom/contracts";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { applyApiErrors } from "@/lib/form-errors";
import { useSignUp } from "../api/auth-mutations";

type Props = {
  /** With an invitation the account joins that organization instead of founding one. */
  invitation?: { token: string; email: string; organizationName: string };
  onSignedUp: (me: Me & { organizationId: string }) => void;
};

export function SignUpForm({ invitation, onSignedUp }: Props) {
  const signUp = useSignUp();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<SignUpInput>({
    resolver: zodResolver(signUpInputSchema),
    defaultValues: invitation
      ? { email: invitation.email, password: "", name: "", invitationToken: invitation.token }
      : { email: "", password: "", name: "", organizationName: "" },
  });
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSignedUp(await signUp.mutateAsync(values));
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ["email", "password", "name", "organizationName"]));
    }
  });
  const { errors } = form.formState;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field label="Your name" error={errors.name?.message}>
        {(id, d) => <Input id={id} autoComplete="name" aria-describedby={d} aria-invalid={!!errors.name} {...form.register("name")} />}
      </Field>
      <Field label="E-mail address" error={errors.email?.message}>
        {(id, d) => (
          <Input
            id={id}
            type="email"
            autoComplete="email"
            readOnly={!!invitation}
            aria-describedby={d}
            aria-invalid={!!errors.email}
            {...form.register("email")}
          />
        )}
      </Field>
      <Field label="Password" error={errors.password?.message} hint="At least 10 characters. A few unrelated words work well.">
        {(id, d) => (
          <Input id={id} type="password" autoComplete="new-password" aria-describedby={d} aria-invalid={!!errors.password} {...form.register("password")} />
        )}
      </Field>
      {invitation ? null : (
        <Field label="Organization name" error={errors.organizationName?.message} hint="Your team's workspace. You will be its admin and can invite others.">
          {(id, d) => <Input id={id} aria-describedby={d} aria-invalid={!!errors.organizationName} {...form.register("organizationName")} />}
        </Field>
      )}
      <Button type="submit" className="w-full" busy={signUp.isPending}>
        {invitation ? `Create account and join ${invitation.organizationName}` : "Create account"}
      </Button>
    </form>
  );
}
