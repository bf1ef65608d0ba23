import { createRng, type Rng } from "@tagloom/tagger";
import { DemoNames } from "./demo-names";

// Invented supply agreements, purchase orders, amendments and delivery notes for the demo corpus.
// Every company, person, place, vessel and product name comes from DemoNames (syllables); the
// sentences are written for this demo. Deterministic: the same seed gives the same corpus.

export type DemoType = "PARTY" | "DATE" | "MONEY" | "PLACE";
type Piece = string | { text: string; type: DemoType };
export type DemoSpan = { start: number; end: number; type: DemoType };
export type DemoDocument = {
  title: string;
  text: string;
  /** How the seed uploads it: JSONL lines carry spans; PDF and Word files are text only. */
  format: "jsonl" | "pdf" | "docx";
  split?: "train" | "test";
  /** The spans a careful annotator marks (gold when `gold`, the batch simulation's answer key otherwise). */
  spans: DemoSpan[];
  gold: boolean;
};

const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];
const WORDS_FOR_DAYS = ["thirty", "forty-five", "sixty", "fourteen", "twenty-one", "ninety"];

type World = { companies: string[]; people: string[]; places: string[]; vessels: string[]; products: string[] };

function buildWorld(rng: Rng): World {
  const names = new DemoNames(rng);
  const many = (n: number, make: () => string) => Array.from({ length: n }, make);
  return {
    companies: many(40, () => names.company()),
    people: many(24, () => names.person()),
    places: many(30, () => names.place()),
    vessels: many(10, () => names.vessel()),
    products: many(20, () => names.product()),
  };
}

function assemble(pieces: Piece[]): { text: string; spans: DemoSpan[] } {
  let text = "";
  const spans: DemoSpan[] = [];
  for (const p of pieces) {
    if (typeof p === "string") {
      text += p;
    } else {
      spans.push({ start: text.length, end: text.length + p.text.length, type: p.type });
      text += p.text;
    }
  }
  return { text, spans };
}

type Deal = { supplier: string; buyer: string; from: string; to: string; product: string; vessel: string; signer: string };

/** One document's clause writer: dates, amounts and extra names drawn as the clauses need them. */
function clauses(rng: Rng, world: World, deal: Deal) {
  const pick = <T>(xs: readonly T[]): T => xs[rng.nextInt(xs.length)]!;
  const date = (year: number): Piece => {
    const day = 1 + rng.nextInt(28);
    const month = pick(MONTHS);
    const text = rng.next() < 0.75 ? `${day} ${month} ${year}` : `${month} ${day}, ${year}`;
    return { text, type: "DATE" };
  };
  const money = (low: number, high: number): Piece => {
    const amount = (low + rng.nextInt(high - low)) * 50;
    const figure = amount.toLocaleString("en-GB");
    return { text: rng.next() < 0.8 ? `EUR ${figure}` : `${figure} euros`, type: "MONEY" };
  };
  const party = (name: string): Piece => ({ text: name, type: "PARTY" });
  const place = (name: string): Piece => ({ text: name, type: "PLACE" });
  const other = () => pick(world.companies.filter((c) => c !== deal.supplier && c !== deal.buyer));
  return {
    opening: (): Piece[] => [
      "This supply agreement is made on ", date(2026), " between ", party(deal.supplier), " of ", place(deal.from), " (the Supplier) and ",
      party(deal.buyer), " of ", place(deal.to), " (the Buyer).",
    ],
    order: (): Piece[] => [
      party(deal.buyer), ` orders ${deal.product} from `, party(deal.supplier), " for a total price of ", money(200, 9000), ".",
    ],
    delivery: (): Piece[] => [
      `The Supplier shall deliver the ${deal.product} to the Buyer's depot at `, place(deal.to), " on or before ", date(2027),
      `, shipped aboard the ${deal.vessel} from `, place(deal.from), ".",
    ],
    price: (): Piece[] => ["The Buyer shall pay ", money(100, 6000), ` within ${pick(WORDS_FOR_DAYS)} days of each delivery.`],
    penalty: (): Piece[] => ["For each week of delay the Supplier owes the Buyer a credit of ", money(2, 80), ", up to ten weeks."],
    termination: (): Piece[] => ["Either party may end this agreement by written notice given before ", date(2027), "."],
    insurance: (): Piece[] => ["The goods are insured in transit for ", money(500, 20000), " with ", party(other()), "."],
    disputes: (): Piece[] => ["Disputes go first to mediation and then to the commercial tribunal sitting at ", place(pick(world.places)), "."],
    notices: (): Piece[] => [
      "Notices to the Supplier go to its office at ", place(deal.from), `, for the attention of ${deal.signer}; notices to the Buyer go to `,
      place(deal.to), ".",
    ],
    amendment: (): Piece[] => [
      party(deal.supplier), " and ", party(deal.buyer), ` agree that shipments of ${deal.product} will leave from `, place(pick(world.places)),
      " instead of ", place(deal.from), " from ", date(2026), " onwards.",
    ],
    minimum: (): Piece[] => ["The yearly minimum purchase rises to ", money(1000, 30000), " from ", date(2027), "."],
    quality: (): string[] => [
      `Each lot of ${deal.product} is checked on arrival. A lot that fails the agreed sample test may be refused within five working days, and the Supplier replaces it at its own cost.`,
    ],
    confidentiality: (): string[] => [
      "Neither party shall disclose the prices or volumes in this agreement to anyone outside its own staff and advisers, unless the law requires it.",
    ],
    forceMajeure: (): string[] => [
      "A party is not liable for a delay caused by events beyond its reasonable control, such as storms, strikes or closed roads, if it tells the other party promptly and resumes as soon as it can.",
    ],
    incident: (): Piece[] => [
      "Delivery note: the consignment from ", party(deal.supplier), " reached ", place(deal.to), " on ", date(2026),
      ` with two pallets of ${deal.product} damaged by water. The driver's report was countersigned by ${pick(world.people)}.`,
    ],
    signature: (): Piece[] => ["Signed at ", place(deal.from), " on ", date(2026), ` by ${deal.signer} for the Supplier.`],
  };
}

