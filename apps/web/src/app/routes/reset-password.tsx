import { zodResolver } from "@hookform/resolvers/zod";
import { passwordSchema } from "@tagloom/contracts";
import { useMutation } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import { Link, useSearchParams } from "react-router";
import { z } from "zod";
import { AuthLayout } from "@/components/layout/auth-layout";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { paths } from "@/config/paths";
import { confirmPasswordReset } from "@/features/auth/api/auth-mutations";
import { ownErrorMeta } from "@/lib/query-client";

const schema = z
  .object({ password: passwordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ["repeat"], message: "The two passwords differ." });

export function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get("token") ?? "";
  const form = useForm<z.infer<typeof schema>>({ resolver: zodResolver(schema), defaultValues: { password: "", repeat: "" } });
  const reset = useMutation({ meta: ownErrorMeta, mutationFn: (password: string) => confirmPasswordReset(token, password) });
  const { errors } = form.formState;
  if (!token) {
    return (
      <AuthLayout title="Reset your password">
        <Notice tone="error">This page needs the link from the e-mail. Ask for a new link on the sign-in page.</Notice>
      </AuthLayout>
    );
  }
  return (
    <AuthLayout title="Choose a new password" subtitle="Every device signed in to your account will be signed out.">
      {reset.isSuccess ? (
        <Notice>
          Your password is changed.{" "}
          <Link className="font-medium underline" to={paths.signIn.build()}>
            Sign in
          </Link>{" "}
          with it now.
        </Notice>
      ) : (
        <form onSubmit={form.handleSubmit((v) => reset.mutate(v.password))} noValidate className="space-y-4">
          {reset.isError ? <Notice tone="error">{reset.error.message}</Notice> : null}
          <Field label="New password" error={errors.password?.message}>
            {(id, d) => <Input id={id} type="password" autoComplete="new-password" aria-describedby={d} {...form.register("password")} />}
          </Field>
          <Field label="The same password again" error={errors.repeat?.message}>
            {(id, d) => <Input id={id} type="password" autoComplete="new-password" aria-describedby={d} {...form.register("repeat")} />}
          </Field>
          <Button type="submit" className="w-full" busy={reset.isPending}>
            Set the new password
          </Button>
        </form>
      )}
    </AuthLayout>
  );
}
