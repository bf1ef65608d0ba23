/**
 * Text the database cannot store as given. PostgreSQL refuses the NUL character (U+0000) in
 * `text` and `jsonb`, and a lone UTF-16 surrogate has no UTF-8 form (Node would silently store
 * U+FFFD instead). Both are refused at the edge with a 400 naming the field.
 */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Why a string cannot be stored, or null when it can. */
export function unstorableTextReason(s: string): string | null {
  if (s.includes("\u0000")) return "Text may not contain the NUL character (U+0000).";
  if (LONE_SURROGATE.test(s)) return "Text may not contain a lone UTF-16 surrogate (invalid Unicode).";
  return null;
}

/** Deepest JSON nesting a request may use; deeper bodies are refused before any work is done. */
export const maxJsonDepth = 32;

export type TextProblem = { path: string; message: string };

/**
 * Walks a parsed JSON value (iteratively, so a deep body cannot overflow the stack) and lists
 * strings (values and keys) the database would refuse, and nesting deeper than maxJsonDepth.
 */
export function findUnstorableText(value: unknown, root = "", maxProblems = 20): TextProblem[] {
  const problems: TextProblem[] = [];
  const stack: Array<{ v: unknown; path: string; depth: number }> = [{ v: value, path: root, depth: 0 }];
  while (stack.length && problems.length < maxProblems) {
    const { v, path, depth } = stack.pop()!;
    if (typeof v === "string") {
      const reason = unstorableTextReason(v);
      if (reason) problems.push({ path: path || "_", message: reason });
      continue;
    }
    if (v === null || typeof v !== "object") continue;
    if (depth >= maxJsonDepth) {
      problems.push({ path: path || "_", message: `Nesting deeper than ${maxJsonDepth} levels is not accepted.` });
      continue;
    }
    const entries = Array.isArray(v) ? v.map((x, i) => [String(i), x] as const) : Object.entries(v as Record<string, unknown>);
    for (const [k, x] of entries) {
      const keyReason = unstorableTextReason(k);
      const p = path ? `${path}.${k}` : k;
      if (keyReason) problems.push({ path: p.replaceAll("\u0000", "\\u0000"), message: keyReason });
      stack.push({ v: x, path: p, depth: depth + 1 });
    }
  }
  return problems;
}

/**
 * Bidirectional control characters: embeddings and overrides (U+202A–U+202E), isolates
 * (U+2066–U+2069) and the marks U+200E, U+200F, U+061C. In a file name or title they can make
 * text display reversed and reorder what stands beside it.
 */
export const BIDI_CONTROLS = /[\u202A-\u202E\u2066-\u2069\u200E\u200F\u061C]/g;

export function hasBidiControls(s: string): boolean {
  return new RegExp(BIDI_CONTROLS.source).test(s);
}

/** The text without bidirectional control characters (what names and titles show). */
export function stripBidiControls(s: string): string {
  return s.replace(BIDI_CONTROLS, "");
}
