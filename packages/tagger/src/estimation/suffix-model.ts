/**
 * Suffix statistics for unknown words, after Brants (2000), "TnT — a statistical part-of-speech
 * tagger", ANLP, §2.3: tag frequencies of the suffixes (up to a maximum length) of infrequent
 * training words, kept per group (Brants keeps capitalised and uncapitalised words apart; here a
 * group is a word class), combined by successive abstraction (Samuelsson 1996, "Handling sparse
 * data by successive abstraction", COLING):
 *   P(t | l_{n-i+1}..l_n) = (P̂(t | l_{n-i+1}..l_n) + θ·P(t | l_{n-i+2}..l_n)) / (1 + θ),
 * starting from the group's tag distribution P̂(t | group) for the empty suffix.
 */
/** One suffix's tag counts (serialized form). */
export type SuffixNode = { readonly tags: Int32Array; readonly counts: Float64Array; readonly total: number };

/**
 * Suffix tag counts in compressed rows: node n (looked up by `${group}\u0001${suffix}`, the empty
 * suffix being the group's root) has tags[offsets[n]..offsets[n+1]) with their counts and total.
 * Rows instead of one object per suffix: a million training tokens give hundreds of thousands of
 * suffixes.
 */
export type SuffixStatistics = {
  readonly states: number;
  readonly maxLength: number;
  /** Successive-abstraction weight θ (the same for every suffix length, as in Brants 2000). */
  readonly theta: number;
  readonly index: ReadonlyMap<string, number>;
  readonly offsets: Int32Array;
  readonly tags: Int32Array;
  readonly counts: Float64Array;
  readonly totals: Float64Array;
};

const SEPARATOR = "\u0001";

function nodeKey(group: number, suffix: string): string {
  return `${group}${SEPARATOR}${suffix}`;
}

/** Collects suffix statistics; call `add` once per training token of an infrequent word. */
export function createSuffixCollector(states: number, maxLength: number): {
  add(word: string, group: number, tag: number, weight?: number): void;
  finish(theta: number): SuffixStatistics;
} {
  const index = new Map<string, number>();
  // (node·K + tag) → count, in insertion order.
  const cells = new Map<number, number>();
  const bump = (key: string, tag: number, weight: number) => {
    let node = index.get(key);
    if (node === undefined) {
      node = index.size;
      index.set(key, node);
    }
    const cell = node * states + tag;
    cells.set(cell, (cells.get(cell) ?? 0) + weight);
  };
  return {
    add(word, group, tag, weight = 1) {
      if (tag < 0 || tag >= states) throw new RangeError(`suffix statistics: tag ${tag} outside ${states} states`);
      bump(nodeKey(group, ""), tag, weight);
      const longest = Math.min(maxLength, word.length);
      for (let l = 1; l <= longest; l++) bump(nodeKey(group, word.slice(word.length - l)), tag, weight);
    },
    finish(theta) {
      const nodes = index.size;
      const offsets = new Int32Array(nodes + 1);
      for (const cell of cells.keys()) offsets[Math.floor(cell / states) + 1]++;
      for (let n = 0; n < nodes; n++) offsets[n + 1] += offsets[n];
      const fill = offsets.slice(0, nodes);
      const tags = new Int32Array(cells.size);
      const counts = new Float64Array(cells.size);
      const totals = new Float64Array(nodes);
      // Cells sorted by tag within each node, so rows read the same after a serialization round trip.
      for (const cell of [...cells.keys()].sort((x, y) => x - y)) {
        const node = Math.floor(cell / states);
        const x = fill[node]++;
        tags[x] = cell - node * states;
        counts[x] = cells.get(cell)!;
        totals[node] += counts[x];
      }
      return { states, maxLength, theta, index, offsets, tags, counts, totals };
    },
  };
}

/**
 * θ of Brants (2000) §2.3: θ = 1/(s−1) · Σ_j (P̂(t_j) − P̄)², P̄ = 1/s · Σ_j P̂(t_j), from the
 * unconditional maximum-likelihood tag probabilities of the training corpus (s tags). The paper's
 * text calls θ the standard deviation of these probabilities while the formula it prints is the
 * sample variance; we follow the printed formula (both recalled from memory of the paper).
 */
