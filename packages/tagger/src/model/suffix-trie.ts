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
  /** Memoised row of each root (see `slots`), indexed by group. */
  readonly rootRows: Int32Array;
  /** Statistics node of each trie node's suffix, or −1. */
  readonly statNode: Int32Array;
  /**
   * Open-addressing child index of 4-int slots, one per trie edge and so one per non-root node,
   * holding what a walk needs in one cache line: parent node, code unit, child node (0 = empty
   * slot), and the child's state: −2 when its suffix has no statistics (or a zero total; the walk
   * stops there), −1 before its row is computed, else its row number.
   */
  slots: Int32Array;
  /**
   * Memoised rows of 2K numbers per node reached so far: the suffix's abstraction P(t | suffix),
   * then the log ratio against the group's root (NaN until needed).
   */
  rows: Float64Array;
  rowCount: number;
};

/** Largest group number the trie indexes (groups are word-class ids or 0/1 for capitalisation). */
const MAX_GROUP = 1 << 16;

const SEPARATOR = 0x01;
const SLOT = 4;
const NO_STATISTICS = -2;
const NO_ROW = -1;

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
  let capacity = 8;
  while (capacity < 2 * statNode.length) capacity *= 2;
  let slots = new Int32Array(SLOT * capacity);
  const place = (table: Int32Array, parent: number, unit: number, child: number, state: number): void => {
    const mask = table.length / SLOT - 1;
    let i = slotOf(parent, unit, mask);
    while (table[SLOT * i + 2] !== 0) i = (i + 1) & mask;
    const x = SLOT * i;
    table[x] = parent;
    table[x + 1] = unit;
    table[x + 2] = child;
    table[x + 3] = state;
  };
  const newNode = (): number => {
    const created = nodes++;
    statNode = growInt32(statNode, nodes, -1);
    return created;
  };
  const child = (parent: number, unit: number): number => {
    const mask = slots.length / SLOT - 1;
    for (let i = slotOf(parent, unit, mask); ; i = (i + 1) & mask) {
      const x = SLOT * i;
      const c = slots[x + 2];
      if (c === 0) break;
      if (slots[x] === parent && slots[x + 1] === unit) return c;
    }
    const created = newNode();
    place(slots, parent, unit, created, NO_STATISTICS);
    if (2 * nodes > slots.length / SLOT) {
      const old = slots;
      slots = new Int32Array(2 * old.length);
      for (let x = 0; x < old.length; x += SLOT) if (old[x + 2] !== 0) place(slots, old[x], old[x + 1], old[x + 2], old[x + 3]);
    }
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
  // The walk's stopping rule, stored with each edge: no statistics, or a zero total.
  for (let x = 0; x < slots.length; x += SLOT) {
    if (slots[x + 2] === 0) continue;
    const n = statNode[slots[x + 2]];
    slots[x + 3] = n < 0 || stats.totals[n] <= 0 ? NO_STATISTICS : NO_ROW;
  }
  return {
    stats,
    roots: Int32Array.from(rootList),
    rootRows: new Int32Array(rootList.length).fill(NO_ROW),
    statNode,
    slots,
    rows: new Float64Array(Math.max(64, nodes >> 3) * 2 * K),
    rowCount: 0,
  };
}

/** A new row number (rows grow by doubling). */
function newRow(trie: SuffixTrie): number {
  const K = trie.stats.states;
  const row = trie.rowCount++;
  if (trie.rows.length < (row + 1) * 2 * K) {
    const next = new Float64Array(2 * trie.rows.length);
    next.set(trie.rows);
    trie.rows = next;
  }
  return row;
}

/**
 * The memoised row of the longest known suffix of a word in a group: its K log ratios
 * log(P(t | group, suffix) / P̂(t | group)) are trie.rows[2K·row + K ..+K), the numbers
 * suffixLogRatio(trie.stats, word, group, …) computes, by the same operations in the same order.
 * −1 when suffixLogRatio gives zeros without computing (no statistics for the group); words
 * with the same row get the same numbers.
 */
export function suffixRatioRow(trie: SuffixTrie, word: string, group: number): number {
  const { stats, statNode } = trie;
  if (!(group >= 0 && group < trie.roots.length)) return -1;
  const root = trie.roots[group];
  if (root < 0) return -1;
  const rootStat = statNode[root];
  if (rootStat < 0 || stats.totals[rootStat] <= 0) return -1;
  const K = stats.states;
  const { offsets, tags, counts, totals, theta } = stats;
  let row = trie.rootRows[group];
  if (row < 0) {
    // Row layout: [P(t | suffix) (K) | log ratio (K), NaN until computed].
    row = newRow(trie);
    trie.rootRows[group] = row;
    const rows = trie.rows;
    const base = 2 * K * row;
    rows.fill(0, base, base + K);
    for (let x = offsets[rootStat]; x < offsets[rootStat + 1]; x++) rows[base + tags[x]] = counts[x] / totals[rootStat];
    rows.fill(NaN, base + K, base + 2 * K);
  }
  const rootRow = row;
  const slots = trie.slots;
  const mask = slots.length / SLOT - 1;
  const longest = Math.min(stats.maxLength, word.length);
  let node = root;
  for (let l = 1; l <= longest; l++) {
    const unit = word.charCodeAt(word.length - l);
    let found = -1;
    for (let i = slotOf(node, unit, mask); ; i = (i + 1) & mask) {
      const x = SLOT * i;
      const c = slots[x + 2];
      if (c === 0) break;
      if (slots[x] === node && slots[x + 1] === unit) {
        found = x;
        break;
      }
    }
    // Longer suffixes of an unseen suffix are unseen too: stop at the longest one observed.
    if (found < 0) break;
    let child = slots[found + 3];
    if (child === NO_STATISTICS) break;
    node = slots[found + 2];
    if (child === NO_ROW) {
      child = newRow(trie);
      slots[found + 3] = child;
      const n = statNode[node];
      const rows = trie.rows;
      const from = 2 * K * row;
      const to = 2 * K * child;
      for (let k = 0; k < K; k++) rows[to + k] = rows[from + k] * theta;
      for (let x = offsets[n]; x < offsets[n + 1]; x++) rows[to + tags[x]] += counts[x] / totals[n];
      for (let k = 0; k < K; k++) rows[to + k] /= 1 + theta;
      rows.fill(NaN, to + K, to + 2 * K);
    }
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
  return row;
}

/** Adds the log ratios of {@link suffixRatioRow} to out[at..at+K) (nothing for −1). */
export function addSuffixLogRatio(trie: SuffixTrie, word: string, group: number, out: Float64Array, at: number): void {
  const row = suffixRatioRow(trie, word, group);
  if (row < 0) return;
  const K = trie.stats.states;
  const rows = trie.rows;
  for (let k = 0, from = 2 * K * row + K; k < K; k++) out[at + k] += rows[from + k];
}
