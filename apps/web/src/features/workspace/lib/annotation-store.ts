import type { AnnotatedSpan, EntityType, Span, SuggestedSpan } from "@tagloom/contracts";
import { type DocIndex, tokenRange } from "./doc-index";

export type WorkSpan = AnnotatedSpan;
/** The part of the work that is saved: the spans and the suggestions the annotator dismissed. */
export type Snapshot = { spans: readonly WorkSpan[]; dismissed: readonly Span[] };
export type Message = { id: number; tone: "info" | "warn"; text: string };

type Change = { before: Snapshot; after: Snapshot; from: number; to: number };

const HISTORY_LIMIT = 500;

export const spanKey = (s: { start: number; end: number; type: string }) => `${s.start}:${s.end}:${s.type}`;

function sortByStart<T extends { start: number; end: number }>(xs: T[]): T[] {
  return xs.sort((a, b) => a.start - b.start || a.end - b.end);
}

/**
 * The annotator's working copy of an assignment and everything the text view draws: spans,
 * dismissed suggestions, the token cursor and selection, undo and redo. Rows subscribe to their
 * own version number, so a change re-renders only the rows it touches.
 */
export class AnnotationStore {
  readonly doc: DocIndex;
  readonly types: readonly EntityType[];
  readonly typeByName: ReadonlyMap<string, EntityType>;
  readonly typeByKey: ReadonlyMap<string, EntityType>;
  readonly suggestions: readonly SuggestedSpan[];
  readOnly: boolean;
  /** Called after every change of the spans (the autosaver listens). */
  onEdit: (() => void) | null = null;

  cursor = 0;
  anchor: number | null = null;
  message: Message | null = null;
  /** Grows with every change of the spans; the side panels re-render on it. */
  version = 0;
  /** Grows with every change of the cursor, the selection or the message. */
  uiVersion = 0;

  private state: Snapshot;
  private pending: SuggestedSpan[] = [];
  private readonly suggestionKeys: string[];
  private undoStack: Change[] = [];
  private redoStack: Change[] = [];
  private readonly blockVersions: Uint32Array;
  private readonly listeners = new Set<() => void>();
  private messageId = 0;

  constructor(doc: DocIndex, types: readonly EntityType[], initial: Snapshot, suggestions: readonly SuggestedSpan[], readOnly: boolean) {
    this.doc = doc;
    this.types = [...types].sort((a, b) => a.position - b.position);
    this.typeByName = new Map(types.map((t) => [t.name, t]));
    this.typeByKey = new Map(types.filter((t) => t.hotkey).map((t) => [t.hotkey!, t]));
    this.suggestions = sortByStart([...suggestions]);
    this.suggestionKeys = this.suggestions.map(spanKey);
    this.readOnly = readOnly;
    this.state = { spans: sortByStart([...initial.spans]), dismissed: [...initial.dismissed] };
    this.blockVersions = new Uint32Array(doc.blocks.length);
    this.recomputePending();
  }

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  blockVersion(block: number): number {
    return this.blockVersions[block] ?? 0;
  }

  get snapshot(): Snapshot {
    return this.state;
  }
  get spans(): readonly WorkSpan[] {
    return this.state.spans;
  }
  /** Suggestions neither accepted nor dismissed, in text order. */
  get pendingSuggestions(): readonly SuggestedSpan[] {
    return this.pending;
  }
  get canUndo(): boolean {
    return this.undoStack.length > 0;
  }
  get canRedo(): boolean {
    return this.redoStack.length > 0;
  }

  /** The selected token range [from, to] (inclusive); one token when nothing is selected. */
  get selection(): [number, number] {
    const a = this.anchor ?? this.cursor;
    return a <= this.cursor ? [a, this.cursor] : [this.cursor, a];
  }

  selectionText(): string {
    const [a, b] = this.selection;
    return this.doc.text.slice(this.doc.starts[a], this.doc.ends[b]);
  }

  /** Spans (and, separately, pending suggestions free of human spans) that reach into a row. */
  spansInBlock(block: number): { spans: WorkSpan[]; suggestions: SuggestedSpan[] } {
    const b = this.doc.blocks[block];
    if (!b) return { spans: [], suggestions: [] };
    return { spans: overlapping(this.state.spans, b.start, b.end), suggestions: overlapping(this.pending, b.start, b.end).filter((s) => !this.overlapsSpan(s)) };
  }

