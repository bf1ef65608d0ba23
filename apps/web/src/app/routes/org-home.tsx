import { can, roleLabels } from "@tagloom/contracts";
import { PageHeader } from "@/components/ui/card";
import { useCorpora } from "@/features/corpora/api/get-corpora";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useBatches } from "@/features/batches/api/get-batches";
import { RecentAuditSection, SeatsSection } from "./overview/admin";
import { AgreementTrendSection } from "./overview/agreement-trend";
import { BatchProgressSection, DocumentsByStatusSection } from "./overview/batches";
import { MyWorkSection } from "./overview/my-work";
import { TrainingSection } from "./overview/training";

/** How many corpora the overview summarises (the corpora screen lists them all). */
const CORPORA_SHOWN = 3;

/**
 * The first screen of an organization, per role: an annotator's open work and due dates; a
 * manager's batch progress and documents by status; a data lead's suggesters and latest runs; an
 * admin's seats and recent activity besides the team's progress.
 */
export function OrgHomeRoute() {
  const org = useCurrentOrg();
  const id = org.organizationId;
  const role = org.role;
  const seesCorpora = can(role, "viewCorpusData");
  const corpora = useCorpora(id, "false", { enabled: seesCorpora });
  const firstCorpora = (corpora.data?.pages[0]?.items ?? []).slice(0, CORPORA_SHOWN);
  const batches = useBatches(id, { enabled: role === "manager" });
  return (
    <div className="max-w-6xl">
      <PageHeader title={org.organizationName} subtitle={`You are ${roleLabels[role].toLowerCase()} here.`} />
      <div className="grid gap-4 lg:grid-cols-2">
        <MyWorkSection orgId={id} onlyWhenAssigned={role !== "annotator"} />
        {can(role, "manageBilling") ? <SeatsSection orgId={id} /> : null}
        {can(role, "manageBatches") ? <BatchProgressSection orgId={id} /> : null}
        {role === "manager" ? <DocumentsByStatusSection orgId={id} corpora={firstCorpora} /> : null}
        {role === "manager" ? <AgreementTrendSection orgId={id} batches={batches.data?.pages[0]?.items ?? []} /> : null}
        {can(role, "train") ? <TrainingSection orgId={id} corpora={firstCorpora} /> : null}
        {can(role, "viewAudit") ? <RecentAuditSection orgId={id} /> : null}
      </div>
      <p className="mt-8 max-w-3xl text-xs text-ink-500">
        Documents may hold personal data: handle them under your organization's rules. Tagger output is a suggestion with a confidence, not an
        authoritative label; for clinical or legal use follow your organization's own rules and licensed practice.
      </p>
    </div>
  );
}
