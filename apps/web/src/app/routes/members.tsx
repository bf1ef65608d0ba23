import { can } from "@tagloom/contracts";
import { Button } from "@/components/ui/button";
import { Card, EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { InvitationsTable } from "@/features/invitations/components/invitations-table";
import { InviteForm } from "@/features/invitations/components/invite-form";
import { useInvitations } from "@/features/invitations/api/invitations";
import { useMembers } from "@/features/members/api/members";
import { MembersTable } from "@/features/members/components/members-table";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

export function MembersRoute() {
  const org = useCurrentOrg();
  const isAdmin = can(org.role, "manageMembers");
  const members = useMembers(org.organizationId);
  const invitations = useInvitations(org.organizationId, isAdmin);
  const all = members.data?.pages.flatMap((p) => p.items) ?? [];
  return (
    <div className="max-w-5xl space-y-8">
      <PageHeader title="Members" subtitle={`People in ${org.organizationName} and their roles.`} />
      {isAdmin ? (
        <Card>
          <h2 className="mb-3 font-semibold text-ink-900">Invite someone</h2>
          <InviteForm orgId={org.organizationId} />
        </Card>
      ) : null}
      <section className="space-y-3">
        {members.isPending ? (
          <Skeleton shape="table" />
        ) : members.isError ? (
          <Notice tone="error">{members.error.message}</Notice>
        ) : (
          <MembersTable orgId={org.organizationId} members={all} canManage={isAdmin} currentUserId={org.userId} />
        )}
        {members.hasNextPage ? (
          <Button variant="secondary" busy={members.isFetchingNextPage} onClick={() => void members.fetchNextPage()}>
            Show more members
          </Button>
        ) : null}
      </section>
      {isAdmin ? (
        <section className="space-y-3">
          <h2 className="font-semibold text-ink-900">Invitations</h2>
          {invitations.isPending ? (
            <Skeleton shape="table" />
          ) : invitations.isError ? (
            <Notice tone="error">{invitations.error.message}</Notice>
          ) : invitations.data.items.length ? (
            <InvitationsTable orgId={org.organizationId} invitations={invitations.data.items} />
          ) : (
            <EmptyState title="No invitations yet">Invite people by e-mail above; they join with the role you choose.</EmptyState>
          )}
        </section>
      ) : null}
    </div>
  );
}