  /** The human span covering a token, if any. */
  spanAtToken(t: number): WorkSpan | null {
    const offset = this.doc.starts[t];
    if (offset === undefined) return null;
    return coveringAt(this.state.spans, offset);
  }

  /** The pending suggestion drawn at a token (none where a human span is). */
  suggestionAtToken(t: number): SuggestedSpan | null {
    const offset = this.doc.starts[t];
    if (offset === undefined || this.spanAtToken(t)) return null;
    const s = coveringAt(this.pending, offset);
    return s && !this.overlapsSpan(s) ? s : null;
  }

  countsByType(): Map<string, number> {
    const counts = new Map<string, number>();
    for (const s of this.state.spans) counts.set(s.type, (counts.get(s.type) ?? 0) + 1);
    return counts;
  }

  // ---- cursor and selection ----

  moveCursor(t: number, extend = false): void {
    const n = this.doc.tokenCount;
    if (n === 0) return;
    const next = Math.max(0, Math.min(n - 1, t));
    const [oldFrom, oldTo] = this.selection;
    if (extend) this.anchor ??= this.cursor;
    else this.anchor = null;
    this.cursor = next;
    const [from, to] = this.selection;
    this.touchTokens(oldFrom, oldTo);
    this.touchTokens(from, to);
    this.uiVersion++;
    this.emit();
  }

  moveCursorBy(delta: number, extend = false): void {
    this.moveCursor(this.cursor + delta, extend);
  }

  /** Moves to the first token of the row `delta` rows away. */
  moveRows(delta: number, extend = false): void {
    const block = this.doc.blockOfToken[this.cursor] ?? 0;
    const target = this.doc.blocks[Math.max(0, Math.min(this.doc.blocks.length - 1, block + delta))];
    if (target) this.moveCursor(target.firstToken, extend);
  }

  moveToRowEdge(edge: "start" | "end", extend = false): void {
    const b = this.doc.blocks[this.doc.blockOfToken[this.cursor] ?? 0];
    if (b) this.moveCursor(edge === "start" ? b.firstToken : b.endToken - 1, extend);
  }

  /** Selects the tokens [from, to] (inclusive), cursor on `to`. */
  select(from: number, to: number): void {
    this.moveCursor(from);
    if (to !== from) this.moveCursor(to, true);
  }

  clearSelection(): void {
    if (this.anchor === null) return;
    this.moveCursor(this.cursor);
  }

  /** Moves to the next (or previous) pending suggestion after (before) the cursor. */
  jumpToSuggestion(direction: 1 | -1): void {
    const visible = this.pending.filter((s) => !this.overlapsSpan(s));
    const here = this.doc.starts[this.cursor] ?? 0;
    const target = direction > 0 ? visible.find((s) => s.start > here) : [...visible].reverse().find((s) => s.start < here);
    if (!target) {
      this.say("info", direction > 0 ? "No more suggestions after this point." : "No suggestions before this point.");
      return;
    }
    this.moveCursor(tokenRange(this.doc, target)[0]);
  }

  // ---- edits ----

  /**
   * Marks the selection as a type. A selection equal to a span (or a cursor inside one, with
   * nothing selected) changes that span's type; a selection that overlaps another span is refused.
   */
  label(typeName: string): boolean {
    if (this.refuseIfReadOnly()) return false;
    const type = this.typeByName.get(typeName);
    if (!type) return false;
    const [a, b] = this.selection;
    const start = this.doc.starts[a]!;
    const end = this.doc.ends[b]!;
    const spans = this.state.spans;
    const under = this.anchor === null ? this.spanAtToken(this.cursor) : null;
    const exact = under ?? spans.find((s) => s.start === start && s.end === end) ?? null;
    if (exact) {
      if (exact.type === typeName) {
        this.say("info", `Already ${typeName}.`);
        return false;
      }
      this.commit({ spans: spans.map((s) => (s === exact ? { ...s, type: typeName, origin: "human" } : s)), dismissed: this.state.dismissed }, exact.start, exact.end);
      this.say("info", `Changed "${this.doc.text.slice(exact.start, exact.end)}" to ${typeName}.`);
      return true;
    }
    const clash = overlapping(spans, start, end);
    if (clash.length) {
      const c = clash[0]!;
      this.say(
        "warn",
        `Spans cannot overlap: "${this.doc.text.slice(c.start, c.end)}" is already ${c.type}. Remove it first (Delete), or select exactly it to change its type.`,
      );
      return false;
    }
    // The selection becomes the span: clear it first so that one notification redraws both.
    this.anchor = null;
    this.cursor = b;
    this.uiVersion++;
    const next = [...spans];
    let i = next.length;
    while (i > 0 && next[i - 1]!.start > start) i--;
    next.splice(i, 0, { start, end, type: typeName, origin: "human" });
    this.commit({ spans: next, dismissed: this.state.dismissed }, start, end);
    return true;
  }

