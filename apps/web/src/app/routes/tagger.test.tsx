import type { ComparisonDocument, Evaluation, Role, Tagger, TaggerComparison, TrainingRun } from "@tagloom/contracts";
import { configure, screen, within } from "@testing-library/react";
import { HttpResponse, http } from "msw";
import type { ReactNode } from "react";
import { Route, Routes } from "react-router";
import { describe, expect, it } from "vitest";
import { paths } from "@/config/paths";
import { useMe } from "@/features/auth/api/get-me";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { CompareRoute } from "./compare";
import { CompareDocumentRoute } from "./compare-document";
import { TaggerRoute } from "./tagger";

configure({ asyncUtilTimeout: 5000 });

// The three screens through their routes, with the API answered by msw: what the user sees comes
// from the payload the API sends, not from props a test hands in.
const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";
const RUN = "33333333-3333-4333-8333-333333333333";
const base = `/api/orgs/${ORG}/corpora/${CORPUS}`;

const evaluation: Evaluation = {
  // CoNLL convention (P = correct / predicted, R = correct / gold, F1 their harmonic mean):
  // 9 / 12 = 0.750, 9 / 15 = 0.600, 2·0.75·0.6 / 1.35 = 0.667 (worked by hand).
  overall: { precision: 0.75, recall: 0.6, f1: 2 / 3, correct: 9, predicted: 12, gold: 15 },
  types: [
    { type: "CARGO", precision: 0.875, recall: 0.7, f1: 0.7778, support: 10, correct: 7, predicted: 8 },
    { type: "VESSEL", precision: 0.5, recall: 0.4, f1: 0.4444, support: 5, correct: 2, predicted: 4 },
  ],
  tokenAccuracy: 0.934,
  tokens: 1280,
  sentences: 71,
  documents: 6,
  confusion: { types: ["CARGO", "VESSEL"], counts: [[21, 2], [3, 8]], missed: [5, 6], spurious: [4, 11] },
  crossValidation: {
    folds: 4,
    unit: "documents",
    f1: { mean: 0.642, std: 0.031 },
    precision: { mean: 0.7, std: 0.02 },
    recall: { mean: 0.59, std: 0.04 },
    tokenAccuracy: { mean: 0.93, std: 0.01 },
    perFold: [],
  },
  learningCurve: [0.1, 0.25, 0.5, 1].map((fraction, i) => ({ fraction, documents: [2, 5, 10, 20][i]!, tokens: [200, 500, 1000, 2000][i]!, f1: [0.31, 0.48, 0.59, 2 / 3][i]!, precision: 0.7, recall: 0.5, tokenAccuracy: 0.9 })),
  semiSupervised: {
    method: "sample",
    iterations: [
      { iteration: 1, logLikelihood: -5123.4, seconds: 0.42, statisticsBytes: 20480 },
      { iteration: 2, logLikelihood: -5001.9, seconds: 0.39, statisticsBytes: 20480 },
    ],
  },
};
const tagger = (id: string, version: number, runId: string | null = null): Tagger => ({
  id,
  corpusId: CORPUS,
  version,
  runId,
  createdAt: "2031-04-02T09:00:00Z",
  label: `Tagger v${version} of Quay manifests`,
  evaluation,
});
const run = {
  id: RUN,
  corpusId: CORPUS,
  number: 7,
  status: "succeeded",
  stage: "storing",
  progress: 1,
  cancelRequested: false,
  iterations: [],
  error: null,
  config: {
    smoothing: { start: 0.1, transition: 0.1, emission: 0.01 },
    positionBuckets: { token: [], sentence: [] },
    positionStrength: 10,
    rare: 4,
    wordClasses: "extended",
    suffixLength: 6,
    order: 1,
    prevWord: true,
    contextEmissions: true,
    crossValidationFolds: 4,
    semi: "sample",
    iterations: 2,
    weight: 0.1,
    clusters: 0,
    perceptron: 0,
    perceptronFeatures: "symbol",
  },
  seed: 4242,
  testSplit: { kind: "corpus" },
  documentCounts: { train: 20, test: 6, unlabelled: 40 },
  shardCount: 1,
  taggerId: "t1",
  evaluation,
  repeatOfRunId: null,
  createdAt: "2031-04-02T08:59:00Z",
  startedAt: "2031-04-02T08:59:01Z",
  finishedAt: "2031-04-02T09:00:00Z",
  createdBy: null,
} satisfies TrainingRun;

function signedInAs(role: Role) {
  server.use(
    http.get("/api/auth/session", () =>
      HttpResponse.json({ me: { user: { id: "u1", email: "lead@example.test", name: "Oda Fenwick", emailVerified: true }, memberships: [{ organizationId: ORG, organizationName: "Quay Desk", role }] } }),
    ),
  );
}

/** What the organization layout guarantees: the screens render only once the session is known. */
function SignedIn({ children }: { children: ReactNode }) {
  return useMe().data ? children : null;
}