type ClauseName = keyof ReturnType<typeof clauses>;
const OPENINGS: Record<"agreement" | "order" | "amendment" | "note", ClauseName[]> = {
  agreement: ["opening", "delivery", "price"],
  order: ["order", "delivery"],
  amendment: ["amendment", "minimum"],
  note: ["incident"],
};
const BODY: ClauseName[] = ["penalty", "termination", "insurance", "disputes", "notices", "quality", "confidentiality", "forceMajeure", "price", "minimum"];
const HEADINGS: Partial<Record<ClauseName, string>> = {
  penalty: "Late delivery", termination: "Ending the agreement", insurance: "Insurance", disputes: "Disputes", notices: "Notices",
  quality: "Quality", confidentiality: "Confidentiality", forceMajeure: "Events beyond control", price: "Payment", minimum: "Minimum purchase",
};
const TITLES = { agreement: "Supply agreement", order: "Purchase order", amendment: "Amendment", note: "Delivery note" } as const;

/** How many body clauses a document gets: mostly short, some a page or two, a few several pages. */
function bodyLength(rng: Rng): number {
  const r = rng.next();
  if (r < 0.55) return rng.nextInt(3);
  if (r < 0.9) return 3 + rng.nextInt(8);
  return 20 + rng.nextInt(50);
}

/**
 * `count` demo documents, the same every time: `goldCount` of them gold (every fourth of those in
 * the test split, the rest in train), `pdfCount` and `docxCount` uploaded as generated files, the
 * rest as JSONL lines without spans.
 */
export function buildDemoDocuments(options: { count?: number; goldCount?: number; pdfCount?: number; docxCount?: number } = {}): DemoDocument[] {
  const { count = 400, goldCount = 100, pdfCount = 16, docxCount = 16 } = options;
  const rng = createRng(20261202);
  const world = buildWorld(rng);
  const pick = <T>(xs: readonly T[]): T => xs[rng.nextInt(xs.length)]!;
  const kinds = ["agreement", "agreement", "order", "order", "amendment", "note"] as const;
  const docs: DemoDocument[] = [];
  for (let i = 0; i < count; i++) {
    const supplier = pick(world.companies);
    const buyer = pick(world.companies.filter((c) => c !== supplier));
    const from = pick(world.places);
    const to = pick(world.places.filter((p) => p !== from));
    const deal: Deal = { supplier, buyer, from, to, product: pick(world.products), vessel: pick(world.vessels), signer: pick(world.people) };
    const write = clauses(rng, world, deal);
    const kind = pick(kinds);
    const pieces: Piece[] = [];
    const paragraph = (name: ClauseName, numbered: number | null) => {
      if (pieces.length) pieces.push("\n\n");
      if (numbered !== null && HEADINGS[name]) pieces.push(`${numbered}. ${HEADINGS[name]}. `);
      pieces.push(...write[name]());
    };
    for (const name of OPENINGS[kind]) paragraph(name, null);
    const extra = kind === "note" ? rng.nextInt(2) : bodyLength(rng);
    for (let c = 0; c < extra; c++) paragraph(pick(BODY), c + 1);
    if (kind !== "note") paragraph("signature", null);
    const { text, spans } = assemble(pieces);
    const number = String(i + 1).padStart(3, "0");
    const title = `${TITLES[kind]} ${number}: ${supplier} / ${buyer}`;
    const format = i >= count - pdfCount - docxCount ? (i >= count - docxCount ? "docx" : "pdf") : "jsonl";
    const gold = i < goldCount;
    docs.push({ title, text, format, spans, gold, ...(gold ? { split: i % 4 === 3 ? "test" : "train" } : {}) });
  }
  return docs;
}

export const demoEntityTypes = [
  {
    name: "PARTY",
    hotkey: "p",
    guideline:
      "A company or person that is a party to the agreement, or an insurer named in it. Mark the full name as written, including *Ltd*, *Co* or *& Sons*. Do not mark *the Supplier* or *the Buyer*, and do not mark people who only sign or countersign.",
  },
  { name: "DATE", hotkey: "d", guideline: "A calendar date with day, month and year, in either order. Do not mark durations such as *thirty days*." },
  { name: "MONEY", hotkey: "m", guideline: "An amount with its currency, e.g. *EUR 4,500* or *4,500 euros*." },
  {
    name: "PLACE",
    hotkey: "l",
    guideline: "A town, harbour, quay, valley or yard named as a place of delivery, shipment, signing or a tribunal's seat. Vessels (*MV …*) are not places.",
  },
];
