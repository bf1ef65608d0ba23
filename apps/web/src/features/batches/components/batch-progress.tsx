import { type BatchDetail, assignmentStateLabels } from "@tagloom/contracts";
import { Link } from "react-router";
import { cn } from "@/lib/cn";
import { ProgressBar } from "./progress-bar";

/** Progress per annotator: assignments by state. */
export function AnnotatorProgress({ batch }: { batch: BatchDetail }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-100 bg-white">
      <table className="w-full text-sm">
        <caption className="sr-only">Progress per annotator</caption>
        <thead className="border-b border-ink-100 bg-ink-50/60 text-xs tracking-wide text-ink-500 uppercase">
          <tr>
            <th scope="col" className="px-4 py-2 text-left">Annotator</th>
            <th scope="col" className="px-4 py-2 text-right">Not started</th>
            <th scope="col" className="px-4 py-2 text-right">In progress</th>
            <th scope="col" className="px-4 py-2 text-right">Sent back</th>
            <th scope="col" className="px-4 py-2 text-right">Submitted</th>
            <th scope="col" className="px-4 py-2 text-right">Accepted</th>
            <th scope="col" className="px-4 py-2 text-left">Progress</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-50">
          {batch.annotators.map((a) => (
            <tr key={a.userId}>
              <th scope="row" className="px-4 py-2 text-left font-medium text-ink-800">
                {a.name} <span className="block text-xs font-normal text-ink-500">{a.email}</span>
              </th>
              <td className="px-4 py-2 text-right tabular-nums">{a.assignments.open}</td>
              <td className="px-4 py-2 text-right tabular-nums">{a.assignments.in_progress}</td>
              <td className="px-4 py-2 text-right tabular-nums">{a.assignments.returned}</td>
              <td className="px-4 py-2 text-right tabular-nums">{a.assignments.submitted}</td>
              <td className="px-4 py-2 text-right tabular-nums">{a.assignments.accepted}</td>
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

const stateTone: Record<string, string> = {
  open: "bg-ink-50 text-ink-500",
  in_progress: "bg-thread-100 text-thread-700",
  returned: "bg-rust-500/10 text-rust-500",
  submitted: "bg-ink-100 text-ink-800",
  accepted: "bg-moss-500/15 text-moss-500",
};

/** Every document of the batch with each annotator's state, and a link to review it once work is in. */
export function BatchDocuments({ batch, reviewLink }: { batch: BatchDetail; reviewLink: (documentId: string) => string }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-100 bg-white">
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
                  {d.title} <span className="block text-xs font-normal text-ink-500">{d.tokenCount.toLocaleString("en")} words</span>
                </th>
                <td className="px-4 py-2">
                  <ul className="flex flex-wrap gap-1.5">
                    {d.assignments.map((a) => (
                      <li key={a.id} className={cn("rounded-full px-2 py-0.5 text-xs", stateTone[a.state])}>
                        {a.annotatorName}: {assignmentStateLabels[a.state]}
                      </li>
                    ))}
                  </ul>
                </td>
                <td className="px-4 py-2">
                  {settled ? (
                    <span className="text-xs font-medium text-moss-500">Gold</span>
                  ) : submitted ? (
                    <Link to={reviewLink(d.documentId)} className="text-sm font-medium text-ink-700 underline">
                      Review{d.assignments.length > 1 ? ` (${submitted} of ${d.assignments.length} in)` : ""}
                    </Link>
                  ) : (
                    <span className="text-xs text-ink-300">Waiting</span>
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
