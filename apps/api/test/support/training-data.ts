import { createRng, tokenizeText } from "@tagloom/tagger";
import { createCorpus } from "@/corpora/corpora.service";
import { createEntityType } from "@/corpora/entity-types.service";
import { db } from "@/db/knex";
import { type NewDocument, insertDocuments } from "@/documents/documents.repository";

// Invented documents with gold spans of four entity types for training tests and benchmarks.
// Every name below is made up for Tagloom.
const PEOPLE = ["Wren Odalsby", "Tamsin Quarrow", "Idris Fenmoor", "Lio Varrick", "Maelis Oxtern", "Corin Ashgrove", "Ysolde Brack", "Pell Unwin", "Hedda Sorrel", "Bram Tollister"];
const ORGS = ["Brackenfold Ltd", "Quillmark Holdings", "Fernhollow Trust", "Saltmere Works", "Ovington Carriers", "Lindqvale Group", "Marrowby Mills"];
const PLACES = ["Lowmere", "Harrowgate Vale", "Cindral", "Ostbury", "Pennick Down", "Varl Harbour"];
const PRODUCTS = ["Glimmerpane", "Tessel Mk2", "Corvane", "Hushline", "Brightwick"];
const TEMPLATES = [
  "{PERSON} of {ORG} signed the lease in {PLACE} .",
  "The {PRODUCT} order from {ORG} arrived late .",
  "{PERSON} met {PERSON} at the {PLACE} office on Monday .",
  "Under the agreement , {ORG} will supply {PRODUCT} units to {ORG} .",
  "A notice was sent to {PERSON} about the {PLACE} depot .",
  "Payment terms were agreed between {ORG} and {PERSON} .",
  "Shipments of {PRODUCT} leave {PLACE} every week .",
  "The board thanked everyone for the quiet quarter .",
  // Slots whose type the context does not tell: the tagger has to go by the name itself.
  "A letter came from {ANY} on Friday .",
  "Everyone asked about {ANY} again .",
];
const POOLS: Record<string, string[]> = { PERSON: PEOPLE, ORG: ORGS, PLACE: PLACES, PRODUCT: PRODUCTS };
const SYLLABLES = ["dra", "ven", "ko", "lis", "mar", "tho", "qu", "ell", "ber", "sa", "nor", "wyn"];
const SUFFIXES: Record<string, string[]> = { PERSON: [""], ORG: [" Ltd", " Works", " Trust"], PLACE: ["", "ford", "mere"], PRODUCT: ["", " Mk3"] };
function inventName(type: string, k: number): string {
  const word = (n: number) => {
    let w = "";
    for (let i = 0; i < 2 + (n % 2); i++) {
      w += SYLLABLES[n % SYLLABLES.length];
      n = Math.floor(n / SYLLABLES.length);
    }
    return w.charAt(0).toUpperCase() + w.slice(1);
  };
  const suffixes = SUFFIXES[type]!;
  const base = type === "PERSON" ? `${word(k)} ${word(k >> 7)}` : word(k);
  return base + suffixes[k % suffixes.length]!;
}

export const TRAINING_TYPES = ["PERSON", "ORG", "PLACE", "PRODUCT"] as const;

export type GeneratedDocument = { title: string; text: string; spans: { start: number; end: number; type: string }[]; split: "train" | "test" | null };

/** `count` documents of about `sentences` sentences each, deterministic for a seed. */
export function generateDocuments(count: number, sentences: number, seed: number, testEvery = 4): GeneratedDocument[] {
  const rng = createRng(seed);
  const pick = <T>(list: readonly T[]) => list[rng.nextInt(list.length)]!;
  const docs: GeneratedDocument[] = [];
  for (let d = 0; d < count; d++) {
    let text = "";
    const spans: GeneratedDocument["spans"] = [];
    for (let s = 0; s < sentences; s++) {
      const template = pick(TEMPLATES);
      const parts = template.split(/(\{[A-Z]+\})/);
      for (const part of parts) {
        const m = /^\{([A-Z]+)\}$/.exec(part);
        if (m) {
          const type = m[1] === "ANY" ? TRAINING_TYPES[rng.nextInt(TRAINING_TYPES.length)]! : m[1]!;
          // A third of the names are made up on the spot from syllables, so the test split holds
          // names never seen in training and the tagger must go by word shape and suffixes.
          const name = rng.nextInt(3) === 0 ? inventName(type, rng.nextInt(1 << 20)) : pick(POOLS[type]!);
          spans.push({ start: text.length, end: text.length + name.length, type });
          text += name;
        } else text += part;
      }
      text += s + 1 < sentences ? " " : "";
    }
    docs.push({ title: `Memo ${String(d + 1).padStart(4, "0")}`, text, spans, split: testEvery > 0 && d % testEvery === testEvery - 1 ? "test" : "train" });
  }
  return docs;
}

/** A corpus with the four types and the documents stored as gold (plus `unlabelled` documents without gold). */
export async function createTrainingCorpus(
  organizationId: string,
  actor: { userId: string; email: string },
  name: string,
  docs: GeneratedDocument[],
  unlabelled: GeneratedDocument[] = [],
): Promise<{ corpusId: string; typeIds: Record<string, string>; documentIds: string[] }> {
  const corpusId = (await createCorpus(organizationId, { name }, actor)).id;
  const typeIds: Record<string, string> = {};
  for (const t of TRAINING_TYPES) typeIds[t] = (await createEntityType(organizationId, corpusId, { name: t }, actor)).id;
  const rows: NewDocument[] = [...docs, ...unlabelled].map((doc, i) => {
    const { tokens, sentences } = tokenizeText(doc.text);
    const gold = i < docs.length;
    return {
      organizationId,
      corpusId,
      uploadFileId: null,
      sourceIndex: i,
      title: doc.title,
      text: doc.text,
      contentHash: `generated-${i}`,
      split: gold ? doc.split : null,
      annotationStatus: gold ? "gold" : "none",
      tokens: { starts: tokens.map((t) => t.start), ends: tokens.map((t) => t.end), sentenceStarts: sentences.map((s) => s.start) },
      gold: gold ? { spans: doc.spans.map((s) => ({ start: s.start, end: s.end, typeId: typeIds[s.type]! })), userId: actor.userId } : undefined,
    };
  });
  const documentIds: string[] = [];
  for (let i = 0; i < rows.length; i += 500) documentIds.push(...(await db.transaction((trx) => insertDocuments(rows.slice(i, i + 500), trx))));
  return { corpusId, typeIds, documentIds };
}
