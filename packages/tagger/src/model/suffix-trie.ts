import type { SuffixStatistics } from "../estimation/suffix-model";

/**
 * The tagging path's view of suffix statistics: a trie over UTF-16 code units read from a
 * word's end, so an unknown word finds its longest known suffix by stepping through typed
 * arrays instead of building a string per suffix length and hashing it (suffixLogRatio's
 * lookup). The statistics' keys are `${group}\u0001${suffix}` (suffix-model.ts); the trie has one
 * root per group and one node per suffix, and a node remembers the statistics node of its suffix
 * (or −1 when only longer suffixes through it were stored).
 *
 * suffixLogRatio's successive abstraction P(t | l_{n-i+1}..l_n) is a function of the shorter
 * suffix's abstraction and the suffix's own counts, so it is memoised per trie node (computed
 * from its parent's row the first time a word passes through), and the final log ratio per
 * deepest node; every number is made by the same operations, in the same order, as in
 * suffixLogRatio, so the rows are bit for bit the ones it gives.
 */
export type SuffixTrie = {
  readonly stats: SuffixStatistics;
  /** Trie node of each group's root (empty suffix), or −1; indexed by group. */
  readonly roots: Int32Array;
  /** Statistics node of each trie node's suffix, or −1. */
  readonly statNode: Int32Array;
  /** Open-addressing child index: slot → (parent node, code unit, child node); childNode 0 = empty. */
  readonly slotParent: Int32Array;
  readonly slotUnit: Uint16Array;
  readonly slotChild: Int32Array;
  /**
   * Memoised rows of 2K numbers per node reached so far (rowOf[node], −1 before): the suffix's
   * abstraction P(t | suffix), then the log ratio against the group's root (NaN until needed).
   */
  readonly rowOf: Int32Array;
  rows: Float64Array;
  rowCount: number;
};

/** Largest group number the trie indexes (groups are word-class ids or 0/1 for capitalisation). */
const MAX_GROUP = 1 << 16;

const SEPARATOR = 0x01;

function slotOf(parent: number, unit: number, mask: number): number {
  let h = Math.imul(parent, 0x9e3779b1) ^ Math.imul(unit + 1, 0x85ebca6b);
  h ^= h >>> 15;
  h = Math.imul(h, 0x2c1b3c6d);
  h ^= h >>> 13;
  return h & mask;
}

function growInt32(array: Int32Array, size: number, fill: number): Int32Array {
  if (array.length >= size) return array;
  const next = new Int32Array(Math.max(size, 2 * array.length)).fill(fill);
  next.set(array);
  return next;
}

/** Builds the trie of a model's suffix statistics (once per model). */
export function createSuffixTrie(stats: SuffixStatistics): SuffixTrie {
  const K = stats.states;
  // Node 0 is a sentinel so that 0 can mark an empty child slot. Every suffix's shorter suffixes
  // are normally stored too, so the trie has about as many nodes as the statistics.
  let nodes = 1;
  let statNode: Int32Array = new Int32Array(stats.index.size + 16).fill(-1);
  let slots = 8;
  while (slots < 2 * statNode.length) slots *= 2;
  let slotParent = new Int32Array(slots);
  let slotUnit = new Uint16Array(slots);
  let slotChild = new Int32Array(slots);
  const rehash = (): void => {
    const parents = slotParent;
    const units = slotUnit;
    const children = slotChild;
    slotParent = new Int32Array(2 * parents.length);
    slotUnit = new Uint16Array(2 * parents.length);
    slotChild = new Int32Array(2 * parents.length);
    const mask = slotChild.length - 1;
    for (let x = 0; x < children.length; x++) {
      if (children[x] === 0) continue;
      let s = slotOf(parents[x], units[x], mask);
      while (slotChild[s] !== 0) s = (s + 1) & mask;
      slotParent[s] = parents[x];
      slotUnit[s] = units[x];
      slotChild[s] = children[x];
    }
  };
  const newNode = (): number => {
    const created = nodes++;
    statNode = growInt32(statNode, nodes, -1);
    return created;
  };
  const child = (parent: number, unit: number): number => {
    const mask = slotChild.length - 1;
    let s = slotOf(parent, unit, mask);
    for (;;) {
      const c = slotChild[s];
      if (c === 0) break;
      if (slotParent[s] === parent && slotUnit[s] === unit) return c;
      s = (s + 1) & mask;
    }
    const created = newNode();
    slotParent[s] = parent;
    slotUnit[s] = unit;
    slotChild[s] = created;
    if (2 * nodes > slotChild.length) rehash();
    return created;
  };
  const rootList: number[] = [];
  for (const [key, n] of stats.index) {
    const cut = key.indexOf(String.fromCharCode(SEPARATOR));
    if (cut < 1) continue;
    const prefix = key.slice(0, cut);
    const group = Number(prefix);
    // Only keys a lookup can produce: `${group}` of a non-negative integer group.
    if (!Number.isInteger(group) || group < 0 || group >= MAX_GROUP || String(group) !== prefix) continue;
    while (rootList.length <= group) rootList.push(-1);
    if (rootList[group] < 0) rootList[group] = newNode();
    let node = rootList[group];
    for (let x = key.length - 1; x > cut; x--) node = child(node, key.charCodeAt(x));
    statNode[node] = n;
  }
  return {
    stats,
    roots: Int32Array.from(rootList),
    statNode,
    slotParent,
    slotUnit,
    slotChild,
    rowOf: new Int32Array(statNode.length).fill(-1),
    rows: new Float64Array(128 * K),
    rowCount: 0,
  };
}

