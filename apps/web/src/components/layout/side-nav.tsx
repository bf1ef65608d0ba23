import { can, type Role } from "@tagloom/contracts";
import { Link, useLocation } from "react-router";
import { cn } from "@/lib/cn";
import { areaOf, navSections } from "./nav-items";

/** The organization's areas for this role, with the page's own area marked (also on nested pages). */
export function SideNav({ orgId, role, onNavigate, className }: { orgId: string; role: Role; onNavigate?: () => void; className?: string }) {
  const location = useLocation();
  const current = areaOf(location.pathname, location.search);
  return (
    <nav aria-label="Areas" className={className}>
      {navSections.map((section) => {
        const items = section.items.filter((i) => (!i.ability || can(role, i.ability)) && (!i.roles || i.roles.includes(role)));
        if (!items.length) return null;
        return (
          <div key={section.title} className="mb-6">
            <p className="px-3 text-xs font-semibold tracking-wide text-ink-500 uppercase">{section.title}</p>
            <ul className="mt-2 space-y-0.5">
              {items.map((item) => {
                const active = item.area === current;
                return (
                  <li key={item.label}>
                    <Link
                      to={item.to(orgId)}
                      onClick={onNavigate}
                      aria-current={active ? "page" : undefined}
                      className={cn(
                        "block rounded-md px-3 py-1.5 text-sm text-ink-700 hover:bg-ink-50",
                        active && "bg-ink-50 font-medium text-ink-900 shadow-[inset_3px_0_0_var(--color-thread-500)]",
                      )}
                    >
                      {item.label}
                    </Link>
                  </li>
                );
              })}
            </ul>
          </div>
        );
      })}
    </nav>
  );
}
