import { type BatchDetail, annotationStatusStates, assignmentStateLabels, assignmentStateStates, assignmentStates, countOf } from "@tagloom/contracts";
import { Link } from "react-router";
import { StateBadge } from "@/components/ui/state-badge";
import { ProgressBar } from "./progress-bar";
import { UserText } from "@/components/ui/user-text";

/** Progress per annotator: assignments by state. */
export function AnnotatorProgress({ batch }: { batch: BatchDetail }) {
  return (
    <div role="region" aria-label="Progress per annotator" tabIndex={0} className="overflow-x-auto rounded-lg border border-ink-100 bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink-500">
      <table className="w-full text-sm">
        <caption className="sr-only">Progress per annotator</caption>
        <thead className="border-b border-ink-100 bg-ink-50/60 text-xs tracking-wide text-ink-500 uppercase">
          <tr>
            <th scope="col" className="px-4 py-2 text-left">Annotator</th>
            {assignmentStates.map((s) => (
              <th key={s} scope="col" className="px-4 py-2 text-right">
                {assignmentStateLabels[s]}
              </th>
            ))}
            <th scope="col" className="px-4 py-2 text-left">Progress</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-50">
          {batch.annotators.map((a) => (
            <tr key={a.userId}>
              <th scope="row" className="px-4 py-2 text-left font-medium text-ink-800">
                {a.name} <span className="block text-xs font-normal text-ink-500">{a.email}</span>
              </th>
              {assignmentStates.map((s) => (
                <td key={s} className="px-4 py-2 text-right tabular-nums">
                  {a.assignments[s]}
                </td>
              ))}
              <td className="px-4 py-2">
                <ProgressBar counts={a.assignments} label={a.name} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}


/** Every document of the batch with each annotator's state, and a link to review it once work is in. */
export function BatchDocuments({ batch, reviewLink }: { batch: BatchDetail; reviewLink: (documentId: string) => string }) {
  return (
    <div role="region" aria-label="Documents of the batch" tabIndex={0} className="overflow-x-auto rounded-lg border border-ink-100 bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink-500">
      <table className="w-full text-sm">
        <caption className="sr-only">Documents of the batch</caption>
        <thead className="border-b border-ink-100 bg-ink-50/60 text-xs tracking-wide text-ink-500 uppercase">
          <tr>
            <th scope="col" className="px-4 py-2 text-left">Document</th>
            <th scope="col" className="px-4 py-2 text-left">Annotators</th>
            <th scope="col" className="px-4 py-2 text-left">Review</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-50">
          {batch.documents.map((d) => {
            const submitted = d.assignments.filter((a) => a.state === "submitted").length;
            const settled = d.assignments.every((a) => a.state === "accepted");
            return (
              <tr key={d.documentId}>
                <th scope="row" className="px-4 py-2 text-left font-medium text-ink-800">
                  <UserText>{d.title}</UserText> <span className="block text-xs font-normal text-ink-500">{countOf(d.tokenCount, "word")}</span>
                </th>
                <td className="px-4 py-2">
                  <ul className="flex flex-wrap gap-1.5">
                    {d.assignments.map((a) => (
                      <li key={a.id}>
                        <StateBadge state={assignmentStateStates[a.state]} prefix={a.annotatorName} />
                      </li>
                    ))}
                  </ul>
                </td>
                <td className="px-4 py-2">
                  {settled ? (
                    <StateBadge state={annotationStatusStates.gold} />
                  ) : submitted ? (
                    <Link to={reviewLink(d.documentId)} className="text-sm font-medium text-ink-700 underline">
                      Review{d.assignments.length > 1 ? ` (${submitted} of ${d.assignments.length} in)` : ""}
                    </Link>
                  ) : (
                    <span className="text-xs text-ink-500">Waiting</span>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
