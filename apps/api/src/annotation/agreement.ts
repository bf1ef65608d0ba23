import { type CharSpan, type Token, cohensKappa, entityAgreement, spansToTags } from "@tagloom/tagger";

/** One document with the finished spans of each annotator who finished it. */
export type AgreementDocument = { tokens: readonly Token[]; byAnnotator: ReadonlyMap<string, readonly CharSpan[]> };

export type PairFigures = {
  annotatorA: string;
  annotatorB: string;
  documents: number;
  tokens: number;
  f1: number;
  matched: number;
  onlyA: number;
  onlyB: number;
  kappa: number;
};

export type AgreementFigures = { pairs: PairFigures[]; overall: { documents: number; f1: number; kappa: number } | null };

type Tally = { documents: number; matched: number; onlyA: number; onlyB: number; a: string[]; b: string[] };

function f1Of(t: Tally): number {
  const marked = 2 * t.matched + t.onlyA + t.onlyB;
  // Neither annotator marked anything on any shared document: complete agreement, as in entityAgreement.
  return marked === 0 ? 1 : (2 * t.matched) / marked;
}

/**
 * Agreement of every pair of annotators over the documents both finished: entity-level F1 with
 * exact span and type (pooled counts, so F1 = 2·matched / (2·matched + onlyA + onlyB)), and
 * Cohen's kappa on the IOB2 label of every token of those documents, pooled. `overall` pools
 * every pair the same way. Annotator pairs are ordered by id.
 */
export function computeAgreement(documents: readonly AgreementDocument[]): AgreementFigures {
  const tallies = new Map<string, Tally>();
  const overall: Tally = { documents: 0, matched: 0, onlyA: 0, onlyB: 0, a: [], b: [] };
  const overallDocuments = new Set<number>();
  documents.forEach((doc, docIndex) => {
    const annotators = [...doc.byAnnotator.keys()].sort();
    if (annotators.length < 2) return;
    const tags = new Map(annotators.map((a) => [a, spansToTags(doc.tokens, doc.byAnnotator.get(a)!)]));
    for (let i = 0; i < annotators.length; i++) {
      for (let j = i + 1; j < annotators.length; j++) {
        const [a, b] = [annotators[i]!, annotators[j]!];
        const key = `${a}\u0000${b}`;
        const t = tallies.get(key) ?? { documents: 0, matched: 0, onlyA: 0, onlyB: 0, a: [], b: [] };
        const e = entityAgreement(doc.byAnnotator.get(a)!, doc.byAnnotator.get(b)!);
        for (const target of [t, overall]) {
          target.matched += e.matched;
          target.onlyA += e.onlyA;
          target.onlyB += e.onlyB;
          target.a.push(...tags.get(a)!);
          target.b.push(...tags.get(b)!);
        }
        t.documents += 1;
        tallies.set(key, t);
        overallDocuments.add(docIndex);
      }
    }
  });
  const pairs = [...tallies.entries()].map(([key, t]) => {
    const [annotatorA, annotatorB] = key.split("\u0000") as [string, string];
    return {
      annotatorA,
      annotatorB,
      documents: t.documents,
      tokens: t.a.length,
      f1: f1Of(t),
      matched: t.matched,
      onlyA: t.onlyA,
      onlyB: t.onlyB,
      kappa: cohensKappa(t.a, t.b).kappa,
    };
  });
  pairs.sort((x, y) => (x.annotatorA < y.annotatorA ? -1 : x.annotatorA > y.annotatorA ? 1 : x.annotatorB < y.annotatorB ? -1 : 1));
  return {
    pairs,
    overall: pairs.length ? { documents: overallDocuments.size, f1: f1Of(overall), kappa: cohensKappa(overall.a, overall.b).kappa } : null,
  };
}