/** Row number of a node's memoised numbers, allocating one on first use. */
function rowFor(trie: SuffixTrie, node: number): number {
  let row = trie.rowOf[node];
  if (row >= 0) return row;
  const K = trie.stats.states;
  row = trie.rowCount++;
  if (trie.rows.length < (row + 1) * 2 * K) {
    const next = new Float64Array(2 * trie.rows.length);
    next.set(trie.rows);
    trie.rows = next;
  }
  trie.rowOf[node] = row;
  return row;
}

/**
 * Adds log(P(t | group, longest known suffix of word) / P̂(t | group)) to out[at..at+K): the
 * numbers suffixLogRatio(trie.stats, word, group, …) computes, by the same operations in the same
 * order, with each suffix's abstraction P(t | suffix) memoised at its node.
 */
export function addSuffixLogRatio(trie: SuffixTrie, word: string, group: number, out: Float64Array, at: number): void {
  const { stats, statNode, slotParent, slotUnit, slotChild } = trie;
  if (!(group >= 0 && group < trie.roots.length)) return;
  const root = trie.roots[group];
  if (root < 0) return;
  const rootStat = statNode[root];
  if (rootStat < 0 || stats.totals[rootStat] <= 0) return;
  const K = stats.states;
  const { offsets, tags, counts, totals, theta } = stats;
  let row = trie.rowOf[root];
  if (row < 0) {
    // Row layout: [P(t | suffix) (K) | log ratio (K), NaN until computed].
    row = rowFor(trie, root);
    const rows = trie.rows;
    const base = 2 * K * row;
    rows.fill(0, base, base + K);
    for (let x = offsets[rootStat]; x < offsets[rootStat + 1]; x++) rows[base + tags[x]] = counts[x] / totals[rootStat];
    rows.fill(NaN, base + K, base + 2 * K);
  }
  const rootRow = row;
  const mask = slotChild.length - 1;
  const longest = Math.min(stats.maxLength, word.length);
  let node = root;
  for (let l = 1; l <= longest; l++) {
    const unit = word.charCodeAt(word.length - l);
    let s = slotOf(node, unit, mask);
    let next = -1;
    for (;;) {
      const c = slotChild[s];
      if (c === 0) break;
      if (slotParent[s] === node && slotUnit[s] === unit) {
        next = c;
        break;
      }
      s = (s + 1) & mask;
    }
    // Longer suffixes of an unseen suffix are unseen too: stop at the longest one observed.
    if (next < 0) break;
    const n = statNode[next];
    if (n < 0 || totals[n] <= 0) break;
    let child = trie.rowOf[next];
    if (child < 0) {
      child = rowFor(trie, next);
      const rows = trie.rows;
      const from = 2 * K * row;
      const to = 2 * K * child;
      for (let k = 0; k < K; k++) rows[to + k] = rows[from + k] * theta;
      for (let x = offsets[n]; x < offsets[n + 1]; x++) rows[to + tags[x]] += counts[x] / totals[n];
      for (let k = 0; k < K; k++) rows[to + k] /= 1 + theta;
      rows.fill(NaN, to + K, to + 2 * K);
    }
    node = next;
    row = child;
  }
  const rows = trie.rows;
  const r = 2 * K * row;
  if (Number.isNaN(rows[r + K])) {
    const b = 2 * K * rootRow;
    for (let k = 0; k < K; k++) {
      const base = rows[b + k];
      rows[r + K + k] = base > 0 ? Math.log(rows[r + k] / base) : 0;
    }
  }
  for (let k = 0; k < K; k++) out[at + k] += rows[r + K + k];
}
