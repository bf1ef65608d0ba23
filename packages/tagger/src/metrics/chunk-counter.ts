import { isIobTag } from "../text/bio";

const OUTSIDE = -1;

/**
 * Streams sentences of gold and predicted IOB tags and counts chunks by the CoNLL conlleval
 * convention (see tagsToChunks): gold, predicted and correct (same start, end and type) chunks per
 * type, plus whole-tag token matches. Tags are interned once to integer codes, so the per-token
 * loop allocates nothing.
 */
export class ChunkCounter {
  /** Entity types in order of first appearance; counts are indexed like this list. */
  readonly types: string[] = [];
  readonly gold: number[] = [];
  readonly predicted: number[] = [];
  readonly correct: number[] = [];
  tokens = 0;
  matchingTokens = 0;
  sentences = 0;
  // -1 for O; 2·type + 1 for B-type; 2·type for I-type.
  private readonly codes = new Map<string, number>([["O", OUTSIDE]]);
  private readonly typeIds = new Map<string, number>();

  private codeOf(tag: string, sentence: number, token: number): number {
    const known = this.codes.get(tag);
    if (known !== undefined) return known;
    if (!isIobTag(tag)) {
      throw new RangeError(`sentence ${sentence} token ${token}: tag ${JSON.stringify(tag)} is not an IOB tag (expected O, B-TYPE or I-TYPE)`);
    }
    const type = tag.slice(2);
    let id = this.typeIds.get(type);
    if (id === undefined) {
      id = this.types.length;
      this.typeIds.set(type, id);
      this.types.push(type);
      this.gold.push(0);
      this.predicted.push(0);
      this.correct.push(0);
    }
    const code = 2 * id + (tag.charCodeAt(0) === 0x42 ? 1 : 0);
    this.codes.set(tag, code);
    return code;
  }

  /** Adds one sentence; both arrays must have the same length (checked by the caller). */
  addSentence(gold: readonly string[], predicted: readonly string[], sentence = this.sentences): void {
    const n = gold.length;
    let goldType = OUTSIDE;
    let goldStart = -1;
    let predictedType = OUTSIDE;
    let predictedStart = -1;
    // Position n is a virtual O: the sentence boundary ends every open chunk.
    for (let i = 0; i <= n; i++) {
      const g = i < n ? this.codeOf(gold[i], sentence, i) : OUTSIDE;
      const p = i < n ? this.codeOf(predicted[i], sentence, i) : OUTSIDE;
      const gType = g < 0 ? OUTSIDE : g >> 1;
      const pType = p < 0 ? OUTSIDE : p >> 1;
      const goldEnds = goldType !== OUTSIDE && (g < 0 || (g & 1) === 1 || gType !== goldType);
      const predictedEnds = predictedType !== OUTSIDE && (p < 0 || (p & 1) === 1 || pType !== predictedType);
      if (goldEnds && predictedEnds && goldStart === predictedStart && goldType === predictedType) this.correct[goldType]++;
      if (goldEnds) goldType = OUTSIDE;
      if (predictedEnds) predictedType = OUTSIDE;
      if (g >= 0 && goldType === OUTSIDE) {
        goldType = gType;
        goldStart = i;
        this.gold[gType]++;
      }
      if (p >= 0 && predictedType === OUTSIDE) {
        predictedType = pType;
        predictedStart = i;
        this.predicted[pType]++;
      }
      if (i < n && gold[i] === predicted[i]) this.matchingTokens++;
    }
    this.tokens += n;
    this.sentences++;
  }
}
