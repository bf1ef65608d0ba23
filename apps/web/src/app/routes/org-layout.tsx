import { Navigate, useLocation, useParams } from "react-router";
import { OrgShell } from "@/components/layout/org-shell";
import { Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useMe } from "@/features/auth/api/get-me";
import { NotFoundRoute } from "./not-found";

/** Guards every organization screen: signed in, and a member of the organization of the URL. */
export function OrgLayoutRoute() {
  const { orgId = "" } = useParams();
  const location = useLocation();
  const me = useMe();
  if (me.isPending) return <div className="p-8"><Skeleton /></div>;
  if (me.isError) return <div className="p-8"><Notice tone="error">{me.error.message}</Notice></div>;
  if (!me.data) return <Navigate to={paths.signIn.build(location.pathname + location.search)} replace />;
  if (!me.data.memberships.some((m) => m.organizationId === orgId)) return <NotFoundRoute />;
  return <OrgShell me={me.data} orgId={orgId} />;
}

/** "/": the signed-in user's first organization, or sign-in. */
export function RootRedirectRoute() {
  const me = useMe();
  if (me.isPending) return <div className="p-8"><Skeleton /></div>;
  if (!me.data) return <Navigate to={paths.signIn.build()} replace />;
  const first = me.data.memberships[0];
  return <Navigate to={first ? paths.org.root.build(first.organizationId) : paths.newOrganization.build()} replace />;
}