function renderAt(url: string) {
  renderWithProviders(
    <SignedIn>
      <Routes>
        <Route path={paths.org.tagger.path} element={<TaggerRoute />} />
        <Route path={paths.org.compare.path} element={<CompareRoute />} />
        <Route path={paths.org.compareDocument.path} element={<CompareDocumentRoute />} />
      </Routes>
    </SignedIn>,
    { route: url },
  );
}

function taggerApi() {
  server.use(
    http.get(`${base}/taggers/t1`, () => HttpResponse.json(tagger("t1", 3, RUN))),
    http.get(`${base}/taggers`, () => HttpResponse.json({ items: [tagger("t1", 3, RUN), tagger("t2", 2)], nextCursor: null })),
    http.get(`${base}/runs/${RUN}`, () => HttpResponse.json(run)),
  );
}

describe("the tagger page, through the API", () => {
  it("shows the payload's figures, its run and settings, draws the charts, and gives trainers the downloads", async () => {
    signedInAs("data_lead");
    taggerApi();
    renderAt(paths.org.tagger.build(ORG, CORPUS, "t1"));
    expect(await screen.findByRole("heading", { name: "Tagger v3 of Quay manifests" })).toBeInTheDocument();
    const perType = screen.getByRole("table", { name: "Precision, recall and F1 per entity type" });
    const cargo = within(perType).getByRole("row", { name: /CARGO/ });
    // Each cell equals the payload, rounded to three decimals.
    expect(within(cargo).getAllByRole("cell").map((c) => c.textContent)).toEqual(["CARGO", "0.875", "0.700", "0.778", "10", "8", "7"]);
    expect(within(within(perType).getByRole("row", { name: /VESSEL/ })).getAllByRole("cell").map((c) => c.textContent)).toEqual(["VESSEL", "0.500", "0.400", "0.444", "5", "4", "2"]);
    expect(screen.getByText("cross-validated 0.642 ± 0.031")).toBeInTheDocument();
    expect(screen.getByText("Entity F1 (test)").parentElement).toHaveTextContent("0.667");
    expect(screen.getByRole("figure", { name: "Test F1 by share of gold documents" }).querySelector("svg")).not.toBeNull();
    expect(within(screen.getByRole("table", { name: "Learning curve" })).getAllByRole("row")).toHaveLength(5); // header + 10/25/50/100 %
    for (const name of ["Log-likelihood per pass (sampling)", "Statistics held per pass (KB)", "Seconds per pass"]) expect(screen.getByRole("figure", { name }).querySelector("svg")).not.toBeNull();
    const passes = within(screen.getByRole("table", { name: "Passes over documents without gold" }));
    expect(passes.getByRole("row", { name: /^1 / })).toHaveTextContent("-5123.4");
    expect(passes.getByRole("row", { name: /^2 / })).toHaveTextContent("-5001.9");
    expect(screen.getByText("11")).toBeInTheDocument(); // spurious VESSEL tokens in the confusion grid
    expect(await screen.findByRole("link", { name: "run 7" })).toHaveAttribute("href", paths.org.run.build(ORG, CORPUS, RUN));
    expect(screen.getByText("4242")).toBeInTheDocument(); // the seed it was trained with
    expect(screen.getByRole("link", { name: "Download tagger (JSON)" })).toHaveAttribute("href", `${base}/taggers/t1/download`);
    expect(screen.getByRole("link", { name: "Download evaluation (JSON)" })).toHaveAttribute("href", `${base}/taggers/t1/evaluation`);
    expect(within(screen.getByRole("combobox", { name: "Compare with" })).getAllByRole("option").map((o) => o.textContent)).toEqual(["Tagger v2 of Quay manifests (F1 0.667)"]);
  });

  it("offers no downloads to a manager, who may still read the page", async () => {
    signedInAs("manager");
    taggerApi();
    renderAt(paths.org.tagger.build(ORG, CORPUS, "t1"));
    expect(await screen.findByRole("heading", { name: "Tagger v3 of Quay manifests" })).toBeInTheDocument();
    expect(screen.queryByRole("link", { name: /Download/ })).toBeNull();
  });

  it("asks for no run when the tagger was not made by one", async () => {
    signedInAs("data_lead");
    const runRequests: string[] = [];
    server.use(
      http.get(`${base}/runs*`, ({ request }) => {
        runRequests.push(request.url);
        return HttpResponse.json({ items: [], nextCursor: null });
      }),
      http.get(`${base}/taggers/t2`, () => HttpResponse.json(tagger("t2", 2))),
      http.get(`${base}/taggers`, () => HttpResponse.json({ items: [tagger("t2", 2)], nextCursor: null })),
    );
    renderAt(paths.org.tagger.build(ORG, CORPUS, "t2"));
    expect(await screen.findByRole("heading", { name: "Tagger v2 of Quay manifests" })).toBeInTheDocument();
    expect(screen.getByText(/Train another tagger on this corpus/)).toBeInTheDocument();
    expect(screen.queryByRole("link", { name: /^run / })).toBeNull();
    expect(runRequests).toEqual([]);
  });
});

