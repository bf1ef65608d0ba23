import { createRng } from "@tagloom/tagger";

// Invented supply-agreement snippets for the demo corpus. Every company, person and place name is
// made up from syllables (earlier names that turned out to be real places were replaced); the
// sentences are written for this demo.
const suppliers = ["Kelvatho Mills", "Brunasque Ceramics", "Tessivar & Morrique Ltd", "Ulventhrap Textiles", "Quorreth Paper Co", "Lanvisk Glassworks"];
const buyers = ["Tallovine Freight", "Iskarrow Outfitters", "Mabrevel Grocers", "Pelluvant Labs", "Wickenoth Furnishings", "Dunvessa Hardware"];
const places = ["Quivella Harbour", "Brannafel", "Soltharrow Yard", "Esquivane Valley", "Port Vethrin", "Glimvarrow"];
const months = ["January", "February", "March", "April", "May", "June", "July", "September", "October", "November"];
const goods = ["woven cotton bolts", "glazed tiles", "recycled card stock", "hand-blown bottles", "linen tea towels", "kiln-dried oak boards"];

type Piece = string | { text: string; type: "PARTY" | "DATE" | "MONEY" | "PLACE" };

function assemble(pieces: Piece[]): { text: string; spans: { start: number; end: number; type: string }[] } {
  let text = "";
  const spans: { start: number; end: number; type: string }[] = [];
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

export type DemoDocument = { title: string; text: string; split?: "train" | "test"; spans?: { start: number; end: number; type: string }[] };

/**
 * `count` demo documents, the same every time. The first `goldCount` carry spans (they become
 * gold); of those, every fourth is in the test split and the others in train.
 */
export function buildDemoDocuments(count = 24, goldCount = 14): DemoDocument[] {
  const rng = createRng(20261201);
  const pick = <T>(xs: readonly T[]): T => xs[rng.nextInt(xs.length)]!;
  const docs: DemoDocument[] = [];
  for (let i = 0; i < count; i++) {
    const supplier = pick(suppliers);
    let buyer = pick(buyers);
    if (buyer === supplier) buyer = buyers[(buyers.indexOf(buyer) + 1) % buyers.length]!;
    const from = pick(places);
    const to = pick(places.filter((p) => p !== from));
    const day = 1 + rng.nextInt(27);
    const signed = `${day} ${pick(months)} 2026`;
    const due = `${1 + rng.nextInt(27)} ${pick(months)} 2027`;
    const amount = `EUR ${(12 + rng.nextInt(180)) * 250}`.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
    const penalty = `EUR ${(1 + rng.nextInt(20)) * 100}`.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
    const variant = i % 3;
    const pieces: Piece[] =
      variant === 0
        ? [
            "This supply agreement is made on ", { text: signed, type: "DATE" }, " between ", { text: supplier, type: "PARTY" },
            " of ", { text: from, type: "PLACE" }, " (the Supplier) and ", { text: buyer, type: "PARTY" }, " of ", { text: to, type: "PLACE" },
            ` (the Buyer). The Supplier shall deliver ${pick(goods)} to the Buyer's depot. The Buyer shall pay `, { text: amount, type: "MONEY" },
            " within thirty days of delivery.\n\nEither party may end this agreement by written notice before ", { text: due, type: "DATE" }, ".",
          ]
        : variant === 1
          ? [
              { text: buyer, type: "PARTY" }, " orders ", pick(goods), " from ", { text: supplier, type: "PARTY" }, " for a total price of ",
              { text: amount, type: "MONEY" }, ". Delivery is due at ", { text: to, type: "PLACE" }, " on or before ", { text: due, type: "DATE" },
              `. For each week of delay the Supplier owes a credit of `, { text: penalty, type: "MONEY" }, ".\n\nSigned at ",
              { text: from, type: "PLACE" }, " on ", { text: signed, type: "DATE" }, ".",
            ]
          : [
              "Amendment of ", { text: signed, type: "DATE" }, ". ", { text: supplier, type: "PARTY" }, " and ", { text: buyer, type: "PARTY" },
              ` agree that shipments of ${pick(goods)} will leave from `, { text: from, type: "PLACE" }, " instead of ", { text: to, type: "PLACE" },
              ". The yearly minimum purchase rises to ", { text: amount, type: "MONEY" }, ".\n\nAll other terms stay in force until ",
              { text: due, type: "DATE" }, ".",
            ];
    const { text, spans } = assemble(pieces);
    const title = `${variant === 0 ? "Supply agreement" : variant === 1 ? "Purchase order" : "Amendment"} ${String(i + 1).padStart(2, "0")}: ${supplier} / ${buyer}`;
    docs.push(i < goldCount ? { title, text, split: i % 4 === 3 ? "test" : "train", spans } : { title, text });
  }
  return docs;
}

export const demoEntityTypes = [
  { name: "PARTY", hotkey: "p", guideline: "A company or person that is party to the agreement. Mark the full name as written, including *Ltd* or *Co*." },
  { name: "DATE", hotkey: "d", guideline: "A calendar date (day, month and year). Do not mark durations such as *thirty days*." },
  { name: "MONEY", hotkey: "m", guideline: "An amount with its currency, e.g. *EUR 4,500*." },
  { name: "PLACE", hotkey: "l", guideline: "A town, harbour, valley or yard named as a place of delivery, shipment or signing." },
];
