import { organizationNameSchema } from "@tagloom/contracts";
import { useState } from "react";
import { Navigate, useNavigate } from "react-router";
import { AuthLayout } from "@/components/layout/auth-layout";
import { Button } from "@/components/ui/button";
import { Notice, Skeleton } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { paths } from "@/config/paths";
import { useMe } from "@/features/auth/api/get-me";
import { useCreateOrganization } from "@/features/orgs/api/orgs";

export function NewOrganizationRoute() {
  const me = useMe();
  const create = useCreateOrganization();
  const navigate = useNavigate();
  const [name, setName] = useState("");
  const [error, setError] = useState<string | null>(null);
  if (me.isPending) return <Skeleton />;
  if (!me.data) return <Navigate to={paths.signIn.build(paths.newOrganization.build())} replace />;
  return (
    <AuthLayout title="New organization" subtitle="You will be its admin and can invite others.">
      <form
        className="space-y-4"
        onSubmit={(e) => {
          e.preventDefault();
          const parsed = organizationNameSchema.safeParse(name);
          if (!parsed.success) return setError(parsed.error.issues[0]?.message ?? "Invalid name.");
          setError(null);
          create.mutate(parsed.data, { onSuccess: (org) => navigate(paths.org.root.build(org.id)), onError: (err) => setError(err.message) });
        }}
      >
        {error ? <Notice tone="error">{error}</Notice> : null}
        <Field label="Organization name">{(id) => <Input id={id} value={name} onChange={(e) => setName(e.target.value)} />}</Field>
        <Button type="submit" className="w-full" busy={create.isPending}>
          Create organization
        </Button>
        {me.data.memberships.length ? (
          <Button variant="ghost" className="w-full" onClick={() => navigate(-1)}>
            Cancel
          </Button>
        ) : null}
      </form>
    </AuthLayout>
  );
}
