import type { ColumnDocument } from "../text/conll";
import { scoreEntities, tokenAccuracy, type EntityScores } from "../metrics";
import { tagDocument } from "../model/tagger";
import type { TaggerModel } from "../model/tagger-model";

/** Scores of a model on labelled documents: entity scores for the iob scheme, else accuracy only. */
export type Evaluation = {
  /** null for plain tags (no entities). */
  readonly entities: EntityScores | null;
  readonly tokenAccuracy: number;
  readonly tokens: number;
  readonly sentences: number;
  /** Predicted tags, document by document, sentence by sentence. */
  readonly predicted: string[][][];
};

/** Tags every document with the model and scores it against the gold tags (CoNLL convention). */
export function evaluateModel(model: TaggerModel, documents: readonly ColumnDocument[]): Evaluation {
  const gold: string[][] = [];
  const flat: string[][] = [];
  const predicted = documents.map((doc) => {
    const tags = tagDocument(model, doc.sentences.map((s) => s.words));
    doc.sentences.forEach((s, i) => {
      gold.push(s.tags);
      flat.push(tags[i]);
    });
    return tags;
  });
  const tokens = gold.reduce((n, s) => n + s.length, 0);
  if (model.scheme === "iob") {
    const entities = scoreEntities(gold, flat);
    return { entities, tokenAccuracy: entities.tokenAccuracy, tokens, sentences: gold.length, predicted };
  }
  return { entities: null, tokenAccuracy: tokens === 0 ? 0 : tokenAccuracy(gold, flat), tokens, sentences: gold.length, predicted };
}
