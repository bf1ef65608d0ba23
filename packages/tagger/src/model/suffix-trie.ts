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
 * suffix's abstraction and the suffix's own counts, so it is computed once per node when the
 * trie is built (parents before children) and a word only walks to its deepest node; every
 * number is made by the same operations, in the same order, as in suffixLogRatio, so the log
 * ratios are bit for bit the ones it gives.
 */
export type SuffixTrie = {
  readonly stats: SuffixStatistics;
  /** Trie node of each group's root (empty suffix), or −1 (also when the root has no usable counts); indexed by group. */
  readonly roots: Int32Array;
  /**
   * Open-addressing child index of 4-int slots, one per trie edge and so one per non-root node,
   * holding what a walk needs in one cache line: parent node, code unit, child node (0 = empty
   * slot), and 1 when the walk may go on to the child (its suffix and all shorter ones have
   * statistics with a positive total), else 0.
   */
  readonly slots: Int32Array;
  /** K numbers per node: P(t | suffix) by successive abstraction (reachable nodes only). */
  readonly abstraction: Float64Array;
};

/** Largest group number the trie indexes (groups are word-class ids or 0/1 for capitalisation). */
const MAX_GROUP = 1 << 16;

const SEPARATOR = 0x01;
const SLOT = 4;

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

/** Builds the trie of a model's suffix statistics and every reachable node's abstraction (once per model). */
export function createSuffixTrie(stats: SuffixStatistics): SuffixTrie {
  const K = stats.states;
  const { offsets, tags, counts, totals, theta } = stats;
  // Node 0 is a sentinel so that 0 can mark an empty child slot. Every suffix's shorter suffixes
  // are normally stored too, so the trie has about as many nodes as the statistics.
  let nodes = 1;
  let statNode: Int32Array = new Int32Array(stats.index.size + 16).fill(-1);
  let parentOf: Int32Array = new Int32Array(statNode.length);
  let depthOf: Int32Array = new Int32Array(statNode.length);
  /** Slot offset of each non-root node's edge. */
  let edgeOf: Int32Array = new Int32Array(statNode.length).fill(-1);
  let capacity = 8;
  while (3 * capacity < 4 * statNode.length) capacity *= 2;
  let slots = new Int32Array(SLOT * capacity);
  const place = (table: Int32Array, parent: number, unit: number, child: number, state: number): number => {
    const mask = table.length / SLOT - 1;
    let i = slotOf(parent, unit, mask);
    while (table[SLOT * i + 2] !== 0) i = (i + 1) & mask;
    const x = SLOT * i;
    table[x] = parent;
    table[x + 1] = unit;
    table[x + 2] = child;
    table[x + 3] = state;
    return x;
  };
  const newNode = (parent: number, depth: number): number => {
    const created = nodes++;
    statNode = growInt32(statNode, nodes, -1);
    parentOf = growInt32(parentOf, nodes, 0);
    depthOf = growInt32(depthOf, nodes, 0);
    edgeOf = growInt32(edgeOf, nodes, -1);
    parentOf[created] = parent;
    depthOf[created] = depth;
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
    const created = newNode(parent, depthOf[parent] + 1);
    edgeOf[created] = place(slots, parent, unit, created, 0);
    if (4 * nodes > 3 * (slots.length / SLOT)) {
      const old = slots;
      slots = new Int32Array(2 * old.length);
      for (let x = 0; x < old.length; x += SLOT) if (old[x + 2] !== 0) edgeOf[old[x + 2]] = place(slots, old[x], old[x + 1], old[x + 2], old[x + 3]);
    }
    return created;
  };
  const rootList: number[] = [];
  let deepest = 0;
  for (const [key, n] of stats.index) {
    const cut = key.indexOf(String.fromCharCode(SEPARATOR));
    if (cut < 1) continue;
    const prefix = key.slice(0, cut);
    const group = Number(prefix);
    // Only keys a lookup can produce: `${group}` of a non-negative integer group.
    if (!Number.isInteger(group) || group < 0 || group >= MAX_GROUP || String(group) !== prefix) continue;
    while (rootList.length <= group) rootList.push(-1);
    if (rootList[group] < 0) rootList[group] = newNode(0, 0);
    let node = rootList[group];
    for (let x = key.length - 1; x > cut; x--) node = child(node, key.charCodeAt(x));
    statNode[node] = n;
    deepest = Math.max(deepest, key.length - cut - 1);
  }
  // Abstractions in order of depth, so that a parent's row is ready before its children's; a
  // node is reachable when it and every shorter suffix have statistics with a positive total
  // (suffixLogRatio stops at the first that has not).
  const usable = (node: number): boolean => statNode[node] >= 0 && totals[statNode[node]] > 0;
  const reachable = new Uint8Array(nodes);
  const abstraction = new Float64Array(nodes * K);
  const byDepth = new Int32Array(deepest + 2);
  for (let v = 1; v < nodes; v++) byDepth[depthOf[v] + 1]++;
  for (let d = 0; d <= deepest; d++) byDepth[d + 1] += byDepth[d];
  const order = new Int32Array(nodes - 1);
  const fill = byDepth.slice();
  for (let v = 1; v < nodes; v++) order[fill[depthOf[v]]++] = v;
  for (const v of order) {
    if (!usable(v)) continue;
    const n = statNode[v];
    const to = v * K;
    if (depthOf[v] === 0) {
      reachable[v] = 1;
      for (let x = offsets[n]; x < offsets[n + 1]; x++) abstraction[to + tags[x]] = counts[x] / totals[n];
      continue;
    }
    const parent = parentOf[v];
    if (reachable[parent] === 0) continue;
    reachable[v] = 1;
    slots[edgeOf[v] + 3] = 1;
    const from = parent * K;
    for (let k = 0; k < K; k++) abstraction[to + k] = abstraction[from + k] * theta;
    for (let x = offsets[n]; x < offsets[n + 1]; x++) abstraction[to + tags[x]] += counts[x] / totals[n];
    for (let k = 0; k < K; k++) abstraction[to + k] /= 1 + theta;
  }
  return { stats, roots: Int32Array.from(rootList, (root) => (root >= 0 && reachable[root] === 1 ? root : -1)), slots, abstraction };
}

