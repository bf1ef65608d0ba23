/**
 * Word clusters learned from unlabelled text: class-based bigram clustering (Brown, deSouza,
 * Mercer, Della Pietra & Lai 1992, "Class-based n-gram models of natural language",
 * Computational Linguistics 18(4), §3). Clusters are merged greedily so that each merge loses as
 * little average mutual information (AMI) between the clusters of adjacent words as possible:
 *   I = Σ_{l,r} p(l, r) · log( p(l, r) / (pl(l) · pr(r)) ),
 * p(l, r) the share of bigrams whose left word is in cluster l and right word in cluster r, pl and
 * pr the left and right marginals. A merge of s and t changes only the terms that involve s or t,
 * so its effect Δ(s, t) costs O(m) from scratch and O(1) to update after an unrelated merge
 * (Brown et al. §3, the bookkeeping that makes each merge step O(m²)).
 *
 * Scale: the bounded-window variant (Liang 2005, "Semi-supervised learning for natural language",
 * MIT M.Eng. thesis, §3): word types are sorted by frequency, the m most frequent start as
 * clusters, and each further type enters as a singleton cluster after which the best of the m + 1
 * clusters' pairs is merged, so at most m + 1 clusters are ever active. The m clusters left when
 * every type has entered are the output; merging them on down to one cluster gives the binary
 * tree whose root-to-cluster paths are the clusters' bit strings. While a type has not entered,
 * its bigrams are left out of p(l, r); the marginals pl and pr always count every bigram, so the
 * objective is Brown's AMI once all types are in.
 *
 * Bigrams are taken inside sentences. Deterministic: types are ranked by count, ties by first
 * appearance; a tie between merges goes to the pair whose clusters hold the more frequent words
 * (smaller lowest rank, then smaller second rank).
 */
import { addCount, createCountTable } from "./count-table";

/** The clustering of a text's word types. */
export type WordClusters = {
  /** Clustered word types, most frequent first. */
  readonly words: readonly string[];
  /** Cluster id (index into `paths`) of each word of `words`. */
  readonly cluster: Int32Array;
  /** Bit string of each cluster: its path from the root of the merge tree ("0" left, "1" right). */
  readonly paths: readonly string[];
  /** Word → index into `words` (built from `words`, not serialized). */
  readonly index: ReadonlyMap<string, number>;
};

/** One merge, reported to {@link BrownOptions.onMerge}. */
export type MergeEvent = {
  /** "window" while types still enter, "tree" for the merges above the m output clusters. */
  readonly phase: "window" | "tree";
  /** Lowest word rank in each of the two merged clusters (the first is the more frequent). */
  readonly merged: readonly [number, number];
  /** AMI of the clustering after the merge (natural log), over the bigrams of entered words. */
  readonly ami: number;
  /** Cluster of each word rank after the merge (−1: not entered yet), as the lowest rank in its cluster. */
  readonly assignment: () => Int32Array;
};

export type BrownOptions = {
  /** Number of clusters m (≥ 1); fewer when the text has fewer types. */
  readonly clusters: number;
  /** Types seen fewer times are left out (default 1: every type). */
  readonly minCount?: number;
  /** Called after every merge (tests check the AMI bookkeeping with it). */
  readonly onMerge?: (event: MergeEvent) => void;
};

/** Word types ranked by count (ties by first appearance) and the sentences encoded as ranks (−1: left out). */
export function rankWordTypes(sentences: readonly (readonly string[])[], minCount = 1): { words: string[]; counts: Float64Array; encoded: Int32Array[] } {
  const counts = new Map<string, number>();
  for (const s of sentences) for (const w of s) counts.set(w, (counts.get(w) ?? 0) + 1);
  const entries = [...counts].map(([word, count], order) => ({ word, count, order })).filter((e) => e.count >= minCount);
  entries.sort((a, b) => b.count - a.count || a.order - b.order);
  const rank = new Map<string, number>();
  entries.forEach((e, r) => rank.set(e.word, r));
  const encoded = sentences.map((s) => Int32Array.from(s, (w) => rank.get(w) ?? -1));
  return { words: entries.map((e) => e.word), counts: Float64Array.from(entries, (e) => e.count), encoded };
}

