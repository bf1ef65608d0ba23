import { type ColumnDocument, type TaggerModel, serializeModel, spansToTags, tokenizeText, trainTagger } from "@tagloom/tagger";

// Invented people and places for training small taggers in tests (no real names).
const PEOPLE = ["Mira Quell", "Tobin Vale", "Orla Finch", "Edda Rusk", "Jory Marrow", "Ines Ashby", "Zoë Brünnhilde", "Élodie Varga", "山田花子"];
const PLACES = ["Saltmarsh", "Fennick Lane", "Ørsvik", "Larkspur Quay", "Brindlecombe", "青葉港"];
const VERBS = ["met", "visited", "called", "wrote to", "thanked"];

export type LabelledText = { text: string; spans: Array<{ start: number; end: number; type: string }> };

/** A sentence with two people and a place, and its spans. */
function sentence(i: number): LabelledText {
  const a = PEOPLE[i % PEOPLE.length]!;
  const b = PEOPLE[(i * 5 + 3) % PEOPLE.length]!;
  const place = PLACES[(i * 7 + 1) % PLACES.length]!;
  const verb = VERBS[i % VERBS.length]!;
  const head = `On day ${i + 1} `;
  const text = `${head}${a} ${verb} ${b} in ${place}.`;
  const aStart = head.length;
  const bStart = aStart + a.length + 1 + verb.length + 1;
  const pStart = bStart + b.length + 4;
  return {
    text,
    spans: [
      { start: aStart, end: aStart + a.length, type: "PARTY" },
      { start: bStart, end: bStart + b.length, type: "PARTY" },
      { start: pStart, end: pStart + place.length, type: "PLACE" },
    ],
  };
}

/** `count` labelled documents of `sentences` sentences each, starting at sentence `from`. */
export function labelledDocuments(count: number, sentences = 3, from = 0): LabelledText[] {
  const docs: LabelledText[] = [];
  for (let d = 0; d < count; d++) {
    const parts = Array.from({ length: sentences }, (_, s) => sentence(from + d * sentences + s));
    let text = "";
    const spans: LabelledText["spans"] = [];
    for (const p of parts) {
      if (text) text += " ";
      const offset = text.length;
      text += p.text;
      spans.push(...p.spans.map((s) => ({ ...s, start: s.start + offset, end: s.end + offset })));
    }
    docs.push({ text, spans });
  }
  return docs;
}

/** Labelled texts as column documents (tokens as the documents pipeline makes them, IOB2 tags). */
export function toColumnDocuments(docs: readonly LabelledText[]): ColumnDocument[] {
  return docs.map((d) => {
    const { tokens, sentences } = tokenizeText(d.text);
    const tags = spansToTags(tokens, d.spans);
    return {
      sentences: sentences.map((s) => ({
        words: tokens.slice(s.start, s.end).map((t) => d.text.slice(t.start, t.end)),
        tags: tags.slice(s.start, s.end),
      })),
    };
  });
}

/** Trains a tagger with the default configuration; returns it and its JSON as stored. */
export function trainTestModel(docs: readonly LabelledText[]): { model: TaggerModel; json: string } {
  const { model } = trainTagger(toColumnDocuments(docs));
  return { model, json: JSON.stringify(serializeModel(model)) };
}
