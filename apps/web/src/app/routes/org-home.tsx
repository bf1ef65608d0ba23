import { can, roleLabels } from "@tagloom/contracts";
import { Link } from "react-router";
import { Card, PageHeader } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

/** The first screen of an organization: where each role's work starts. */
export function OrgHomeRoute() {
  const org = useCurrentOrg();
  const id = org.organizationId;
  const cards = [
    { show: can(org.role, "annotate"), title: "My queue", text: "Documents assigned to you, with their due dates.", to: paths.org.queue.build(id) },
    { show: true, title: "Corpora", text: "Bodies of documents, each with its entity schema.", to: paths.org.corpora.build(id) },
    { show: can(org.role, "manageBatches"), title: "Batches", text: "Give documents to annotators, follow progress, settle disagreements.", to: paths.org.batches.build(id) },
    { show: can(org.role, "train"), title: "Taggers", text: "Train taggers on gold data and compare them on held-out documents.", to: paths.org.taggers.build(id) },
    { show: true, title: "Members", text: "Who is in the organization and their roles.", to: paths.org.members.build(id) },
  ].filter((c) => c.show);
  return (
    <div className="max-w-5xl">
      <PageHeader title={org.organizationName} subtitle={`You are ${roleLabels[org.role].toLowerCase()} here.`} />
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        {cards.map((c) => (
          <Link key={c.title} to={c.to} className="group">
            <Card className="h-full transition-shadow group-hover:shadow-md">
              <h2 className="font-semibold text-ink-900">{c.title}</h2>
              <p className="mt-1 text-sm text-ink-500">{c.text}</p>
            </Card>
          </Link>
        ))}
      </div>
      <p className="mt-8 max-w-3xl text-xs text-ink-500">
        Documents may hold personal data: handle them under your organization's rules. Tagger output is a suggestion with a confidence, not an
        authoritative label; for clinical or legal use follow your organization's own rules and licensed practice.
      </p>
    </div>
  );
}