/**
 * The trie node of the longest known suffix of a word in a group (the group's root when none is
 * known), or −1 when suffixLogRatio gives zeros without computing (no statistics for the
 * group). Words with the same node get the same log ratios ({@link addNodeLogRatio}).
 */
export function suffixNode(trie: SuffixTrie, word: string, group: number): number {
  if (!(group >= 0 && group < trie.roots.length)) return -1;
  const root = trie.roots[group];
  if (root < 0) return -1;
  const slots = trie.slots;
  const mask = slots.length / SLOT - 1;
  const longest = Math.min(trie.stats.maxLength, word.length);
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
    if (found < 0 || slots[found + 3] === 0) break;
    node = slots[found + 2];
  }
  return node;
}

/**
 * Adds log(P(t | group, suffix of `node`) / P̂(t | group)) to out[at..at+K), as suffixLogRatio
 * computes it (0 for a tag the group never had).
 */
export function addNodeLogRatio(trie: SuffixTrie, group: number, node: number, out: Float64Array, at: number): void {
  const K = trie.stats.states;
  const { abstraction } = trie;
  const b = trie.roots[group] * K;
  const p = node * K;
  for (let k = 0; k < K; k++) {
    const base = abstraction[b + k];
    out[at + k] += base > 0 ? Math.log(abstraction[p + k] / base) : 0;
  }
}

/** suffixLogRatio(trie.stats, word, group, …) added to out[at..at+K) (nothing when it is all zeros without computing). */
export function addSuffixLogRatio(trie: SuffixTrie, word: string, group: number, out: Float64Array, at: number): void {
  const node = suffixNode(trie, word, group);
  if (node >= 0) addNodeLogRatio(trie, group, node, out, at);
}
