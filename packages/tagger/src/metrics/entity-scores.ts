import { ChunkCounter } from "./chunk-counter";
import { checkSameShape } from "./check-shapes";

/** Precision, recall and F1 as fractions in [0, 1]. */
export type Prf = { precision: number; recall: number; f1: number };

/** Entity-level scores of a tagged test set; see scoreEntities. */
export type EntityScores = {
  overall: Prf & { correct: number; predicted: number; gold: number };
  types: Record<string, Prf & { support: number; correct: number; predicted: number }>;
  tokenAccuracy: number;
  tokens: number;
  sentences: number;
};

/**
 * P = correct/predicted, R = correct/gold, F1 = 2PR/(P+R); each is 0 when its denominator is 0
 * (the conlleval convention).
 */
export function computePrf(correct: number, predicted: number, gold: number): Prf {
  const precision = predicted > 0 ? correct / predicted : 0;
  const recall = gold > 0 ? correct / gold : 0;
  return { precision, recall, f1: computeF1(correct, predicted, gold) };
}

/** F1 alone, as computePrf gives it, without allocating. Internal. */
export function computeF1(correct: number, predicted: number, gold: number): number {
  const precision = predicted > 0 ? correct / predicted : 0;
  const recall = gold > 0 ? correct / gold : 0;
  return precision + recall > 0 ? (2 * precision * recall) / (precision + recall) : 0;
}

/**
 * Scores predicted IOB tags against gold tags, sentence by sentence (sentences × tokens), by the
 * CoNLL conlleval convention: chunks as tagsToChunks reads them (IOB1 and IOB2 alike), a sentence
 * boundary ends every chunk, and a predicted chunk is correct only when its start, end and type
 * match a gold chunk. Micro-averaged over chunks overall and per type; ratios are fractions in
 * [0, 1], 0 when their denominator is 0. `types` lists every type seen in gold or predicted, in
 * sorted code-unit order (JavaScript lists integer-like keys such as "7" first), with `support` =
 * gold chunks of that type. `tokenAccuracy` counts whole-tag matches. Throws RangeError when the
 * sentence counts or a sentence's lengths differ, or on a tag that is not O, B-X or I-X. Linear in
 * the number of tokens.
 */
export function scoreEntities(gold: readonly (readonly string[])[], predicted: readonly (readonly string[])[]): EntityScores {
  checkSameShape(gold, predicted);
  const counter = new ChunkCounter();
  for (let s = 0; s < gold.length; s++) counter.addSentence(gold[s], predicted[s], s);
  return summarizeCounts(counter);
}

/** Turns a ChunkCounter's totals into EntityScores. Internal. */
export function summarizeCounts(counter: ChunkCounter): EntityScores {
  let correct = 0;
  let predicted = 0;
  let gold = 0;
  const order = counter.types.map((_, k) => k).sort((a, b) => (counter.types[a] < counter.types[b] ? -1 : counter.types[a] > counter.types[b] ? 1 : 0));
  const entries: Array<[string, EntityScores["types"][string]]> = [];
  for (const k of order) {
    correct += counter.correct[k];
    predicted += counter.predicted[k];
    gold += counter.gold[k];
    const scores = computePrf(counter.correct[k], counter.predicted[k], counter.gold[k]);
    entries.push([counter.types[k], { ...scores, support: counter.gold[k], correct: counter.correct[k], predicted: counter.predicted[k] }]);
  }
  // fromEntries defines own properties, so even a type named "__proto__" stays an ordinary key.
  const types = Object.fromEntries(entries);
  return {
    overall: { ...computePrf(correct, predicted, gold), correct, predicted, gold },
    types,
    tokenAccuracy: counter.tokens > 0 ? counter.matchingTokens / counter.tokens : 0,
    tokens: counter.tokens,
    sentences: counter.sentences,
  };
}

/**
 * Fraction of tokens whose predicted tag equals the gold tag exactly (any tag set, e.g. POS);
 * 0 when there are no tokens. Throws RangeError when the shapes differ.
 */
export function tokenAccuracy(gold: readonly (readonly string[])[], predicted: readonly (readonly string[])[]): number {
  checkSameShape(gold, predicted);
  let tokens = 0;
  let matching = 0;
  for (let s = 0; s < gold.length; s++) {
    const g = gold[s];
    const p = predicted[s];
    for (let i = 0; i < g.length; i++) if (g[i] === p[i]) matching++;
    tokens += g.length;
  }
  return tokens > 0 ? matching / tokens : 0;
}
