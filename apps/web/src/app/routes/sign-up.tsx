import { Link, Navigate, useNavigate } from "react-router";
import { Skeleton } from "@/components/ui/card";
import { AuthLayout } from "@/components/layout/auth-layout";
import { paths } from "@/config/paths";
import { useMe } from "@/features/auth/api/get-me";
import { SignUpForm } from "@/features/auth/components/sign-up-form";
import { homeFor } from "./redirects";

export function SignUpRoute() {
  const navigate = useNavigate();
  const me = useMe();
  if (me.isPending) return <Skeleton />;
  if (me.data) return <Navigate to={homeFor(me.data)} replace />;
  return (
    <AuthLayout
      title="Create your account"
      subtitle={
        <>
          Already have one?{" "}
          <Link className="font-medium text-ink-700 hover:underline" to={paths.signIn.build()}>
            Sign in
          </Link>
        </>
      }
    >
      <SignUpForm onSignedUp={(m) => navigate(paths.org.root.build(m.organizationId), { replace: true })} />
    </AuthLayout>
  );
}
