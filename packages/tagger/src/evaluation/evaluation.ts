import type { ColumnDocument } from "../text/conll";
import { scoreEntities, tokenAccuracy, type EntityScores } from "../metrics";
import { expectedCalibrationError, type CalibrationReport } from "../metrics/calibration";
import { tagsToChunks } from "../text/bio";
import { tagDocument, tagSentence } from "../model/tagger";
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
  /**
   * With `confidences`: each predicted span's confidence and whether it is a gold span (same
   * type, start and end: the CoNLL convention), and their calibration (10 equal-width bins).
   */
  readonly spans: { readonly confidence: number; readonly correct: boolean }[] | null;
  readonly calibration: CalibrationReport | null;
};

/**
 * Tags every document with the model and scores it against the gold tags (CoNLL convention).
 * With `confidences: true` the whole tagging path runs (tagSentence: tags and span confidences)
 * and the spans' calibration is reported; otherwise only Viterbi tags are computed.
 */
export function evaluateModel(model: TaggerModel, documents: readonly ColumnDocument[], options: { confidences?: boolean } = {}): Evaluation {
  const gold: string[][] = [];
  const flat: string[][] = [];
  const withConfidences = options.confidences === true && model.scheme === "iob";
  const spans: { confidence: number; correct: boolean }[] = [];
  const predicted = documents.map((doc) => {
    const words = doc.sentences.map((s) => s.words);
    if (!withConfidences) {
      const tags = tagDocument(model, words);
      doc.sentences.forEach((s, i) => {
        gold.push(s.tags);
        flat.push(tags[i]);
      });
      return tags;
    }
    return doc.sentences.map((sentence, i) => {
      const result = tagSentence(model, sentence.words, { sentenceIndex: i });
      gold.push(sentence.tags);
      flat.push(result.tags);
      const goldChunks = new Set(tagsToChunks(sentence.tags).map((c) => `${c.type}\u0000${c.start}\u0000${c.end}`));
      for (const c of result.chunks) spans.push({ confidence: c.confidence, correct: goldChunks.has(`${c.type}\u0000${c.start}\u0000${c.end}`) });
      return result.tags;
    });
  });
  const tokens = gold.reduce((n, s) => n + s.length, 0);
  const calibration = withConfidences ? expectedCalibrationError(spans.map((s) => s.confidence), spans.map((s) => s.correct)) : null;
  const extra = { spans: withConfidences ? spans : null, calibration };
  if (model.scheme === "iob") {
    const entities = scoreEntities(gold, flat);
    return { entities, tokenAccuracy: entities.tokenAccuracy, tokens, sentences: gold.length, predicted, ...extra };
  }
  return { entities: null, tokenAccuracy: tokens === 0 ? 0 : tokenAccuracy(gold, flat), tokens, sentences: gold.length, predicted, ...extra };
}