export function suffixTheta(tagCounts: Float64Array): number {
  const s = tagCounts.length;
  if (s < 2) return 0;
  const total = tagCounts.reduce((a, b) => a + b, 0);
  if (total <= 0) return 0;
  const mean = 1 / s;
  let sum = 0;
  for (let j = 0; j < s; j++) sum += (tagCounts[j] / total - mean) ** 2;
  return sum / (s - 1);
}

/** Rebuilds statistics from serialized nodes (tags ascending within each node). */
export function createSuffixStatistics(states: number, maxLength: number, theta: number, nodes: ReadonlyArray<[string, SuffixNode]>): SuffixStatistics {
  const index = new Map<string, number>();
  const offsets = new Int32Array(nodes.length + 1);
  nodes.forEach(([key, node], n) => {
    if (index.has(key)) throw new RangeError(`suffix statistics: node ${JSON.stringify(key)} appears twice`);
    index.set(key, n);
    offsets[n + 1] = offsets[n] + node.tags.length;
  });
  const tags = new Int32Array(offsets[nodes.length]);
  const counts = new Float64Array(offsets[nodes.length]);
  const totals = new Float64Array(nodes.length);
  nodes.forEach(([, node], n) => {
    tags.set(node.tags, offsets[n]);
    counts.set(node.counts, offsets[n]);
    for (let x = 0; x < node.counts.length; x++) totals[n] += node.counts[x];
  });
  return { states, maxLength, theta, index, offsets, tags, counts, totals };
}

/**
 * Fills `out` (K) with log(P(t | group, longest known suffix of word) / P̂(t | group)): how much
 * the word's ending shifts the tag distribution of its group. Zero everywhere when the group has
 * no statistics; zero for a tag the group never had (no evidence either way). `scratch` must hold
 * 2K numbers.
 */
export function suffixLogRatio(stats: SuffixStatistics, word: string, group: number, out: Float64Array, scratch: Float64Array): void {
  const K = stats.states;
  if (out.length < K || scratch.length < 2 * K) throw new RangeError(`suffixLogRatio: buffers need K=${K} and 2K entries`);
  out.fill(0, 0, K);
  const root = stats.index.get(nodeKey(group, ""));
  if (root === undefined || stats.totals[root] <= 0) return;
  // scratch[0..K) = root distribution, scratch[K..2K) = current abstraction.
  scratch.fill(0, 0, 2 * K);
  for (let x = stats.offsets[root]; x < stats.offsets[root + 1]; x++) scratch[stats.tags[x]] = stats.counts[x] / stats.totals[root];
  for (let k = 0; k < K; k++) scratch[K + k] = scratch[k];
  const theta = stats.theta;
  const longest = Math.min(stats.maxLength, word.length);
  for (let l = 1; l <= longest; l++) {
    const node = stats.index.get(nodeKey(group, word.slice(word.length - l)));
    // Longer suffixes of an unseen suffix are unseen too: stop at the longest one observed.
    if (node === undefined || stats.totals[node] <= 0) break;
    for (let k = 0; k < K; k++) scratch[K + k] *= theta;
    for (let x = stats.offsets[node]; x < stats.offsets[node + 1]; x++) scratch[K + stats.tags[x]] += stats.counts[x] / stats.totals[node];
    for (let k = 0; k < K; k++) scratch[K + k] /= 1 + theta;
  }
  for (let k = 0; k < K; k++) {
    const base = scratch[k];
    out[k] = base > 0 ? Math.log(scratch[K + k] / base) : 0;
  }
}

/** Serializable form of the nodes: [key, tags, counts] triples in node order. */
export function suffixNodesToJson(stats: SuffixStatistics): Array<[string, number[], number[]]> {
  const out: Array<[string, number[], number[]]> = [];
  for (const [key, n] of stats.index) {
    const from = stats.offsets[n];
    const to = stats.offsets[n + 1];
    out.push([key, Array.from(stats.tags.subarray(from, to)), Array.from(stats.counts.subarray(from, to))]);
  }
  return out;
}
