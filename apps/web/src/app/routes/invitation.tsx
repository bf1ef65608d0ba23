import { roleLabels } from "@tagloom/contracts";
import { useNavigate, useParams } from "react-router";
import { AuthLayout } from "@/components/layout/auth-layout";
import { Button } from "@/components/ui/button";
import { Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useSignOut } from "@/features/auth/api/auth-mutations";
import { useMe } from "@/features/auth/api/get-me";
import { SignInForm } from "@/features/auth/components/sign-in-form";
import { SignUpForm } from "@/features/auth/components/sign-up-form";
import { useAcceptInvitation, useInvitationPreview } from "@/features/invitations/api/invitation-link";

export function InvitationRoute() {
  const { token = "" } = useParams();
  const navigate = useNavigate();
  const me = useMe();
  const preview = useInvitationPreview(token);
  const accept = useAcceptInvitation();
  const signOut = useSignOut();

  if (me.isPending || preview.isPending) return <Skeleton />;
  if (preview.isError) {
    return (
      <AuthLayout title="Invitation">
        <Notice tone="error">This invitation link is not valid. Ask the person who invited you to send it again.</Notice>
      </AuthLayout>
    );
  }
  const inv = preview.data;
  const title = `Join ${inv.organizationName}`;
  const subtitle = `${inv.invitedBy ? `${inv.invitedBy.replace(/ <.*>$/, "")} invited` : "You are invited as"} ${inv.email} as ${roleLabels[inv.role].toLowerCase()}.`;
  if (inv.status !== "pending") {
    const why = { accepted: "It has already been used.", revoked: "It was withdrawn.", expired: "It has expired. Ask an admin to send it again." }[inv.status];
    return (
      <AuthLayout title={title}>
        <Notice tone="error">This invitation cannot be used. {why}</Notice>
      </AuthLayout>
    );
  }
  const doAccept = async () => {
    const { organizationId } = await accept.mutateAsync(token);
    navigate(paths.org.root.build(organizationId), { replace: true });
  };
  if (me.data) {
    if (me.data.user.email !== inv.email) {
      return (
        <AuthLayout title={title} subtitle={subtitle}>
          <Notice tone="warn">
            You are signed in as {me.data.user.email}, but this invitation is for {inv.email}. Sign out and sign in with the invited address.
          </Notice>
          <Button className="mt-4 w-full" variant="secondary" busy={signOut.isPending} onClick={() => signOut.mutate()}>
            Sign out
          </Button>
        </AuthLayout>
      );
    }
    return (
      <AuthLayout title={title} subtitle={subtitle}>
        {accept.isError ? <Notice tone="error">{accept.error.message}</Notice> : null}
        <Button className="mt-2 w-full" busy={accept.isPending} onClick={() => void doAccept()}>
          Accept and join {inv.organizationName}
        </Button>
      </AuthLayout>
    );
  }
  if (inv.accountExists) {
    return (
      <AuthLayout title={title} subtitle={`${subtitle} Sign in to accept.`}>
        <SignInForm onSignedIn={() => void doAccept()} />
      </AuthLayout>
    );
  }
  return (
    <AuthLayout title={title} subtitle={`${subtitle} Create your account to accept.`}>
      <SignUpForm
        invitation={{ token, email: inv.email, organizationName: inv.organizationName }}
        onSignedUp={(m) => navigate(paths.org.root.build(m.organizationId), { replace: true })}
      />
    </AuthLayout>
  );
}
