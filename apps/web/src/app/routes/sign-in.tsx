import { Navigate, useNavigate, useSearchParams } from "react-router";
import { Skeleton } from "@/components/ui/card";
import { AuthLayout } from "@/components/layout/auth-layout";
import { useMe } from "@/features/auth/api/get-me";
import { SignInForm } from "@/features/auth/components/sign-in-form";
import { homeFor, safeNext } from "./redirects";

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const me = useMe();
  const next = safeNext(params.get("next"));
  if (me.isPending) return <Skeleton />;
  if (me.data) return <Navigate to={next ?? homeFor(me.data)} replace />;
  return (
    <AuthLayout title="Sign in" subtitle="Welcome back.">
      <SignInForm onSignedIn={(m) => navigate(next ?? homeFor(m), { replace: true })} />
    </AuthLayout>
  );
}
