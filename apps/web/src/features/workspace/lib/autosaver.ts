import type { AssignmentState, SaveAssignmentInput, SaveAssignmentResult, StaleVersionDetails } from "@tagloom/contracts";
import { ApiError } from "@/lib/api-client";
import type { AnnotationStore, Snapshot } from "./annotation-store";
import { type Conflict, rebase } from "./rebase";

export type SaveStatus =
  | { kind: "saved"; at: number | null }
  | { kind: "unsaved" }
  | { kind: "saving" }
  | { kind: "retrying"; retryAt: number; reason: string }
  | { kind: "failed"; reason: string }
  | { kind: "locked"; reason: string };

export type ConflictReport = { id: number; reapplied: number; conflicts: Conflict[]; version: number };

type Options = {
  store: AnnotationStore;
  version: number;
  save: (body: SaveAssignmentInput) => Promise<SaveAssignmentResult>;
  /** Wait for a pause this long before saving (ms)... */
  debounceMs?: number;
  /** ...but save no later than this after the first unsaved change (ms). */
  maxWaitMs?: number;
  /** Called when the assignment's state changes on the server (e.g. submitted elsewhere). */
  onStateChange?: (state: AssignmentState) => void;
};

const BACKOFF_MS = [1000, 2000, 4000, 8000, 15000];

/**
 * Saves the store's work shortly after each change, naming the version it started from. A stale
 * version (409) loads the newer one and re-applies the unsaved changes onto it, reporting any
 * that conflict; network and server faults retry with backoff (and at once when the browser is
 * back online); other refusals stop and say why.
 */
export class Autosaver {
  status: SaveStatus = { kind: "saved", at: null };
  conflict: ConflictReport | null = null;
  version: number;

  private readonly store: AnnotationStore;
  private readonly saveFn: Options["save"];
  private readonly debounceMs: number;
  private readonly maxWaitMs: number;
  private readonly onStateChange: Options["onStateChange"];
  private base: Snapshot;
  private savedStoreVersion: number;
  private firstUnsavedAt: number | null = null;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private inFlight: Promise<void> | null = null;
  private attempts = 0;
  private conflictId = 0;
  private readonly listeners = new Set<() => void>();
  private readonly onOnline = () => {
    if (this.status.kind === "retrying") this.saveSoon(0);
  };

  constructor(options: Options) {
    this.store = options.store;
    this.saveFn = options.save;
    this.version = options.version;
    this.debounceMs = options.debounceMs ?? 800;
    this.maxWaitMs = options.maxWaitMs ?? 1000;
    this.onStateChange = options.onStateChange;
    this.base = options.store.snapshot;
    this.savedStoreVersion = options.store.version;
    options.store.onEdit = () => this.changed();
    if (typeof window !== "undefined") window.addEventListener("online", this.onOnline);
  }

