/**
 * Readable names of the audit log's action codes. The codes stay stable in the API and the
 * database; people read these labels. A code missing here (a newer API) still reads as words.
 */
export const auditActionLabels: Record<string, string> = {
  "api_token.created": "API token created",
  "api_token.revoked": "API token revoked",
  "assignment.returned": "Work sent back",
  "assignment.submitted": "Work submitted",
  "batch.created": "Batch created",
  "billing.cancel_scheduled": "Subscription cancellation scheduled",
  "billing.checkout_paid": "Checkout paid",
  "billing.checkout_started": "Checkout started",
  "billing.payment_retried": "Payment retried",
  "billing.seats_changed": "Seats changed",
  "billing.subscription_updated": "Subscription updated",
  "corpus.archived": "Corpus archived",
  "corpus.created": "Corpus created",
  "corpus.deleted": "Corpus deleted",
  "corpus.described": "Corpus description changed",
  "corpus.exported": "Corpus exported",
  "corpus.renamed": "Corpus renamed",
  "corpus.suggester_changed": "Suggester changed",
  "document.deleted": "Document deleted",
  "document.settled": "Disagreements settled as gold",
  "documents.split_random": "Documents split at random",
  "documents.split_set": "Document split set",
  "entity_type.created": "Entity type added",
  "entity_type.deleted": "Entity type removed",
  "entity_type.renamed": "Entity type renamed",
  "invitation.created": "Invitation sent",
  "invitation.resent": "Invitation sent again",
  "invitation.revoked": "Invitation withdrawn",
  "member.joined": "Member joined",
  "member.removed": "Member removed",
  "member.role_changed": "Member's role changed",
  "organization.created": "Organization created",
  "organization.renamed": "Organization renamed",
  "tagger.downloaded": "Tagger downloaded",
  "training_run.cancelled": "Training run cancelled",
  "training_run.repeated": "Training run repeated",
  "training_run.started": "Training run started",
  "upload.created": "Files uploaded",
  "user.email_verified": "E-mail address confirmed",
  "user.password_reset": "Password reset",
  "user.signed_in": "Signed in",
  "user.signed_out": "Signed out",
  "user.signed_up": "Signed up",
};

/** The readable name of an audit action: its label, else its code in words ("tagger.deleted" → "Tagger deleted"). */
export function auditActionLabel(code: string): string {
  const known = auditActionLabels[code];
  if (known) return known;
  const words = code.replace(/[._]+/g, " ").trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}
