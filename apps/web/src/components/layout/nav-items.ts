import type { Ability, Role } from "@tagloom/contracts";
import { paths } from "@/config/paths";

export type NavArea = "overview" | "queue" | "corpora" | "batches" | "review" | "taggers" | "members" | "audit" | "billing" | "tokens" | "settings";
export type NavItem = { area: NavArea; label: string; to: (orgId: string) => string; ability?: Ability; roles?: readonly Role[] };

/** The areas of an organization, in the order of the work; each shows only to roles that can use it. */
export const navSections: { title: string; items: NavItem[] }[] = [
  {
    title: "Work",
    items: [
      { area: "overview", label: "Overview", to: paths.org.root.build },
      { area: "queue", label: "My queue", to: paths.org.queue.build, ability: "annotate" },
      { area: "corpora", label: "Corpora", to: paths.org.corpora.build, ability: "viewCorpusData" },
      { area: "corpora", label: "Guidelines", to: paths.org.corpora.build, roles: ["annotator"] },
      { area: "batches", label: "Batches", to: paths.org.batches.build, ability: "manageBatches" },
      { area: "review", label: "Review", to: paths.org.review.build, ability: "review" },
      { area: "taggers", label: "Taggers", to: paths.org.taggers.build, ability: "viewTraining" },
    ],
  },
  {
    title: "Organization",
    items: [
      { area: "members", label: "Members", to: paths.org.members.build },
      { area: "audit", label: "Audit log", to: paths.org.audit.build, ability: "viewAudit" },
      { area: "billing", label: "Billing", to: paths.org.billing.build, ability: "manageBilling" },
      { area: "tokens", label: "API tokens", to: paths.org.apiTokens.build, ability: "manageTokens" },
      { area: "settings", label: "Settings", to: paths.org.settings.build, ability: "manageOrganization" },
    ],
  },
];

/**
 * The area a page belongs to, for the nav: a batch or its review lives under a corpus in the URL
 * but belongs to Batches or Review; an assignment belongs to My queue, or to Review when opened
 * from there (`?from=review`).
 */
export function areaOf(pathname: string, search = ""): NavArea {
  const rest = pathname.replace(/^\/o\/[^/]+/, "");
  if (rest === "" || rest === "/") return "overview";
  if (/^\/corpora\/[^/]+\/batches\/[^/]+\/review\//.test(rest)) return "review";
  if (/^\/corpora\/[^/]+\/batches\//.test(rest)) return "batches";
  if (/^\/corpora\/[^/]+\/training(\/|$)/.test(rest)) return "taggers";
  if (/^\/corpora\/[^/]+\/assignments\//.test(rest)) return new URLSearchParams(search).get("from") === "review" ? "review" : "queue";
  const first = rest.split("/")[1] ?? "";
  const areas: Record<string, NavArea> = { queue: "queue", corpora: "corpora", batches: "batches", review: "review", taggers: "taggers", members: "members", audit: "audit", billing: "billing", tokens: "tokens", settings: "settings" };
  return areas[first] ?? "overview";
}
