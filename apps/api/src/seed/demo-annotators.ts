import type { Rng } from "@tagloom/tagger";
import type { DemoSpan } from "./demo-corpus";

/**
 * What one simulated annotator marks in a document, given the answer key: a careful one misses a
 * span now and then; a hasty one also misses dates, drops a company's legal suffix from the span
 * and reads a place as a party now and then. That gives the review screen and the agreement
 * figures realistic disagreements to show.
 */
export function simulateAnnotator(text: string, key: readonly DemoSpan[], style: "careful" | "hasty", rng: Rng, coverage = 1): DemoSpan[] {
  const out: DemoSpan[] = [];
  const limit = Math.ceil(key.length * coverage);
  for (const span of key.slice(0, limit)) {
    if (rng.next() < (style === "careful" ? 0.03 : 0.06)) continue;
    if (style === "hasty" && span.type === "DATE" && rng.next() < 0.2) continue;
    const covered = text.slice(span.start, span.end);
    const lastSpace = covered.lastIndexOf(" ");
    if (style === "hasty" && span.type === "PARTY" && lastSpace > 0 && /^(Ltd|Co|Mills|Freight)$/.test(covered.slice(lastSpace + 1)) && rng.next() < 0.5) {
      out.push({ ...span, end: span.start + lastSpace });
      continue;
    }
    if (style === "hasty" && span.type === "PLACE" && rng.next() < 0.1) {
      out.push({ ...span, type: "PARTY" });
      continue;
    }
    out.push(span);
  }
  return out;
}