  /** Removes the span under the cursor, or dismisses the suggestion there. */
  removeAtCursor(): boolean {
    if (this.refuseIfReadOnly()) return false;
    const span = this.spanAtToken(this.cursor);
    if (span) return this.removeSpan(span);
    const suggestion = this.suggestionAtToken(this.cursor);
    if (suggestion) return this.rejectSuggestions([suggestion]) > 0;
    this.say("info", "There is no span here to remove.");
    return false;
  }

  removeSpan(span: WorkSpan): boolean {
    if (this.refuseIfReadOnly()) return false;
    const key = spanKey(span);
    const spans = this.state.spans.filter((s) => spanKey(s) !== key);
    if (spans.length === this.state.spans.length) return false;
    this.commit({ spans, dismissed: this.state.dismissed }, span.start, span.end);
    return true;
  }

  setSpanType(span: WorkSpan, typeName: string): boolean {
    if (this.refuseIfReadOnly() || !this.typeByName.has(typeName) || span.type === typeName) return false;
    const key = spanKey(span);
    this.commit(
      { spans: this.state.spans.map((s) => (spanKey(s) === key ? { ...s, type: typeName, origin: "human" as const } : s)), dismissed: this.state.dismissed },
      span.start,
      span.end,
    );
    return true;
  }

  /** Turns suggestions into spans (one undo step); ones that would overlap a span are skipped. Returns how many. */
  acceptSuggestions(list: readonly SuggestedSpan[], typeName?: string): number {
    if (this.refuseIfReadOnly()) return 0;
    const spans = [...this.state.spans];
    let accepted = 0;
    let skipped = 0;
    let from = Infinity;
    let to = -Infinity;
    for (const s of list) {
      if (overlapping(sortByStart(spans), s.start, s.end).length) {
        skipped++;
        continue;
      }
      spans.push({ start: s.start, end: s.end, type: typeName ?? s.type, origin: "suggested" });
      accepted++;
      from = Math.min(from, s.start);
      to = Math.max(to, s.end);
    }
    if (accepted) this.commit({ spans: sortByStart(spans), dismissed: this.state.dismissed }, from, to);
    if (skipped) this.say("warn", `${skipped} suggestion${skipped === 1 ? "" : "s"} overlap your spans and were left as they are.`);
    else if (list.length > 1) this.say("info", `Accepted ${accepted} suggestion${accepted === 1 ? "" : "s"}.`);
    return accepted;
  }

  rejectSuggestions(list: readonly SuggestedSpan[]): number {
    if (this.refuseIfReadOnly() || !list.length) return 0;
    const dismissed = [...this.state.dismissed, ...list.map(({ start, end, type }) => ({ start, end, type }))];
    this.commit({ spans: this.state.spans, dismissed }, Math.min(...list.map((s) => s.start)), Math.max(...list.map((s) => s.end)));
    if (list.length > 1) this.say("info", `Rejected ${list.length} suggestions.`);
    return list.length;
  }

  undo(): boolean {
    const change = this.undoStack.pop();
    if (!change) {
      this.say("info", "Nothing to undo.");
      return false;
    }
    this.redoStack.push(change);
    this.apply(change.before, change.from, change.to);
    return true;
  }

  redo(): boolean {
    const change = this.redoStack.pop();
    if (!change) {
      this.say("info", "Nothing to redo.");
      return false;
    }
    this.undoStack.push(change);
    this.apply(change.after, change.from, change.to);
    return true;
  }