  dispose(): void {
    if (this.timer) clearTimeout(this.timer);
    this.store.onEdit = null;
    if (typeof window !== "undefined") window.removeEventListener("online", this.onOnline);
  }

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };
  getStatus = (): SaveStatus => this.status;
  getConflict = (): ConflictReport | null => this.conflict;

  /** True while some change is not on the server yet. */
  get dirty(): boolean {
    return this.store.version !== this.savedStoreVersion || this.inFlight !== null;
  }

  dismissConflict(): void {
    this.conflict = null;
    this.emit();
  }

  /** Saves now (retrying included) and resolves once everything is saved; rejects when it cannot be. */
  async flush(): Promise<void> {
    for (let round = 0; round < 5; round++) {
      if (this.inFlight) await this.inFlight;
      if (this.store.version === this.savedStoreVersion) return;
      if (this.status.kind === "failed" || this.status.kind === "locked") throw new Error(this.status.reason);
      await this.saveNow();
      if (this.status.kind === "retrying") throw new Error(this.status.reason);
    }
  }

  /** Tries again at once (the "Retry now" button). */
  retry(): void {
    this.attempts = 0;
    this.saveSoon(0);
  }

  private changed(): void {
    if (this.status.kind === "locked") return;
    this.firstUnsavedAt ??= Date.now();
    if (this.status.kind !== "retrying" && this.status.kind !== "saving") this.setStatus({ kind: "unsaved" });
    if (this.status.kind === "retrying") return;
    const wait = Math.min(this.debounceMs, Math.max(0, this.firstUnsavedAt + this.maxWaitMs - Date.now()));
    this.saveSoon(wait);
  }

  private saveSoon(ms: number): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.saveNow();
    }, ms);
  }

  private saveNow(): Promise<void> {
    if (this.inFlight) return this.inFlight;
    if (this.store.version === this.savedStoreVersion) {
      this.setStatus({ kind: "saved", at: Date.now() });
      return Promise.resolve();
    }
    this.inFlight = this.attempt().finally(() => {
      this.inFlight = null;
      // Changes made while this save was going may have had their timer fire into it (and find it
      // in flight): schedule them now, or they would wait for the next edit.
      const settled = this.status.kind === "saved" || this.status.kind === "unsaved";
      if (settled && this.store.version !== this.savedStoreVersion) this.changed();
    });
    return this.inFlight;
  }

  private async attempt(): Promise<void> {
    const sentVersion = this.store.version;
    const sent = this.store.snapshot;
    this.setStatus({ kind: "saving" });
    try {
      const res = await this.saveFn({ version: this.version, spans: [...sent.spans], dismissedSuggestions: [...sent.dismissed] });
      this.version = res.version;
      this.onStateChange?.(res.state);
      this.base = sent;
      this.savedStoreVersion = sentVersion;
      this.attempts = 0;
      this.firstUnsavedAt = this.store.version === sentVersion ? null : Date.now();
      this.setStatus(this.store.version === sentVersion ? { kind: "saved", at: Date.now() } : { kind: "unsaved" });
    } catch (err) {
      this.failed(err);
    }
  }

  private failed(err: unknown): void {
    if (err instanceof ApiError && err.status === 409 && err.code === "stale_version") {
      this.reloadNewer(err.details as StaleVersionDetails);
      return;
    }
    if (err instanceof ApiError && err.status === 409 && err.code === "assignment_locked") {
      const details = err.details as StaleVersionDetails;
      this.store.setReadOnly(true);
      this.setStatus({ kind: "locked", reason: "This assignment was submitted elsewhere; it is read-only now. Your last changes were not saved." });
      this.onStateChange?.(details.state);
      return;
    }
    const transient = !(err instanceof ApiError) || err.status === 0 || err.status >= 500 || err.status === 429;
    if (transient) {
      const delay = BACKOFF_MS[Math.min(this.attempts, BACKOFF_MS.length - 1)]!;
      this.attempts++;
      const reason = err instanceof ApiError && err.status === 0 ? "You seem to be offline." : "The server could not save just now.";
      this.setStatus({ kind: "retrying", retryAt: Date.now() + delay, reason });
      this.saveSoon(delay);
      return;
    }
    this.setStatus({ kind: "failed", reason: err instanceof Error ? err.message : "The changes could not be saved." });
  }

  /** The server has a newer version: load it and re-apply the unsaved changes onto it. */
  private reloadNewer(details: StaleVersionDetails): void {
    const theirs: Snapshot = { spans: details.spans, dismissed: details.dismissedSuggestions };
    const { merged, conflicts, reapplied } = rebase(this.base, this.store.snapshot, theirs);
    this.version = details.version;
    this.base = theirs;
    this.store.replace(theirs);
    this.savedStoreVersion = this.store.version;
    this.conflict = { id: ++this.conflictId, reapplied, conflicts, version: details.version };
    this.setStatus({ kind: "saved", at: Date.now() });
    if (reapplied > 0) this.store.commitSnapshot(merged);
    this.emit();
  }

  private setStatus(status: SaveStatus): void {
    this.status = status;
    this.emit();
  }

  private emit(): void {
    for (const l of this.listeners) l();
  }
}
