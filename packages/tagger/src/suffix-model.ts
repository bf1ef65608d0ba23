/**
 * Suffix statistics for unknown words, after Brants (2000), "TnT — a statistical part-of-speech
 * tagger", ANLP, §2.3: tag frequencies of the suffixes (up to a maximum length) of infrequent
 * training words, kept per group (Brants keeps capitalised and uncapitalised words apart; here a
 * group is a word class), combined by successive abstraction (Samuelsson 1996, "Handling sparse
 * data by successive abstraction", COLING):
 *   P(t | l_{n-i+1}..l_n) = (P̂(t | l_{n-i+1}..l_n) + θ·P(t | l_{n-i+2}..l_n)) / (1 + θ),
 * starting from the group's tag distribution P̂(t | group) for the empty suffix.
 */
export type SuffixNode = { readonly tags: Int32Array; readonly counts: Float64Array; readonly total: number };

export type SuffixStatistics = {
  readonly states: number;
  readonly maxLength: number;
  /** Successive-abstraction weight θ (the same for every suffix length, as in Brants 2000). */
  readonly theta: number;
  /** Nodes keyed by `${group}\u0001${suffix}`; the empty suffix is the group's root. */
  readonly nodes: ReadonlyMap<string, SuffixNode>;
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
  const counting = new Map<string, Map<number, number>>();
  const bump = (key: string, tag: number, weight: number) => {
    let node = counting.get(key);
    if (node === undefined) {
      node = new Map();
      counting.set(key, node);
    }
    node.set(tag, (node.get(tag) ?? 0) + weight);
  };
  return {
    add(word, group, tag, weight = 1) {
      if (tag < 0 || tag >= states) throw new RangeError(`suffix statistics: tag ${tag} outside ${states} states`);
      bump(nodeKey(group, ""), tag, weight);
      const longest = Math.min(maxLength, word.length);
      for (let l = 1; l <= longest; l++) bump(nodeKey(group, word.slice(word.length - l)), tag, weight);
    },
    finish(theta) {
      const nodes = new Map<string, SuffixNode>();
      for (const [key, node] of counting) {
        const entries = [...node.entries()].sort((a, b) => a[0] - b[0]);
        const counts = Float64Array.from(entries, (e) => e[1]);
        nodes.set(key, { tags: Int32Array.from(entries, (e) => e[0]), counts, total: counts.reduce((a, b) => a + b, 0) });
      }
      return { states, maxLength, theta, nodes };
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

/** Rebuilds statistics from serialized nodes. */
export function createSuffixStatistics(states: number, maxLength: number, theta: number, nodes: Iterable<[string, SuffixNode]>): SuffixStatistics {
  return { states, maxLength, theta, nodes: new Map(nodes) };
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
  const root = stats.nodes.get(nodeKey(group, ""));
  if (root === undefined || root.total <= 0) return;
  // scratch[0..K) = root distribution, scratch[K..2K) = current abstraction.
  scratch.fill(0, 0, 2 * K);
  for (let x = 0; x < root.tags.length; x++) scratch[root.tags[x]] = root.counts[x] / root.total;
  for (let k = 0; k < K; k++) scratch[K + k] = scratch[k];
  const theta = stats.theta;
  const longest = Math.min(stats.maxLength, word.length);
  for (let l = 1; l <= longest; l++) {
    const node = stats.nodes.get(nodeKey(group, word.slice(word.length - l)));
    // Longer suffixes of an unseen suffix are unseen too: stop at the longest one observed.
    if (node === undefined || node.total <= 0) break;
    for (let k = 0; k < K; k++) scratch[K + k] *= theta;
    for (let x = 0; x < node.tags.length; x++) scratch[K + node.tags[x]] += node.counts[x] / node.total;
    for (let k = 0; k < K; k++) scratch[K + k] /= 1 + theta;
  }
  for (let k = 0; k < K; k++) {
    const base = scratch[k];
    out[k] = base > 0 ? Math.log(scratch[K + k] / base) : 0;
  }
}

/** Serializable form of the nodes: [key, tags, counts] triples in key order. */
export function suffixNodesToJson(stats: SuffixStatistics): Array<[string, number[], number[]]> {
  return [...stats.nodes.entries()].sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0)).map(([key, node]) => [key, Array.from(node.tags), Array.from(node.counts)]);
}
