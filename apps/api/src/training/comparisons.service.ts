import type { ComparisonDocument, TaggerComparison } from "@tagloom/contracts";
import {
  type ColumnDocument,
  type TaggerModel,
  type Token,
  createRng,
  evaluateModel,
  loadModel,
  pairedBootstrap,
  scoreEntities,
  tagDocument,
  tagsToSpans,
} from "@tagloom/tagger";
import { listEntityTypes } from "@/corpora/corpora.service";
import { ConflictError, NotFoundError } from "@/errors";
import { toColumnDocument } from "./run-documents";
import { scoresOf } from "./run-evaluation";
import { getTagger, getTaggerModelText } from "./taggers.service";
import { type RunDocumentRow, listRunTestDocumentIds, streamRunDocuments } from "./training-runs.repository";

const BOOTSTRAP_SAMPLES = 1000;
const BOOTSTRAP_SEED = 1;
const MOST_DISAGREEING = 10;

type Side = { id: string; label: string; version: number; runId: string | null; model: TaggerModel };

async function loadSide(organizationId: string, corpusId: string, taggerId: string): Promise<Side> {
  const tagger = await getTagger(organizationId, corpusId, taggerId);
  const model = loadModel(JSON.parse(await getTaggerModelText(organizationId, corpusId, taggerId)));
  return { id: tagger.id, label: tagger.label, version: tagger.version, runId: tagger.runId, model };
}

/**
 * The test documents both taggers were tested on: tagger A's run's test split, kept to the
 * documents that are also in B's (when B came from a run), with their current gold.
 */
async function sharedTestDocuments(organizationId: string, a: Side, b: Side): Promise<RunDocumentRow[]> {
  const runId = a.runId ?? b.runId;
  if (runId === null) throw new ConflictError("Neither tagger came from a training run, so there is no test split to compare them on.", null, "no_test_split");
  const other = a.runId !== null && b.runId !== null ? new Set(await listRunTestDocumentIds(organizationId, b.runId)) : null;
  const rows: RunDocumentRow[] = [];
  for await (const row of streamRunDocuments(organizationId, runId, "test", null)) {
    if (row.goldVersion !== null && (other === null || other.has(row.documentId))) rows.push(row);
  }
  if (rows.length === 0) {
    throw new ConflictError(`${a.label} and ${b.label} share no test documents with gold, so they cannot be compared on the same data.`, null, "no_shared_test_documents");
  }
  return rows;
}

/**
 * Scores taggers A and B on the same test documents: per-type precision/recall/F1 side by side,
 * F1(B) − F1(A), the paired bootstrap interval and p-value over documents, and the documents
 * where their tags differ most.
 */
export async function compareTaggers(organizationId: string, corpusId: string, aId: string, bId: string): Promise<TaggerComparison> {
  const a = await loadSide(organizationId, corpusId, aId);
  const b = await loadSide(organizationId, corpusId, bId);
  const typeNames = new Map((await listEntityTypes(organizationId, corpusId)).map((t) => [t.id, t.name]));
  const rows = await sharedTestDocuments(organizationId, a, b);
  const docs: ColumnDocument[] = rows.map((r) => toColumnDocument(r, typeNames));
  const resultA = evaluateModel(a.model, docs);
  const resultB = evaluateModel(b.model, docs);
  const sa = scoresOf(resultA);
  const sb = scoresOf(resultB);
  const side = (s: typeof sa, type: string | null) => {
    if (type === null) return { precision: s.overall.precision, recall: s.overall.recall, f1: s.overall.f1, support: s.overall.gold };
    const t = s.types.find((x) => x.type === type);
    return t ? { precision: t.precision, recall: t.recall, f1: t.f1, support: t.support } : { precision: 0, recall: 0, f1: 0, support: 0 };
  };
  const typeList = [...new Set([...sa.types.map((t) => t.type), ...sb.types.map((t) => t.type)])].sort();
  const gold = docs.map((d) => d.sentences.map((s) => s.tags));
  // Paired bootstrap over test documents; the p-value is the test of Berg-Kirkpatrick, Burkett &
  // Klein (2012), "An Empirical Investigation of Statistical Significance in NLP", EMNLP, §2–3.
  const bootstrap =
    docs.length >= 2
      ? pairedBootstrap({ gold, a: resultA.predicted, b: resultB.predicted }, { samples: BOOTSTRAP_SAMPLES, rng: createRng(BOOTSTRAP_SEED), confidence: 0.95 })
      : null;
  const disagreements = rows
    .map((row, d) => {
      let differing = 0;
      let tokens = 0;
      resultA.predicted[d]!.forEach((sentence, s) =>
        sentence.forEach((tag, i) => {
          tokens++;
          if (tag !== resultB.predicted[d]![s]![i]) differing++;
        }),
      );
      return {
        documentId: row.documentId,
        title: row.title,
        tokensDiffering: differing,
        tokens,
        f1A: scoreEntities(gold[d]!, resultA.predicted[d]!).overall.f1,
        f1B: scoreEntities(gold[d]!, resultB.predicted[d]!).overall.f1,
      };
    })
    .filter((x) => x.tokensDiffering > 0)
    .sort((x, y) => y.tokensDiffering - x.tokensDiffering || x.title.localeCompare(y.title))
    .slice(0, MOST_DISAGREEING);
  const overallA = side(sa, null);
  const overallB = side(sb, null);
  return {
    a: { id: a.id, label: a.label, version: a.version },
    b: { id: b.id, label: b.label, version: b.version },
    testDocuments: docs.length,
    overall: { a: overallA, b: overallB, f1Difference: overallB.f1 - overallA.f1 },
    types: typeList.map((type) => {
      const x = side(sa, type);
      const y = side(sb, type);
      return { type, a: x, b: y, f1Difference: y.f1 - x.f1 };
    }),
    bootstrap: bootstrap && { delta: bootstrap.delta, ci: bootstrap.ci, confidence: 0.95, pValue: bootstrap.pValue, samples: bootstrap.samples },
    disagreements,
  };
}

/** One shared test document with gold, tagger A's and tagger B's spans (character offsets). */
export async function getComparisonDocument(organizationId: string, corpusId: string, aId: string, bId: string, documentId: string): Promise<ComparisonDocument> {
  const a = await loadSide(organizationId, corpusId, aId);
  const b = await loadSide(organizationId, corpusId, bId);
  const entityTypes = await listEntityTypes(organizationId, corpusId);
  const typeNames = new Map(entityTypes.map((t) => [t.id, t.name]));
  const row = (await sharedTestDocuments(organizationId, a, b)).find((r) => r.documentId === documentId);
  if (!row) throw new NotFoundError("test document of these taggers");
  const doc = toColumnDocument(row, typeNames);
  const tokens: Token[] = row.starts.map((start, i) => ({ start, end: row.ends[i]! }));
  const spansOf = (model: TaggerModel) => tagsToSpans(tokens, tagDocument(model, doc.sentences.map((s) => s.words)).flat());
  return {
    document: { id: row.documentId, title: row.title, text: row.text },
    entityTypes: entityTypes.map((t) => ({ name: t.name, color: t.color })),
    gold: tagsToSpans(tokens, doc.sentences.flatMap((s) => s.tags)),
    a: spansOf(a.model),
    b: spansOf(b.model),
  };
}
