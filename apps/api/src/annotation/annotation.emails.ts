import { env } from "@/config/env";
import { type EmailContent, composeEmail } from "@/mail/templates";

function formatDay(day: string): string {
  return new Date(`${day}T00:00:00Z`).toLocaleDateString("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });
}

/** The one message an assignee gets for a new batch: how much, by when, and a link to their queue. */
export function batchAssignedEmail(input: {
  organizationId: string;
  batchName: string;
  corpusName: string;
  documents: number;
  dueDate: string | null;
  assignedBy: string;
}): EmailContent {
  const what = input.documents === 1 ? "1 document" : `${input.documents} documents`;
  return composeEmail(
    `New batch to annotate: ${input.batchName}`,
    [
      `${input.assignedBy} gave you ${what} to annotate in the batch "${input.batchName}" of the corpus "${input.corpusName}".`,
      input.dueDate ? `Please finish by ${formatDay(input.dueDate)}.` : "The batch has no due date.",
    ],
    { label: "Open my queue", url: `${env.publicUrl}/o/${input.organizationId}/queue` },
  );
}

/** Tells an annotator that a reviewer sent their assignment back, with the reviewer's comment. */
export function assignmentReturnedEmail(input: {
  organizationId: string;
  corpusId: string;
  assignmentId: string;
  documentTitle: string;
  batchName: string;
  comment: string;
  reviewer: string;
}): EmailContent {
  return composeEmail(
    `Sent back for changes: ${input.documentTitle}`,
    [
      `${input.reviewer} sent your work on "${input.documentTitle}" (batch "${input.batchName}") back for changes.`,
      `Their comment: ${input.comment}`,
      "Open the document, make the changes and submit it again.",
    ],
    { label: "Open the document", url: `${env.publicUrl}/o/${input.organizationId}/corpora/${input.corpusId}/assignments/${input.assignmentId}` },
  );
}