const comparison: TaggerComparison = {
  a: { id: "t1", label: "Tagger v3 of Quay manifests", version: 3 },
  b: { id: "t2", label: "Tagger v2 of Quay manifests", version: 2 },
  testDocuments: 6,
  overall: { a: { precision: 0.75, recall: 0.6, f1: 0.6667, support: 15 }, b: { precision: 0.6, recall: 0.5, f1: 0.5455, support: 15 }, f1Difference: -0.1212 },
  types: [{ type: "CARGO", a: { precision: 0.875, recall: 0.7, f1: 0.7778, support: 10 }, b: { precision: 0.7, recall: 0.6, f1: 0.6462, support: 10 }, f1Difference: -0.1316 }],
  bootstrap: { delta: -0.1212, ci: [-0.25, 0.01], confidence: 0.95, pValue: 0.071, samples: 10000 },
  disagreements: [
    { documentId: "d4", title: "Manifest of the Orrin Bell", tokensDiffering: 14, tokens: 220, f1A: 0.8, f1B: 0.5 },
    { documentId: "d2", title: "Tallow landing sheet", tokensDiffering: 3, tokens: 180, f1A: 0.7, f1B: 0.6 },
  ],
};

describe("the comparison, through the API", () => {
  it("shows the interval and p-value and links each disagreeing document, most first", async () => {
    signedInAs("manager");
    server.use(http.get(`${base}/taggers/t1/compare/t2`, () => HttpResponse.json(comparison)));
    renderAt(paths.org.compare.build(ORG, CORPUS, "t1", "t2"));
    expect(await screen.findByTestId("bootstrap")).toHaveTextContent("95 % interval −0.250 to +0.010, p = 0.071");
    expect(screen.getByText("The interval includes 0: on these documents the difference may be chance.")).toBeInTheDocument();
    const links = within(screen.getByRole("list", { name: "Documents where the taggers disagree" })).getAllByRole("link");
    expect(links.map((l) => [l.textContent, l.getAttribute("href")])).toEqual([
      ["Manifest of the Orrin Bell", paths.org.compareDocument.build(ORG, CORPUS, "t1", "t2", "d4")],
      ["Tallow landing sheet", paths.org.compareDocument.build(ORG, CORPUS, "t1", "t2", "d2")],
    ]);
    expect(within(screen.getByRole("table", { name: "Per-type scores of A and B" })).getByRole("row", { name: /CARGO/ })).toHaveTextContent("−0.132");
  });
});

function readText(el: Element): string {
  const copy = el.cloneNode(true) as Element;
  copy.querySelectorAll("[aria-hidden], .sr-only").forEach((n) => n.remove());
  return copy.textContent ?? "";
}

describe("the disagreement document, through the API", () => {
  it("draws gold, A and B as three rows named by tagger, with a key naming the types", async () => {
    signedInAs("data_lead");
    const text = "The Orrin Bell unloaded tallow at Quay Nine.";
    const at = (w: string, type: string) => ({ start: text.indexOf(w), end: text.indexOf(w) + w.length, type });
    const doc: ComparisonDocument = {
      document: { id: "d4", title: "Manifest of the Orrin Bell", text },
      entityTypes: [
        { name: "CARGO", color: "#b8661c" },
        { name: "VESSEL", color: "#2f6f8f" },
      ],
      gold: [at("Orrin Bell", "VESSEL"), at("tallow", "CARGO")],
      a: [at("Orrin Bell", "VESSEL")],
      b: [at("Orrin", "CARGO"), at("tallow", "CARGO")],
    };
    server.use(
      http.get(`${base}/taggers/t1/compare/t2/documents/d4`, () => HttpResponse.json(doc)),
      http.get(`${base}/taggers/t1/compare/t2`, () => HttpResponse.json(comparison)),
    );
    renderAt(paths.org.compareDocument.build(ORG, CORPUS, "t1", "t2", "d4"));
    const gold = await screen.findByRole("region", { name: "Gold" });
    const a = await screen.findByRole("region", { name: "A: Tagger v3 of Quay manifests" });
    const b = screen.getByRole("region", { name: "B: Tagger v2 of Quay manifests" });
    // The same text in every row, once the type codes and the screen-reader words are set aside.
    for (const row of [gold, a, b]) expect(readText(row.querySelector("p")!)).toBe(text);
    expect(within(gold).getAllByTitle(/^(CARGO|VESSEL)$/).map((m) => m.title)).toEqual(["VESSEL", "CARGO"]);
    expect(within(a).getAllByTitle(/^(CARGO|VESSEL)$/).map((m) => m.title)).toEqual(["VESSEL"]);
    expect(within(b).getAllByTitle(/^(CARGO|VESSEL)$/).map((m) => m.title)).toEqual(["CARGO", "CARGO"]);
    expect(within(a).getByText("(1 span)")).toBeInTheDocument();
    const key = screen.getByRole("group", { name: "Key" });
    expect(key).toHaveTextContent("CARGO");
    expect(key).toHaveTextContent("VESSEL");
  });
});
