import { zodResolver } from "@hookform/resolvers/zod";
import { passwordResetRequestSchema } from "@tagloom/contracts";
import { useMutation } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import { Link } from "react-router";
import { AuthLayout } from "@/components/layout/auth-layout";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { paths } from "@/config/paths";
import { requestPasswordReset } from "@/features/auth/api/auth-mutations";
import { ownErrorMeta } from "@/lib/query-client";

export function ForgotPasswordRoute() {
  const form = useForm<{ email: string }>({ resolver: zodResolver(passwordResetRequestSchema), defaultValues: { email: "" } });
  const request = useMutation({ meta: ownErrorMeta, mutationFn: (email: string) => requestPasswordReset(email) });
  const { errors } = form.formState;
  return (
    <AuthLayout title="Reset your password" subtitle="We will e-mail you a link to choose a new one.">
      {request.isSuccess ? (
        <Notice>
          If an account exists for that address, a link is on its way. It works once and expires in one hour.
        </Notice>
      ) : (
        <form onSubmit={form.handleSubmit((v) => request.mutate(v.email))} noValidate className="space-y-4">
          {request.isError ? <Notice tone="error">{request.error.message}</Notice> : null}
          <Field label="E-mail address" error={errors.email?.message}>
            {(id, d) => <Input id={id} type="email" autoComplete="email" aria-describedby={d} aria-invalid={!!errors.email} {...form.register("email")} />}
          </Field>
          <Button type="submit" className="w-full" busy={request.isPending}>
            Send the link
          </Button>
        </form>
      )}
      <p className="mt-4 text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.signIn.build()}>
          Back to sign-in
        </Link>
      </p>
    </AuthLayout>
  );
}
