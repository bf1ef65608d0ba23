import { makeDocx } from "../../../api/test/support/files/docx";
import { makePdf } from "../../../api/test/support/files/pdf";

// The documents of the full journey. Every person, place and company is invented from syllables.
const FIRST = ["Mira", "Tobin", "Orla", "Edda", "Jory", "Wren", "Tamsin", "Idris", "Corin", "Nessa"];
const LAST = ["Quell", "Vale", "Finch", "Rusk", "Ashby", "Brannock", "Odalsby", "Fenmoor", "Sorrel", "Dunmere"];
const PLACES = ["Lowmere", "Gullhaven", "Saltmarsh", "Cindral", "Ostbury", "Varlmoor", "Pennick"];
const ORGS = ["Corran Line", "Ostrandel Freight", "Quillmark Holdings", "Fernhollow Trust", "Brackenfold Ltd"];
const TEMPLATES = [
  "{PERSON} met {PERSON} at {PLACE} on Tuesday.",
  "{PERSON} of {ORG} signed for the crates in {PLACE}.",
  "{ORG} sent a barge from {PLACE} to {PLACE}.",
  "The quay was quiet all week.",
  "A letter from {PERSON} reached {ORG} late.",
];

export type GoldLine = { title: string; text: string; split: "train" | "test"; spans: Array<{ start: number; end: number; type: string }> };

/** mulberry32, a small seeded generator (common practice) so the documents are the same every run. */
function rng(seed: number): (n: number) => number {
  let a = seed >>> 0;
  return (n) => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return Math.floor((((t ^ (t >>> 14)) >>> 0) / 4294967296) * n);
  };
}

/** `count` gold dock reports of four sentences, every fourth one in the test split. */
export function goldReports(count: number, seed = 11): GoldLine[] {
  const next = rng(seed);
  const pick = <T>(xs: readonly T[]) => xs[next(xs.length)]!;
  const out: GoldLine[] = [];
  for (let d = 0; d < count; d++) {
    let text = "";
    const spans: GoldLine["spans"] = [];
    for (let s = 0; s < 4; s++) {
      if (text) text += " ";
      for (const part of pick(TEMPLATES).split(/(\{[A-Z]+\})/)) {
        const m = /^\{([A-Z]+)\}$/.exec(part);
        if (!m) {
          text += part;
          continue;
        }
        const type = m[1]!;
        const name = type === "PERSON" ? `${pick(FIRST)} ${pick(LAST)}` : type === "PLACE" ? pick(PLACES) : pick(ORGS);
        spans.push({ start: text.length, end: text.length + name.length, type });
        text += name;
      }
    }
    out.push({ title: `Dock report ${String(d + 1).padStart(2, "0")}`, text, split: d % 4 === 3 ? "test" : "train", spans });
  }
  return out;
}

/**
 * The note both annotators mark (uploaded as .txt). Tokens: Mira0 Quell1 met2 Tobin3 Vale4 at5
 * Lowmere6 on7 Tuesday8 .9 Orla10 Finch11 of12 Corran13 Line14 signed15 for16 the17 crates18 in19
 * Gullhaven20 .21
 */
export const NOTE_TEXT = "Mira Quell met Tobin Vale at Lowmere on Tuesday. Orla Finch of Corran Line signed for the crates in Gullhaven.";

export type JourneyFile = { name: string; title: string; content: Buffer };

/** The .txt, .pdf and .docx the manager uploads, and the gold reports as JSONL. */
export function journeyFiles(goldCount = 40): { note: JourneyFile; minutes: JourneyFile; lease: JourneyFile; gold: JourneyFile } {
  return {
    note: { name: "quay-note.txt", title: "quay-note", content: Buffer.from(NOTE_TEXT, "utf8") },
    minutes: {
      name: "board-minutes.pdf",
      title: "board-minutes",
      content: makePdf([["Minutes of the quay board at Saltmarsh.", "Present: Edda Rusk and Jory Ashby of Fernhollow Trust."]]),
    },
    lease: {
      name: "berth-lease.docx",
      title: "berth-lease",
      content: makeDocx(["Tamsin Odalsby of Ostrandel Freight leased a berth in Gullhaven.", "Wren Finch signed for Corran Line at Lowmere."]),
    },
    gold: {
      name: "dock-reports.jsonl",
      title: "dock-reports",
      content: Buffer.from(goldReports(goldCount).map((g) => JSON.stringify(g)).join("\n"), "utf8"),
    },
  };
}

/** A text for the tagging API, in the same invented world. */
export const API_TEXT = "Corin Vale of Brackenfold Ltd sent a barge from Pennick to Ostbury.";
