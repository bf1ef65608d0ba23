import { type ReviewListItem, assignmentStateLabels } from "@tagloom/contracts";
import { Link } from "react-router";

/** Documents with submitted work, grouped by batch; each links to its review. */
export function ReviewList({ items, linkTo }: { items: ReviewListItem[]; linkTo: (item: ReviewListItem) => string }) {
  return (
    <div role="region" aria-label="Work to review" tabIndex={0} className="overflow-x-auto rounded-lg border border-ink-100 bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink-500">
      <table className="w-full text-sm">
        <caption className="sr-only">Work to review</caption>
        <thead className="border-b border-ink-100 bg-ink-50/60 text-xs tracking-wide text-ink-500 uppercase">
          <tr>
            <th scope="col" className="px-4 py-2 text-left">Document</th>
            <th scope="col" className="px-4 py-2 text-left">Batch</th>
            <th scope="col" className="px-4 py-2 text-left">Annotators</th>
            <th scope="col" className="px-4 py-2 text-left" />
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-50">
          {items.map((i) => (
            <tr key={`${i.batchId}/${i.documentId}`}>
              <th scope="row" className="px-4 py-2 text-left font-medium text-ink-800">{i.documentTitle}</th>
              <td className="px-4 py-2 text-ink-700">{i.batchName}</td>
              <td className="px-4 py-2 text-ink-700">{i.assignments.map((a) => `${a.annotatorName} (${assignmentStateLabels[a.state].toLowerCase()})`).join(", ")}</td>
              <td className="px-4 py-2">
                <Link to={linkTo(i)} className="font-medium text-ink-700 underline">
                  {i.ready ? "Review" : "Look"}
                </Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
