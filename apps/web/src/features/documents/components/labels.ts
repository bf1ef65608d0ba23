import type { AnnotationStatus, DocumentSplit } from "@tagloom/contracts";

export const statusLabels: Record<AnnotationStatus, string> = { none: "Not annotated", in_progress: "In progress", submitted: "Submitted", gold: "Gold" };
export const splitLabels: Record<DocumentSplit | "none", string> = { train: "Train", test: "Test", none: "—" };
