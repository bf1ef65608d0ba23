import { can, type Me, roleLabels } from "@tagloom/contracts";
import { useMutation } from "@tanstack/react-query";
import { NavLink, Outlet, useNavigate } from "react-router";
import { Button } from "@/components/ui/button";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { resendVerification, useSignOut } from "@/features/auth/api/auth-mutations";
import { HealthStatus } from "@/features/health/components/health-status";
import { cn } from "@/lib/cn";
import { Brand } from "./brand";
import { navSections } from "./nav-items";
import { OrgSwitcher } from "./org-switcher";

/** The frame of every organization screen: top bar, the areas on the left, the screen, a footer. */
export function OrgShell({ me, orgId }: { me: Me; orgId: string }) {
  const membership = me.memberships.find((m) => m.organizationId === orgId)!;
  const signOut = useSignOut();
  const navigate = useNavigate();
  const toast = useToast();
  const resend = useMutation({ mutationFn: resendVerification, onSuccess: () => toast.show("A new confirmation link is on its way.", "success") });
  return (
    <div className="flex min-h-full flex-col">
      <header className="sticky top-0 z-30 flex h-14 items-center gap-4 border-b border-ink-100 bg-white/95 px-4 backdrop-blur">
        <Brand to={paths.org.root.build(orgId)} />
        <OrgSwitcher memberships={me.memberships} current={orgId} />
        <div className="ml-auto flex items-center gap-3 text-sm">
          <span className="hidden text-ink-500 sm:inline" title={me.user.email}>
            {me.user.name} · {roleLabels[membership.role]}
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
      <div className="flex flex-1">
        <nav aria-label="Areas" className="hidden w-56 shrink-0 border-r border-ink-100 bg-white/60 px-3 py-5 md:block">
          {navSections.map((section) => {
            const items = section.items.filter((i) => !i.ability || can(membership.role, i.ability));
            if (!items.length) return null;
            return (
              <div key={section.title} className="mb-6">
                <p className="px-3 text-xs font-semibold tracking-wide text-ink-300 uppercase">{section.title}</p>
                <ul className="mt-2 space-y-0.5">
                  {items.map((item) => (
                    <li key={item.label}>
                      <NavLink
                        to={item.to(orgId)}
                        end={item.end}
                        className={({ isActive }) =>
                          cn(
                            "block rounded-md px-3 py-1.5 text-sm text-ink-700 hover:bg-ink-50",
                            isActive && "bg-ink-50 font-medium text-ink-900 shadow-[inset_3px_0_0_var(--color-thread-500)]",
                          )
                        }
                      >
                        {item.label}
                      </NavLink>
                    </li>
                  ))}
                </ul>
              </div>
            );
          })}
        </nav>
        <main className="min-w-0 flex-1 px-6 py-6 lg:px-10">
          <Outlet />
        </main>
      </div>
      <footer className="flex items-center justify-between border-t border-ink-100 px-4 py-2">
        <HealthStatus />
        <span className="text-xs text-ink-300">Tagloom</span>
      </footer>
    </div>
  );
}
