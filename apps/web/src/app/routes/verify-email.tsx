import { useMutation } from "@tanstack/react-query";
import { useEffect } from "react";
import { Link, useSearchParams } from "react-router";
import { AuthLayout } from "@/components/layout/auth-layout";
import { Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { verifyEmail } from "@/features/auth/api/auth-mutations";
import { useQueryClient } from "@tanstack/react-query";
import { ownErrorMeta } from "@/lib/query-client";

export function VerifyEmailRoute() {
  const [params] = useSearchParams();
  const token = params.get("token") ?? "";
  const qc = useQueryClient();
  const verify = useMutation({ meta: ownErrorMeta, mutationFn: verifyEmail, onSuccess: () => qc.invalidateQueries({ queryKey: ["me"] }) });
  const { mutate } = verify;
  useEffect(() => {
    if (token) mutate(token);
  }, [token, mutate]);
  return (
    <AuthLayout title="Confirm your e-mail address">
      {!token ? (
        <Notice tone="error">This page needs the link from the e-mail.</Notice>
      ) : verify.isPending || verify.isIdle ? (
        <Skeleton label="Confirming" />
      ) : verify.isError ? (
        <Notice tone="error">{verify.error.message}</Notice>
      ) : (
        <Notice>Your e-mail address is confirmed.</Notice>
      )}
      <p className="mt-4 text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.home.build()}>
          Continue to Tagloom
        </Link>
      </p>
    </AuthLayout>
  );
}