/** Sparse bigram counts of the ranked types in compressed rows, both directions. */
type Bigrams = {
  readonly total: number;
  /** Per type: bigrams with it on the left / on the right. */
  readonly left: Float64Array;
  readonly right: Float64Array;
  /** Right neighbours of type a: rightTo[rightOffsets[a]..rightOffsets[a+1]) with counts. */
  readonly rightOffsets: Int32Array;
  readonly rightTo: Int32Array;
  readonly rightCount: Float64Array;
  /** Left neighbours of type b, the same way. */
  readonly leftOffsets: Int32Array;
  readonly leftFrom: Int32Array;
  readonly leftCount: Float64Array;
};

function countBigrams(encoded: readonly Int32Array[], V: number): Bigrams {
  // Types 0..V−1 are words, V the sentence boundary: each sentence reads B w1 … wn B.
  const T = V + 1;
  const table = createCountTable(1024);
  const left = new Float64Array(T);
  const right = new Float64Array(T);
  let total = 0;
  const add = (a: number, b: number) => {
    if (a < 0 || b < 0) return;
    addCount(table, a * T + b, 1);
    left[a]++;
    right[b]++;
    total++;
  };
  for (const s of encoded) {
    if (s.length === 0) continue;
    add(V, s[0]);
    for (let i = 1; i < s.length; i++) add(s[i - 1], s[i]);
    add(s[s.length - 1], V);
  }
  const rightOffsets = new Int32Array(T + 1);
  const leftOffsets = new Int32Array(T + 1);
  for (let e = 0; e < table.size; e++) {
    const key = table.keys[e];
    const b = key % T;
    rightOffsets[(key - b) / T + 1]++;
    leftOffsets[b + 1]++;
  }
  for (let a = 0; a < T; a++) {
    rightOffsets[a + 1] += rightOffsets[a];
    leftOffsets[a + 1] += leftOffsets[a];
  }
  const rightFill = rightOffsets.slice(0, T);
  const leftFill = leftOffsets.slice(0, T);
  const rightTo = new Int32Array(table.size);
  const rightCount = new Float64Array(table.size);
  const leftFrom = new Int32Array(table.size);
  const leftCount = new Float64Array(table.size);
  for (let e = 0; e < table.size; e++) {
    const key = table.keys[e];
    const b = key % T;
    const a = (key - b) / T;
    const x = rightFill[a]++;
    rightTo[x] = b;
    rightCount[x] = table.values[e];
    const y = leftFill[b]++;
    leftFrom[y] = a;
    leftCount[y] = table.values[e];
  }
  return { total, left, right, rightOffsets, rightTo, rightCount, leftOffsets, leftFrom, leftCount };
}

/**
 * Clusters the word types of `sentences` (bounded window of m = options.clusters, see the file
 * comment). Every type seen at least `minCount` times gets a cluster; O(V·m²) time, O(m²) memory
 * besides the bigram counts. Throws RangeError for m < 1.
 */
