import type { ComparisonDocument, Evaluation, Tagger, TaggerComparison } from "@tagloom/contracts";
import { configure, screen, within } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { renderWithProviders } from "@/testing/test-utils";
import { ComparisonDocumentView } from "./comparison-document";
import { ComparisonView } from "./comparison-view";
import { TaggerView } from "./tagger-view";

configure({ asyncUtilTimeout: 5000 });

const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";

// Scores as the engine reports them (CoNLL convention: P = correct / predicted, R = correct / gold).
const evaluation: Evaluation = {
  overall: { precision: 0.75, recall: 0.6, f1: 2 / 3, correct: 6, predicted: 8, gold: 10 },
  types: [
    { type: "PERSON", precision: 0.8, recall: 0.6667, f1: 0.7273, support: 6, correct: 4, predicted: 5 },
    { type: "PLACE", precision: 0.6667, recall: 0.5, f1: 0.5714, support: 4, correct: 2, predicted: 3 },
  ],
  tokenAccuracy: 0.912,
  tokens: 420,
  sentences: 30,
  documents: 4,
  confusion: { types: ["PERSON", "PLACE"], counts: [[9, 1], [2, 5]], missed: [3, 4], spurious: [2, 7] },
  crossValidation: {
    folds: 5,
    unit: "documents",
    f1: { mean: 0.61, std: 0.05 },
    precision: { mean: 0.7, std: 0.04 },
    recall: { mean: 0.55, std: 0.06 },
    tokenAccuracy: { mean: 0.9, std: 0.01 },
    perFold: [],
  },
  learningCurve: [
    { fraction: 0.1, documents: 1, tokens: 90, f1: 0.2, precision: 0.3, recall: 0.15, tokenAccuracy: 0.8 },
    { fraction: 1, documents: 12, tokens: 900, f1: 0.6667, precision: 0.75, recall: 0.6, tokenAccuracy: 0.912 },
  ],
  semiSupervised: null,
};
const tagger = (id: string, version: number): Tagger => ({ id, corpusId: CORPUS, version, runId: null, createdAt: "2031-03-01T10:00:00Z", label: `Tagger v${version} of Harbour log`, evaluation });

describe("the tagger page", () => {
  it("prints the engine's figures, draws the learning curve and offers downloads only to those who may", () => {
    const { unmount } = renderWithProviders(<TaggerView orgId={ORG} corpusId={CORPUS} tagger={tagger("t1", 2)} run={null} others={[tagger("t2", 3)]} canDownload />);
    expect(screen.getByText("Entity F1 (test)").parentElement).toHaveTextContent("0.667"); // F1 2/3 to three decimals
    expect(screen.getByText("cross-validated 0.610 ± 0.050")).toBeInTheDocument();
    const perType = screen.getByRole("table", { name: "Precision, recall and F1 per entity type" });
    expect(within(perType).getByText("0.727")).toBeInTheDocument();
    expect(within(perType).getByText("0.571")).toBeInTheDocument();
    const confusion = screen.getByRole("table", { name: "Confusion between types (tokens)" });
    expect(within(confusion).getByText("7")).toBeInTheDocument(); // spurious PLACE
    expect(screen.getByRole("figure", { name: "Test F1 by share of gold documents" }).querySelector("svg")).not.toBeNull();
    expect(screen.getByRole("link", { name: "Download tagger (JSON)" })).toHaveAttribute("href", `/api/orgs/${ORG}/corpora/${CORPUS}/taggers/t1/download`);
    expect(screen.getByRole("combobox", { name: "Compare with" })).toHaveValue("t2");
    unmount();
    renderWithProviders(<TaggerView orgId={ORG} corpusId={CORPUS} tagger={tagger("t1", 2)} run={null} others={[]} canDownload={false} />);
    expect(screen.queryByRole("link", { name: /Download/ })).toBeNull();
  });
});

const side = (f1: number) => ({ precision: f1, recall: f1, f1, support: 10 });
const comparison: TaggerComparison = {
  a: { id: "t1", label: "Tagger v2 of Harbour log", version: 2 },
  b: { id: "t2", label: "Tagger v3 of Harbour log", version: 3 },
  testDocuments: 4,
  overall: { a: side(0.6), b: side(0.7), f1Difference: 0.1 },
  types: [{ type: "PERSON", a: side(0.5), b: side(0.8), f1Difference: 0.3 }],
  bootstrap: { delta: 0.1, ci: [0.02, 0.18], confidence: 0.95, pValue: 0.012, samples: 1000 },
  disagreements: [{ documentId: "d9", title: "Lowmere pier notes", tokensDiffering: 7, tokens: 120, f1A: 0.5, f1B: 0.9 }],
};

describe("the comparison", () => {
  it("shows the difference with its interval and p-value, and links the documents they disagree on", () => {
    renderWithProviders(<ComparisonView orgId={ORG} corpusId={CORPUS} comparison={comparison} />);
    expect(screen.getByTestId("bootstrap")).toHaveTextContent("95 % interval +0.020 to +0.180, p = 0.012");
    expect(screen.getByText("B is better on these documents beyond what chance would give.")).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Lowmere pier notes" })).toHaveAttribute("href", `/o/${ORG}/corpora/${CORPUS}/training/taggers/t1/compare/t2/documents/d9`);
  });

  it("reads one document as gold, A and B with a key naming the types", () => {
    const doc: ComparisonDocument = {
      document: { id: "d9", title: "Lowmere pier notes", text: "Orla Finch met Tobin Vale at Lowmere." },
      entityTypes: [
        { name: "PERSON", color: "#e69f00" },
        { name: "PLACE", color: "#56b4e9" },
      ],
      gold: [
        { start: 0, end: 10, type: "PERSON" },
        { start: 15, end: 25, type: "PERSON" },
        { start: 29, end: 36, type: "PLACE" },
      ],
      a: [{ start: 0, end: 10, type: "PERSON" }],
      b: [
        { start: 0, end: 10, type: "PERSON" },
        { start: 29, end: 36, type: "PERSON" },
      ],
    };
    renderWithProviders(<ComparisonDocumentView doc={doc} labelA="Tagger v2" labelB="Tagger v3" />);
    expect(within(screen.getByRole("region", { name: "Gold" })).getAllByText(/\(PERSON\)|\(PLACE\)/)).toHaveLength(3);
    expect(within(screen.getByRole("region", { name: "A: Tagger v2" })).getByText("(1 span)", { exact: false })).toBeInTheDocument();
    // B tagged the place as a person: two PERSON spans and no PLACE.
    expect(within(screen.getByRole("region", { name: "B: Tagger v3" })).getAllByTitle("PERSON")).toHaveLength(2);
    expect(within(screen.getByRole("region", { name: "B: Tagger v3" })).queryByTitle("PLACE")).toBeNull();
    const key = screen.getByRole("group", { name: "Key" });
    expect(within(key).getByTitle("PLACE")).toBeInTheDocument();
  });
});
