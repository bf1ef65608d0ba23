import { can } from "@tagloom/contracts";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { CreateTokenForm } from "@/features/api-tokens/components/create-token-form";
import { TokensTable } from "@/features/api-tokens/components/tokens-table";
import { useApiTokens } from "@/features/api-tokens/api/get-api-tokens";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

/** The organization's API tokens for the tagging API: create (secret shown once), list, revoke. */
export function ApiTokensRoute() {
  const org = useCurrentOrg();
  const allowed = can(org.role, "manageTokens");
  const tokens = useApiTokens(org.organizationId);
  if (!allowed) return <Notice tone="warn">Only data leads and admins manage API tokens.</Notice>;
  return (
    <div className="max-w-5xl space-y-6">
      <PageHeader
        title="API tokens"
        subtitle={
          <>
            Programs send a token as <code className="font-mono">Authorization: Bearer …</code> to tag text with a corpus's suggester at{" "}
            <code className="font-mono">POST /api/v1/corpora/&lt;corpus id&gt;/tag</code>. A token can only reach this organization's corpora.
          </>
        }
      />
      <CreateTokenForm orgId={org.organizationId} />
      {tokens.isPending ? <Skeleton shape="table" /> : null}
      {tokens.isError ? <Notice tone="error">{tokens.error.message}</Notice> : null}
      {tokens.data && tokens.data.items.length === 0 ? <EmptyState title="No tokens yet">Create one for each program that calls the tagging API.</EmptyState> : null}
      {tokens.data && tokens.data.items.length > 0 ? <TokensTable orgId={org.organizationId} tokens={tokens.data.items} /> : null}
    </div>
  );
}
