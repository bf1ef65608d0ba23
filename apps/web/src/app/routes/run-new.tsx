import { can } from "@tagloom/contracts";
import { Link, useNavigate, useParams } from "react-router";
import { Notice } from "@/components/ui/card";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useStartRun } from "@/features/training/api/start-run";
import { RunForm, errorsFromApi } from "@/features/training/components/run-form";

/** The training-run form: the engine's defaults, each setting changeable, checked before it is sent. */
export function RunNewRoute() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const orgId = org.organizationId;
  const start = useStartRun(orgId, corpusId);
  const navigate = useNavigate();
  const toast = useToast();
  if (!can(org.role, "train")) return <Notice tone="warn">Only data leads and admins start training runs.</Notice>;
  return (
    <div className="max-w-4xl space-y-4">
      <p className="text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.org.corpusTraining.build(orgId, corpusId)}>
          ← Training
        </Link>
      </p>
      <h2 className="text-lg font-semibold text-ink-900">New training run</h2>
      <p className="text-sm text-ink-600">
        Every setting starts at the engine's default, the one its own cross-validation chose. Starting with nothing changed trains with those defaults.
      </p>
      <RunForm
        busy={start.isPending}
        onSubmit={async (input) => {
          try {
            const run = await start.mutateAsync(input);
            toast.show(`Run ${run.number} queued.`, "success");
            navigate(paths.org.run.build(orgId, corpusId, run.id));
            return null;
          } catch (err) {
            return errorsFromApi(err);
          }
        }}
      />
    </div>
  );
}
