import type { AnnotationStore } from "./annotation-store";

/** What the text view offers the keys besides the store's own commands. */
export type KeyActions = {
  openMenu: () => void;
  toggleHelp: () => void;
  showGuideline: (typeName: string) => void;
};

type KeyLike = Pick<KeyboardEvent, "key" | "code" | "shiftKey" | "ctrlKey" | "metaKey" | "altKey">;

/** The key as typed without Shift: "KeyP" → "p", "Digit3" → "3". */
export function baseKey(e: KeyLike): string {
  if (/^Key[A-Z]$/.test(e.code)) return e.code.slice(3).toLowerCase();
  if (/^Digit[0-9]$/.test(e.code)) return e.code.slice(5);
  return e.key.length === 1 ? e.key.toLowerCase() : e.key;
}

/**
 * The workspace's keys (listed on screen by KEY_HELP). Returns true when the key was used, so the
 * caller can stop the browser's own handling (scrolling, going back).
 */
export function handleWorkspaceKey(e: KeyLike, store: AnnotationStore, actions: KeyActions): boolean {
  const mod = e.ctrlKey || e.metaKey;
  if (mod && !e.altKey) {
    const k = baseKey(e);
    if (k === "z" && !e.shiftKey) {
      store.undo();
      return true;
    }
    if ((k === "z" && e.shiftKey) || k === "y") {
      store.redo();
      return true;
    }
    return false;
  }
  if (e.altKey) return false;
  switch (e.key) {
    case "ArrowLeft":
      store.moveCursorBy(-1, e.shiftKey);
      return true;
    case "ArrowRight":
      store.moveCursorBy(1, e.shiftKey);
      return true;
    case "ArrowUp":
      store.moveRows(-1, e.shiftKey);
      return true;
    case "ArrowDown":
      store.moveRows(1, e.shiftKey);
      return true;
    case "Home":
      store.moveToRowEdge("start", e.shiftKey);
      return true;
    case "End":
      store.moveToRowEdge("end", e.shiftKey);
      return true;
    case "Escape":
      store.clearSelection();
      return true;
    case "Enter": {
      const suggestion = store.anchor === null ? store.suggestionAtToken(store.cursor) : null;
      if (suggestion) store.acceptSuggestions([suggestion]);
      else actions.openMenu();
      return true;
    }
    case "Delete":
    case "Backspace":
      store.removeAtCursor();
      return true;
    case "]":
      store.jumpToSuggestion(1);
      return true;
    case "[":
      store.jumpToSuggestion(-1);
      return true;
    case "?":
      actions.toggleHelp();
      return true;
  }
  const type = store.typeByKey.get(baseKey(e));
  if (!type) return false;
  if (e.shiftKey) actions.showGuideline(type.name);
  else store.label(type.name);
  return true;
}

/** The key list shown beside the text. */
export const KEY_HELP: Array<[string, string]> = [
  ["← →", "previous / next word"],
  ["Shift + ← →", "stretch the selection"],
  ["↑ ↓", "previous / next paragraph"],
  ["Home End", "start / end of the paragraph"],
  ["type key", "mark the selection (or retype the span under the cursor)"],
  ["Enter", "choose a type from a menu; on a suggestion: accept it"],
  ["Delete", "remove the span; on a suggestion: reject it"],
  ["[ ]", "previous / next suggestion"],
  ["Esc", "clear the selection"],
  ["Ctrl Z / Ctrl Shift Z", "undo / redo"],
  ["Shift + type key", "that type's guideline"],
  ["?", "all keys and guidelines"],
];
