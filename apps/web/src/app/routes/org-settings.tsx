import { organizationNameSchema } from "@tagloom/contracts";
import { useState } from "react";
import { useNavigate } from "react-router";
import { Button } from "@/components/ui/button";
import { Card, Notice, PageHeader } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { useDeleteOrganization, useRenameOrganization } from "@/features/orgs/api/orgs";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { RequireAbility } from "@/components/layout/not-allowed";

export function OrgSettingsRoute() {
  return (
    <RequireAbility ability="manageOrganization" what="The organization's settings are for admins.">
      <OrgSettingsScreen />
    </RequireAbility>
  );
}

function OrgSettingsScreen() {
  const org = useCurrentOrg();
  const toast = useToast();
  const navigate = useNavigate();
  const rename = useRenameOrganization(org.organizationId);
  const del = useDeleteOrganization(org.organizationId);
  const [name, setName] = useState(org.organizationName);
  const [nameError, setNameError] = useState<string | null>(null);
  const [confirm, setConfirm] = useState("");
  return (
    <div className="max-w-3xl space-y-8">
      <PageHeader title="Settings" subtitle="The organization's name, and deleting it for good." />
      <Card>
        <form
          className="space-y-3"
          onSubmit={(e) => {
            e.preventDefault();
            const parsed = organizationNameSchema.safeParse(name);
            if (!parsed.success) return setNameError(parsed.error.issues[0]?.message ?? "Invalid name.");
            setNameError(null);
            rename.mutate(parsed.data, { onSuccess: () => toast.show("Name saved.", "success"), onError: (err) => setNameError(err.message) });
          }}
        >
          <Field label="Organization name" error={nameError ?? undefined}>
            {(id) => <Input id={id} value={name} onChange={(e) => setName(e.target.value)} />}
          </Field>
          <Button type="submit" busy={rename.isPending}>
            Save name
          </Button>
        </form>
      </Card>
      <Card className="border-rust-500/30">
        <h2 className="font-semibold text-rust-500">Delete this organization</h2>
        <p className="mt-1 text-sm text-ink-700">
          This removes every corpus, document, annotation, tagger, member list and the audit log of {org.organizationName}, for good. It cannot be
          undone. Export what you need first.
        </p>
        {del.isError ? <Notice tone="error" className="mt-3">{del.error.message}</Notice> : null}
        <div className="mt-4 flex flex-wrap items-end gap-3">
          <Field label={`Type "${org.organizationName}" to confirm`}>
            {(id) => <Input id={id} value={confirm} onChange={(e) => setConfirm(e.target.value)} autoComplete="off" />}
          </Field>
          <Button
            variant="danger"
            disabled={confirm !== org.organizationName}
            busy={del.isPending}
            onClick={() => del.mutate(confirm, { onSuccess: () => navigate(paths.home.build(), { replace: true }) })}
          >
            Delete for good
          </Button>
        </div>
      </Card>
    </div>
  );
}
