import { useSyncExternalStore } from "react";
import type { AnnotationStore } from "../lib/annotation-store";
import type { Autosaver, ConflictReport, SaveStatus } from "../lib/autosaver";

/** Re-renders when the spans change. */
export function useSpansVersion(store: AnnotationStore): number {
  return useSyncExternalStore(store.subscribe, () => store.version);
}

/** Re-renders when the cursor, the selection or the store's message change. */
export function useUiVersion(store: AnnotationStore): number {
  return useSyncExternalStore(store.subscribe, () => store.uiVersion);
}

const idle = () => () => undefined;
const savedStatus: SaveStatus = { kind: "saved", at: null };

export function useSaveStatus(saver: Autosaver | null): SaveStatus {
  return useSyncExternalStore(saver?.subscribe ?? idle, () => saver?.getStatus() ?? savedStatus);
}

export function useConflict(saver: Autosaver | null): ConflictReport | null {
  return useSyncExternalStore(saver?.subscribe ?? idle, () => saver?.getConflict() ?? null);
}