export function learnBrownClusters(sentences: readonly (readonly string[])[], options: BrownOptions): WordClusters {
  const m = options.clusters;
  if (!Number.isInteger(m) || m < 1) throw new RangeError(`learnBrownClusters: clusters must be an integer ≥ 1, got ${m}`);
  const minCount = options.minCount ?? 1;
  if (!Number.isInteger(minCount) || minCount < 1) throw new RangeError(`learnBrownClusters: minCount must be an integer ≥ 1, got ${minCount}`);
  const { words, encoded } = rankWordTypes(sentences, minCount);
  const V = words.length;
  if (V === 0) return { words, cluster: new Int32Array(0), paths: [], index: new Map() };
  const bigrams = countBigrams(encoded, V);
  const N = bigrams.total;
  const lnN = Math.log(N);
  // n·ln n for every count up to N, so that a term needs no logarithm of its own. Every q, Δ and
  // AMI below is scaled by N: q̃(n, a, b) = N·q = n·ln n + n·(ln N − ln a − ln b).
  const xlogx = new Float64Array(N + 1);
  for (let n = 2; n <= N; n++) xlogx[n] = n * Math.log(n);
  const qq = (n: number, lnA: number, lnB: number) => (n > 0 ? xlogx[n] + n * (lnN - lnA - lnB) : 0);

  // Slots 1..A−1 hold the active clusters, contiguous (a merge moves the last slot into the freed
  // one); slot 0 is the sentence boundary, a cluster of its own that never merges. At most m + 1
  // clusters are active. Matrices are M×M, row-major; each one's transpose or mirror is kept too,
  // so that every inner loop reads rows.
  const M = Math.min(m, V) + 2;
  const n2 = new Int32Array(M * M); // n2[a·M + b]: bigrams with the left word in a, the right in b
  const n2T = new Int32Array(M * M); // n2T[b·M + a] = n2[a·M + b]
  const Q = new Float64Array(M * M); // q̃ of n2's cells
  const QT = new Float64Array(M * M);
  const D = new Float64Array(M * M); // Δ̃ of merging two slots, symmetric
  const mergedLnLeft = new Float64Array(M * M); // ln(nl[s] + nl[t]), symmetric
  const mergedLnRight = new Float64Array(M * M);
  const nl = new Float64Array(M);
  const nr = new Float64Array(M);
  const lnl = new Float64Array(M);
  const lnr = new Float64Array(M);
  /** Lowest word rank in the slot's cluster (V for the boundary): the cluster's name. */
  const key = new Int32Array(M);
  const node = new Int32Array(M);
  const mark = new Int32Array(M);
  const neighbours = new Int32Array(M);
  let A = 0;
  // Per type (V = the boundary): the name of its cluster (−1 before it enters); per name: its slot
  // and its member list.
  const clusterOfWord = new Int32Array(V + 1).fill(-1);
  const slotOf = new Int32Array(V + 1).fill(-1);
  const head = new Int32Array(V + 1).fill(-1);
  const tail = new Int32Array(V + 1).fill(-1);
  const next = new Int32Array(V + 1).fill(-1);
  // Merge tree above the output clusters: node ids ≥ V are internal (children in `children`).
  const children: number[] = [];
  let ami = 0;

  /** Δ̃(s, t): N × (the AMI after merging s and t minus the AMI now), from scratch (O(m)). */
  const deltaFromScratch = (s: number, t: number): number => {
    const sRow = s * M;
    const tRow = t * M;
    const lnlM = mergedLnLeft[sRow + t];
    const lnrM = mergedLnRight[sRow + t];
    let sum = 0;
    for (let x = 0; x < A; x++) {
      if (x === s || x === t) continue;
      const into = n2T[sRow + x] + n2T[tRow + x];
      const out = n2[sRow + x] + n2[tRow + x];
      if (into > 0) sum += xlogx[into] + into * (lnN - lnl[x] - lnrM) - QT[sRow + x] - QT[tRow + x];
      if (out > 0) sum += xlogx[out] + out * (lnN - lnlM - lnr[x]) - Q[sRow + x] - Q[tRow + x];
    }
    const self = n2[sRow + s] + n2[sRow + t] + n2[tRow + s] + n2[tRow + t];
    return sum + qq(self, lnlM, lnrM) - Q[sRow + s] - Q[sRow + t] - Q[tRow + s] - Q[tRow + t];
  };

  /** Recomputes everything cached about slot z against the other active slots. */
  const refresh = (z: number) => {
    lnl[z] = Math.log(nl[z]);
    lnr[z] = Math.log(nr[z]);
    const zRow = z * M;
    for (let x = 0; x < A; x++) {
      const xRow = x * M;
      const out = qq(n2[zRow + x], lnl[z], lnr[x]);
      const into = qq(n2T[zRow + x], lnl[x], lnr[z]);
      Q[zRow + x] = out;
      QT[xRow + z] = out;
      Q[xRow + z] = into;
      QT[zRow + x] = into;
      if (x !== z) {
        mergedLnLeft[zRow + x] = mergedLnLeft[xRow + z] = Math.log(nl[z] + nl[x]);
        mergedLnRight[zRow + x] = mergedLnRight[xRow + z] = Math.log(nr[z] + nr[x]);
      }
    }
    if (z === 0) return;
    for (let x = 1; x < A; x++) {
      if (x !== z) D[zRow + x] = D[x * M + z] = deltaFromScratch(z, x);
    }
  };

  /**
   * Lists the mergeable slots other than `a` and `b` that share a bigram with a or b, marking each
   * with its list position + 1: only pairs that touch one of them see their Δ̃ change.
   */
  const listNeighbours = (a: number, b: number): number => {
    let count = 0;
    const aRow = a * M;
    const bRow = b * M;
    for (let x = 1; x < A; x++) {
      mark[x] = 0;
      if (x === a || x === b) continue;
      if (n2[aRow + x] !== 0 || n2T[aRow + x] !== 0 || (b >= 0 && (n2[bRow + x] !== 0 || n2T[bRow + x] !== 0))) {
        neighbours[count++] = x;
        mark[x] = count;
      }
    }
    return count;
  };

  const enter = (r: number) => {
    const z = A++;
    const zRow = z * M;
    for (let x = 0; x < A; x++) {
      n2[zRow + x] = 0;
      n2[x * M + z] = 0;
      n2T[zRow + x] = 0;
      n2T[x * M + z] = 0;
    }
    clusterOfWord[r] = r;
    slotOf[r] = z;
    head[r] = r;
    tail[r] = r;
    for (let e = bigrams.rightOffsets[r]; e < bigrams.rightOffsets[r + 1]; e++) {
      const name = clusterOfWord[bigrams.rightTo[e]];
      if (name >= 0) n2[zRow + slotOf[name]] += bigrams.rightCount[e];
    }
    for (let e = bigrams.leftOffsets[r]; e < bigrams.leftOffsets[r + 1]; e++) {
      const a = bigrams.leftFrom[e];
      const name = clusterOfWord[a];
      if (name >= 0 && a !== r) n2[slotOf[name] * M + z] += bigrams.leftCount[e];
    }
    for (let x = 0; x < A; x++) {
      n2T[x * M + z] = n2[zRow + x];
      n2T[zRow + x] = n2[x * M + z];
    }
    nl[z] = bigrams.left[r];
    nr[z] = bigrams.right[r];
    key[z] = r;
    node[z] = r;
    refresh(z);
    if (z === 0) {
      ami += Q[0];
      return;
    }
    // The new cluster adds its terms to the Δ̃ of every pair it shares a bigram with.
    const count = listNeighbours(z, -1);
    const lz = lnl[z];
    const rz = lnr[z];
    for (let a = 0; a < count; a++) {
      const s = neighbours[a];
      const sRow = s * M;
      const zs = n2[zRow + s];
      const sz = n2T[zRow + s];
      const qzs = Q[zRow + s];
      const qsz = QT[zRow + s];
      for (let t = 1; t < z; t++) {
        if (t === s || (mark[t] !== 0 && mark[t] < mark[s])) continue;
        const into = zs + n2[zRow + t];
        const out = sz + n2T[zRow + t];
        let change = 0;
        if (into > 0) change += qq(into, lz, mergedLnRight[sRow + t]) - qzs - Q[zRow + t];
        if (out > 0) change += qq(out, mergedLnLeft[sRow + t], rz) - qsz - QT[zRow + t];
        D[sRow + t] += change;
        D[t * M + s] = D[sRow + t];
      }
    }
    for (let x = 0; x < A; x++) {
      ami += Q[zRow + x];
      if (x !== z) ami += Q[x * M + z];
    }
  };

  const assignment = (): Int32Array => clusterOfWord.slice(0, V);

  /** True when the pair (s, t) comes before (bu, bv) in the tie order (more frequent words first). */
  const pairBefore = (s: number, t: number, bu: number, bv: number): boolean => {
    if (bu < 0) return true;
    const a1 = Math.min(key[s], key[t]);
    const b1 = Math.min(key[bu], key[bv]);
    if (a1 !== b1) return a1 < b1;
    return Math.max(key[s], key[t]) < Math.max(key[bu], key[bv]);
  };

  /** Moves slot `from` into slot `to` (rows, then columns, of every matrix). */
  const moveSlot = (from: number, to: number) => {
    const fRow = from * M;
    const tRow = to * M;
    for (const matrix of [n2, n2T, Q, QT, D, mergedLnLeft, mergedLnRight]) {
      matrix.copyWithin(tRow, fRow, fRow + A);
      for (let x = 0; x < A; x++) matrix[x * M + to] = matrix[x * M + from];
    }
    for (const vector of [nl, nr, lnl, lnr, key, node]) vector[to] = vector[from];
    slotOf[key[to]] = to;
  };

  const mergeBest = (phase: MergeEvent["phase"]) => {
    let bu = -1;
    let bv = -1;
    let best = -Infinity;
    for (let s = 1; s < A; s++) {
      const sRow = s * M;
      for (let t = s + 1; t < A; t++) {
        const d = D[sRow + t];
        if (d > best || (d === best && pairBefore(s, t, bu, bv))) {
          best = d;
          bu = s;
          bv = t;
        }
      }
    }
    // u keeps the merged cluster w: the one with the more frequent word, so names stay lowest ranks.
    let u = bu;
    let v = bv;
    if (key[v] < key[u]) [u, v] = [v, u];
    // Every pair (s, t) sharing a bigram with u or v trades its terms with u and v for those with w.
    const count = listNeighbours(u, v);
    const uRow = u * M;
    const vRow = v * M;
    const lw = mergedLnLeft[uRow + v];
    const rw = mergedLnRight[uRow + v];
    for (let a = 0; a < count; a++) {
      const s = neighbours[a];
      const sRow = s * M;
      const us = n2[uRow + s];
      const vs = n2[vRow + s];
      const su = n2T[uRow + s];
      const sv = n2T[vRow + s];
      const ws = us + vs;
      const sw = su + sv;
      const qus = Q[uRow + s];
      const qvs = Q[vRow + s];
      const qsu = QT[uRow + s];
      const qsv = QT[vRow + s];
      const qws = qq(ws, lw, lnr[s]);
      const qsw = qq(sw, lnl[s], rw);
      for (let t = 1; t < A; t++) {
        if (t === s || t === u || t === v || (mark[t] !== 0 && mark[t] < mark[s])) continue;
        const lst = mergedLnLeft[sRow + t];
        const rst = mergedLnRight[sRow + t];
        let change = 0;
        // Terms with u, with v and with w = u + v: left of s+t, then right of it.
        const ut = n2[uRow + t];
        const vt = n2[vRow + t];
        if (us + ut > 0) change -= qq(us + ut, lnl[u], rst) - qus - Q[uRow + t];
        if (vs + vt > 0) change -= qq(vs + vt, lnl[v], rst) - qvs - Q[vRow + t];
        const wt = ut + vt;
        if (ws + wt > 0) change += qq(ws + wt, lw, rst) - qws - qq(wt, lw, lnr[t]);
        const tu = n2T[uRow + t];
        const tv = n2T[vRow + t];
        if (su + tu > 0) change -= qq(su + tu, lst, lnr[u]) - qsu - QT[uRow + t];
        if (sv + tv > 0) change -= qq(sv + tv, lst, lnr[v]) - qsv - QT[vRow + t];
        const tw = tu + tv;
        if (sw + tw > 0) change += qq(sw + tw, lst, rw) - qsw - qq(tw, lnl[t], rw);
        D[sRow + t] += change;
        D[t * M + s] = D[sRow + t];
      }
    }
    ami += best;
    const self = n2[uRow + u] + n2[uRow + v] + n2[vRow + u] + n2[vRow + v];
    for (let x = 0; x < A; x++) {
      if (x === u || x === v) continue;
      n2[uRow + x] += n2[vRow + x];
      n2T[uRow + x] += n2T[vRow + x];
      n2[x * M + u] = n2T[uRow + x];
      n2T[x * M + u] = n2[uRow + x];
    }
    n2[uRow + u] = self;
    n2T[uRow + u] = self;
    nl[u] += nl[v];
    nr[u] += nr[v];
    const kept = key[u];
    const gone = key[v];
    for (let w = head[gone]; w >= 0; w = next[w]) clusterOfWord[w] = kept;
    next[tail[kept]] = head[gone];
    tail[kept] = tail[gone];
    slotOf[gone] = -1;
    if (phase === "tree") {
      children.push(node[u], node[v]);
      node[u] = V + children.length / 2 - 1;
    }
    const last = A - 1;
    if (v !== last) {
      moveSlot(last, v);
      if (u === last) u = v;
    }
    A--;
    refresh(u);
    if (options.onMerge !== undefined) options.onMerge({ phase, merged: [kept, gone], ami: ami / N, assignment });
  };

  enter(V);
  for (let r = 0; r < V; r++) {
    enter(r);
    if (A - 1 > m) mergeBest("window");
  }

  // The output clusters, numbered by their most frequent word; then the tree above them.
  const order: number[] = [];
  for (let s = 1; s < A; s++) order.push(key[s]);
  order.sort((a, b) => a - b);
  const cluster = new Int32Array(V);
  const leafNode = new Int32Array(order.length);
  order.forEach((name, c) => {
    for (let w = head[name]; w >= 0; w = next[w]) cluster[w] = c;
    leafNode[c] = node[slotOf[name]];
  });
  while (A > 2) mergeBest("tree");
  const paths = bitPaths(node[1], V, children, leafNode);
  const index = new Map<string, number>();
  words.forEach((w, i) => index.set(w, i));
  return { words, cluster, paths, index };
}

