import { type Me, roleLabels } from "@tagloom/contracts";
import { useMutation } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { Outlet, useLocation, useNavigate } from "react-router";
import { Button } from "@/components/ui/button";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { resendVerification, useSignOut } from "@/features/auth/api/auth-mutations";
import { HealthStatus } from "@/features/health/components/health-status";
import { Brand } from "./brand";
import { SideNav } from "./side-nav";
import { OrgSwitcher } from "./org-switcher";
import { UserText } from "@/components/ui/user-text";

/** The frame of every organization screen: top bar, the areas on the left, the screen, a footer. */
export function OrgShell({ me, orgId }: { me: Me; orgId: string }) {
  const membership = me.memberships.find((m) => m.organizationId === orgId)!;
  const signOut = useSignOut();
  const navigate = useNavigate();
  const toast = useToast();
  const resend = useMutation({ mutationFn: resendVerification, onSuccess: () => toast.show("A new confirmation link is on its way.", "success") });
  const [menuOpen, setMenuOpen] = useState(false);
  const location = useLocation();
  useEffect(() => setMenuOpen(false), [location.pathname]);
  return (
    <div className="flex min-h-full flex-col">
      <header className="sticky top-0 z-30 flex h-14 items-center gap-2 border-b border-ink-100 bg-white/95 px-3 backdrop-blur sm:gap-4 sm:px-4">
        <button
          type="button"
          className="rounded-md border border-ink-200 px-2 py-1.5 text-sm font-medium text-ink-800 md:hidden"
          aria-expanded={menuOpen}
          aria-controls="mobile-nav"
          onClick={() => setMenuOpen((o) => !o)}
        >
          <span aria-hidden>☰</span> Menu
        </button>
        <Brand to={paths.org.root.build(orgId)} compact />
        <OrgSwitcher memberships={me.memberships} current={orgId} />
        <div className="ml-auto flex items-center gap-3 text-sm">
          <span className="hidden text-ink-500 lg:inline" title={me.user.email}>
            <UserText>{me.user.name}</UserText> · {roleLabels[membership.role]}
          </span>
          <Button
            variant="ghost"
            size="sm"
            busy={signOut.isPending}
            onClick={() => signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn.build(), { replace: true }) })}
          >
            Sign out
          </Button>
        </div>
      </header>
      {me.user.emailVerified ? null : (
        <div className="flex items-center justify-center gap-3 border-b border-thread-300 bg-thread-100 px-4 py-2 text-sm text-ink-900">
          Please confirm your e-mail address: we sent you a link.
          <Button size="sm" variant="secondary" busy={resend.isPending} onClick={() => resend.mutate()}>
            Send it again
          </Button>
        </div>
      )}
      {menuOpen ? (
        <div id="mobile-nav" className="border-b border-ink-100 bg-white px-3 pt-4 md:hidden">
          <p className="mb-3 px-3 text-sm text-ink-500">
            <UserText>{me.user.name}</UserText> · {roleLabels[membership.role]}
          </p>
          <SideNav orgId={orgId} role={membership.role} onNavigate={() => setMenuOpen(false)} className="grid grid-cols-2 gap-x-2" />
        </div>
      ) : null}
      <div className="flex flex-1">
        <SideNav orgId={orgId} role={membership.role} className="hidden w-56 shrink-0 border-r border-ink-100 bg-white/60 px-3 py-5 md:block" />
        <main className="min-w-0 flex-1 px-4 py-5 sm:px-6 sm:py-6 lg:px-10">
          <Outlet />
        </main>
      </div>
      <footer className="flex items-center justify-between border-t border-ink-100 px-4 py-2">
        <HealthStatus />
        <span className="text-xs text-ink-500">Tagloom</span>
      </footer>
    </div>
  );
}