  /** Replaces the work with another version (a newer one from the server); the history restarts. */
  replace(next: Snapshot): void {
    this.undoStack = [];
    this.redoStack = [];
    this.apply({ spans: sortByStart([...next.spans]), dismissed: [...next.dismissed] }, 0, this.doc.text.length, false);
  }

  /** Applies a change as one undoable step (e.g. re-applied work after a conflict). */
  commitSnapshot(next: Snapshot): void {
    this.commit({ spans: sortByStart([...next.spans]), dismissed: [...next.dismissed] }, 0, this.doc.text.length);
  }

  setReadOnly(readOnly: boolean): void {
    this.readOnly = readOnly;
    this.uiVersion++;
    this.emit();
  }

  say(tone: Message["tone"], text: string): void {
    this.message = { id: ++this.messageId, tone, text };
    this.uiVersion++;
    this.emit();
  }

  // ---- internals ----

  private refuseIfReadOnly(): boolean {
    if (!this.readOnly) return false;
    this.say("warn", "This assignment is read-only: it has been submitted.");
    return true;
  }

  private commit(after: Snapshot, from: number, to: number): void {
    this.undoStack.push({ before: this.state, after, from, to });
    if (this.undoStack.length > HISTORY_LIMIT) this.undoStack.shift();
    this.redoStack = [];
    this.apply(after, from, to);
  }

  private apply(next: Snapshot, from: number, to: number, edited = true): void {
    this.state = next;
    this.recomputePending();
    const [a, b] = tokenRange(this.doc, { start: from, end: Math.max(to, from + 1) });
    this.touchTokens(a, b - 1);
    this.version++;
    this.emit();
    if (edited) this.onEdit?.();
  }

  /** Keeps the same array when nothing changed, so that views of the suggestions need not re-render. */
  private recomputePending(): void {
    const decided = new Set<string>();
    for (const s of this.state.spans) decided.add(spanKey(s));
    for (const s of this.state.dismissed) decided.add(spanKey(s));
    const next: SuggestedSpan[] = [];
    let same = true;
    let j = 0;
    for (let i = 0; i < this.suggestions.length; i++) {
      if (decided.has(this.suggestionKeys[i]!)) continue;
      const s = this.suggestions[i]!;
      if (same && this.pending[j] !== s) same = false;
      next.push(s);
      j++;
    }
    if (!same || next.length !== this.pending.length) this.pending = next;
  }

  private overlapsSpan(s: { start: number; end: number }): boolean {
    return overlapping(this.state.spans, s.start, s.end).length > 0;
  }

  private touchTokens(from: number, to: number): void {
    const first = this.doc.blockOfToken[Math.max(0, from)];
    const last = this.doc.blockOfToken[Math.min(this.doc.tokenCount - 1, to)];
    if (first === undefined || last === undefined) return;
    for (let b = first; b <= last; b++) this.blockVersions[b]!++;
  }

  private emit(): void {
    for (const l of this.listeners) l();
  }
}

/** The items (sorted by start, non-overlapping or not) that share a character with [start, end). */
function overlapping<T extends { start: number; end: number }>(items: readonly T[], start: number, end: number): T[] {
  // Items may overlap each other (suggestions), so look back from the first item starting at or after `end`.
  const out: T[] = [];
  let lo = 0;
  let hi = items.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (items[mid]!.start < end) lo = mid + 1;
    else hi = mid;
  }
  const stop = lo;
  for (let i = stop - 1; i >= 0; i--) {
    const it = items[i]!;
    if (it.end > start) out.push(it);
    else if (isFlat(items)) break;
  }
  return out.reverse();
}

const flatCache = new WeakMap<object, boolean>();
function isFlat(items: readonly { start: number; end: number }[]): boolean {
  let flat = flatCache.get(items);
  if (flat === undefined) {
    flat = true;
    for (let i = 1; i < items.length; i++) if (items[i]!.start < items[i - 1]!.end) flat = false;
    flatCache.set(items, flat);
  }
  return flat;
}

function coveringAt<T extends { start: number; end: number }>(items: readonly T[], offset: number): T | null {
  return overlapping(items, offset, offset + 1)[0] ?? null;
}