/**
 * Root-to-leaf bit strings of the output clusters (leafNode[c] = the tree node of cluster c).
 * Nodes below V are output clusters (named by their most frequent word), nodes from V up the
 * merges of the tree phase, children at 2(n − V) and 2(n − V) + 1.
 */
function bitPaths(root: number, V: number, children: readonly number[], leafNode: Int32Array): string[] {
  const pathOf = new Map<number, string>();
  const stack: Array<[number, string]> = [[root, ""]];
  while (stack.length > 0) {
    const [n, path] = stack.pop()!;
    if (n >= V) stack.push([children[2 * (n - V) + 1], `${path}1`], [children[2 * (n - V)], `${path}0`]);
    else pathOf.set(n, path);
  }
  return Array.from(leafNode, (n) => pathOf.get(n)!);
}

/** Cluster id of a word, or −1 when the clustering never saw it. */
export function clusterOf(clusters: WordClusters, word: string): number {
  const w = clusters.index.get(word);
  return w === undefined ? -1 : clusters.cluster[w];
}

/** Rebuilds a clustering from its stored words, cluster ids and paths (throws RangeError on a mismatch). */
export function createWordClusters(words: readonly string[], cluster: Int32Array, paths: readonly string[]): WordClusters {
  if (cluster.length !== words.length) throw new RangeError(`word clusters: ${words.length} words but ${cluster.length} cluster ids`);
  for (let i = 0; i < cluster.length; i++) {
    if (cluster[i] < 0 || cluster[i] >= paths.length) throw new RangeError(`word clusters: cluster ${cluster[i]} of word ${i} outside ${paths.length} clusters`);
  }
  for (const p of paths) if (!/^[01]*$/.test(p)) throw new RangeError(`word clusters: path ${JSON.stringify(p)} is not a bit string`);
  const index = new Map<string, number>();
  words.forEach((w, i) => index.set(w, i));
  if (index.size !== words.length) throw new RangeError("word clusters: words must be distinct");
  return { words, cluster, paths, index };
}
