import { zodResolver } from "@hookform/resolvers/zod";
import { type SignInInput, signInInputSchema } from "@tagloom/contracts";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Link } from "react-router";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { paths } from "@/config/paths";
import { applyApiErrors } from "@/lib/form-errors";
import type { Me } from "@tagloom/contracts";
import { useSignIn } from "../api/auth-mutations";

export function SignInForm({ onSignedIn }: { onSignedIn: (me: Me) => void }) {
  const signIn = useSignIn();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<SignInInput>({ resolver: zodResolver(signInInputSchema), defaultValues: { email: "", password: "" } });
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSignedIn(await signIn.mutateAsync(values));
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ["email", "password"]));
    }
  });
  const { errors } = form.formState;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field label="E-mail address" error={errors.email?.message}>
        {(id, d) => <Input id={id} type="email" autoComplete="email" aria-describedby={d} aria-invalid={!!errors.email} {...form.register("email")} />}
      </Field>
      <Field label="Password" error={errors.password?.message}>
        {(id, d) => (
          <Input id={id} type="password" autoComplete="current-password" aria-describedby={d} aria-invalid={!!errors.password} {...form.register("password")} />
        )}
      </Field>
      <Button type="submit" className="w-full" busy={signIn.isPending}>
        Sign in
      </Button>
      <p className="flex justify-between text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.forgotPassword.build()}>
          Forgot your password?
        </Link>
        <Link className="font-medium text-ink-700 hover:underline" to={paths.signUp.build()}>
          Create an account
        </Link>
      </p>
    </form>
  );
}
