import { type RunStatus, runStatusLabels } from "./training";
import type { InvitationStatus } from "./accounts";
import type { AssignmentCounts, AssignmentState } from "./annotation";
import type { FileState } from "./documents";
import type { AnnotationStatus, DocumentSplit } from "./spans";

/**
 * Every state the screens show, with its one label and its tone, in one place: a state has the
 * same words on every screen (documents table, batch picker, batch page, queue, review). Tones
 * are meanings, not colours; the web app maps them to its palette.
 */
export type StateTone = "idle" | "active" | "waiting" | "done" | "problem";
export type StateInfo = { label: string; tone: StateTone; hint: string };

/** A document's annotation status in its corpus. */
export const annotationStatusStates: Record<AnnotationStatus, StateInfo> = {
  none: { label: "Not annotated", tone: "idle", hint: "In no batch yet." },
  in_progress: { label: "In a batch", tone: "active", hint: "Given to annotators; their work is not all in." },
  submitted: { label: "Submitted", tone: "waiting", hint: "Annotators have submitted; waiting for review." },
  gold: { label: "Gold", tone: "done", hint: "Accepted spans, used for training and evaluation." },
};

/** One annotator on one document of a batch. */
export const assignmentStateStates: Record<AssignmentState, StateInfo> = {
  open: { label: "Not started", tone: "idle", hint: "Assigned; no spans saved yet." },
  in_progress: { label: "In progress", tone: "active", hint: "The annotator has saved work." },
  submitted: { label: "Submitted", tone: "waiting", hint: "Handed in; waiting for review." },
  accepted: { label: "Accepted", tone: "done", hint: "Accepted as gold." },
  returned: { label: "Sent back", tone: "problem", hint: "The reviewer asked for changes." },
};

/** Plain names of the assignment states for screens. */
export const assignmentStateLabels: Record<AssignmentState, string> = labelsOf(assignmentStateStates);
/** Plain names of a document's annotation status for screens. */
export const annotationStatusLabels: Record<AnnotationStatus, string> = labelsOf(annotationStatusStates);

/** An uploaded file on its way to becoming documents. */
export const fileStateStates: Record<FileState, StateInfo> = {
  queued: { label: "Waiting", tone: "idle", hint: "Stored; waiting for a worker to read it." },
  processing: { label: "Reading", tone: "active", hint: "A worker is extracting its text." },
  ready: { label: "Imported", tone: "done", hint: "Its documents are in the corpus." },
  failed: { label: "Refused", tone: "problem", hint: "It could not be imported; see why." },
};
export const fileStateLabels: Record<FileState, string> = labelsOf(fileStateStates);

export const batchStates = ["not_started", "under_way", "to_review", "done"] as const;
export type BatchState = (typeof batchStates)[number];

/** A batch as a whole, derived from its assignments' states. */
export const batchStateStates: Record<BatchState, StateInfo> = {
  not_started: { label: "Not started", tone: "idle", hint: "No annotator has saved work yet." },
  under_way: { label: "Under way", tone: "active", hint: "Annotators are working." },
  to_review: { label: "To review", tone: "waiting", hint: "All work is in; some is waiting for review." },
  done: { label: "Done", tone: "done", hint: "Every assignment is accepted." },
};

/** Where a batch stands: done when all accepted, to review when nothing is left with annotators. */
export function batchStateOf(counts: AssignmentCounts): BatchState {
  if (counts.total > 0 && counts.accepted === counts.total) return "done";
  const withAnnotators = counts.open + counts.in_progress + counts.returned;
  if (withAnnotators === 0 && counts.submitted > 0) return "to_review";
  if (counts.in_progress + counts.submitted + counts.accepted + counts.returned > 0) return "under_way";
  return "not_started";
}

export const invitationStatusStates: Record<InvitationStatus, StateInfo> = {
  pending: { label: "Waiting", tone: "waiting", hint: "Sent; not used yet." },
  accepted: { label: "Joined", tone: "done", hint: "The invited person joined." },
  revoked: { label: "Withdrawn", tone: "idle", hint: "Withdrawn by an admin." },
  expired: { label: "Expired", tone: "problem", hint: "Not used in time." },
};

export const splitLabels: Record<DocumentSplit | "none", string> = { train: "Train", test: "Test", none: "No split" };

function labelsOf<K extends string>(states: Record<K, StateInfo>): Record<K, string> {
  return Object.fromEntries(Object.entries<StateInfo>(states).map(([k, v]) => [k, v.label])) as Record<K, string>;
}

/** "1 span", "3 spans", "1,204 documents": a count with its noun (plural by adding "s" unless given). */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${n.toLocaleString("en")} ${n === 1 ? singular : plural}`;
}

/** A training run, with the one set of words from `runStatusLabels`. */
export const runStatusStates: Record<RunStatus, StateInfo> = {
  queued: { label: runStatusLabels.queued, tone: "idle", hint: "Queued; a worker picks it up soon." },
  running: { label: runStatusLabels.running, tone: "active", hint: "A worker is training; the stage shows how far it is." },
  succeeded: { label: runStatusLabels.succeeded, tone: "done", hint: "Finished; its tagger and evaluation are stored." },
  failed: { label: runStatusLabels.failed, tone: "problem", hint: "Stopped with an error; the run says why." },
  cancelled: { label: runStatusLabels.cancelled, tone: "waiting", hint: "Cancelled by a data lead; no tagger was stored." },
};
