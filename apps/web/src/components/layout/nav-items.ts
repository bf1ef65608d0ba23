import type { Ability } from "@tagloom/contracts";
import { paths } from "@/config/paths";

export type NavItem = { label: string; to: (orgId: string) => string; ability?: Ability; end?: boolean };

/** The areas of an organization, in the order of the work; each shows only to roles that can use it. */
export const navSections: { title: string; items: NavItem[] }[] = [
  {
    title: "Work",
    items: [
      { label: "Overview", to: paths.org.root.build, end: true },
      { label: "My queue", to: paths.org.queue.build, ability: "annotate" },
      { label: "Corpora", to: paths.org.corpora.build },
      { label: "Batches", to: paths.org.batches.build, ability: "manageBatches" },
      { label: "Review", to: paths.org.review.build, ability: "review" },
      { label: "Taggers", to: paths.org.taggers.build, ability: "train" },
    ],
  },
  {
    title: "Organization",
    items: [
      { label: "Members", to: paths.org.members.build },
      { label: "Audit log", to: paths.org.audit.build, ability: "viewAudit" },
      { label: "Billing", to: paths.org.billing.build, ability: "manageBilling" },
      { label: "API tokens", to: paths.org.apiTokens.build, ability: "manageTokens" },
      { label: "Settings", to: paths.org.settings.build, ability: "manageMembers" },
    ],
  },
];
