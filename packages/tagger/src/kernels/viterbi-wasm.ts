/**
 * The Viterbi recursion of {@link decodeViterbi} as a WebAssembly kernel with 128-bit SIMD,
 * emitted per state count K at run time (wasm-emitter.ts) and instantiated once per K.
 *
 * Why WebAssembly: V8 lowers Math.max and comparisons on doubles in JavaScript to data-dependent
 * jumps, which mispredict on real scores, while a C compiler emits branch-free maxsd. The SIMD
 * instruction f64x2.pmax (`a < b ? b : a` per lane) is one maxpd in V8 on x64, so the forward
 * pass runs branch-free over two destination states at a time. On bench/run.ts section 1 (Node
 * 20, 2 shared cores) this took decodeViterbi from 0.30 to 0.69 of the C reference's tokens/s at
 * K = 9 and from 0.36 to 0.85 at K = 17.
 *
 * Exactness. pmax never rounds: the maximum equals the one the JavaScript kernels compute, and
 * the sums are the same IEEE additions in the same order, so the lattice is bit-identical in
 * every case except three that the kernel detects and reports instead of deciding:
 * - a NaN or +Infinity among the scores (pmax skips a NaN where Math.max propagates it; the
 *   branch-free argmax below assumes no NaN): checked on every transition and end score and on
 *   every lattice entry (start and emission NaNs or +Infinity reach the lattice);
 * - for K ≤ UNROLL_LIMIT, where the JavaScript kernel uses Math.max (which prefers +0 to −0 on a
 *   tie while pmax keeps the first), a −0 in the lattice: a zero maximum of the wrong sign only
 *   changes the lattice when the emission score added to it is −0 too, and then the entry is −0.
 *   For K > UNROLL_LIMIT the JavaScript loop keeps the first maximum (`s > best`), like pmax.
 * On such inputs {@link decodeViterbiWasm} returns null and the caller runs the JavaScript path.
 *
 * The argmaxes are recovered in the backtrace, as in viterbi.ts: for the chosen state j at token
 * t, the sums delta[t−1][i] + log P(j | i) are recomputed, their maximum m read back from the
 * forward pass (which stores each token's maxima before adding the emission scores), and the
 * lowest i with sum == m found from the comparison bitmask (i64x2.bitmask, then ctz) — the first
 * maximising i, which is what the JavaScript loops' strict `>` picks, again without branches.
 */
import type { EmissionInput, HmmParams } from "./hmm-params";
import { CodeBuilder, encodeModule, F64, I32, V128, type ValueType } from "./wasm-emitter";
import { UNROLL_LIMIT } from "./viterbi-unrolled";

/** Largest K served by the kernel: the first-maximum bitmask of one token is one i64. */
export const WASM_STATE_LIMIT = 64;

/**
 * Destination vectors (two states each) whose maxima stay in registers during one pass over the
 * predecessors; x64 has 16 vector registers, and each pass also holds one row's loaded vectors.
 */
const BLOCK = 12;

const NEGATIVE_ZERO_BITS = [0, 0, 0, 0, 0, 0, 0, 0x80, 0, 0, 0, 0, 0, 0, 0, 0x80];
const ALL_ONES = new Array<number>(16).fill(0xff);
const SWAP_LANES = [8, 9, 10, 11, 12, 13, 14, 15, 0, 1, 2, 3, 4, 5, 6, 7];

/**
 * The module for K states: one function
 * `decode(T, start, end, transitions, transitionBytes, index, indexStride, emissions, delta, path, maxima) → log P`
 * over byte addresses in its memory. Rows are K f64 with stride K (unpadded, so tables copy
 * verbatim): states go two per vector, and for odd K the last "vector" holds state K−1 in both
 * lanes (load64_splat) and is stored from lane 0 only, so no lane ever reads or writes past a row.
 * Token t ≥ 1 uses K×K matrix number `i32[index + t·indexStride]` from `transitions` (stride 0:
 * one shared matrix); `maxima` holds T×K scratch scores (each token's maxima before its emission
 * scores, which the backtrace compares against). Returns NaN, path unwritten, when the scores fall in a case listed in the
 * file comment, else log P(path, observations) with the T×K lattice at `delta` and T state ids
 * at `path`.
 */
export function buildViterbiModule(K: number): Uint8Array {
  if (!Number.isInteger(K) || K < 1 || K > WASM_STATE_LIMIT) throw new RangeError(`buildViterbiModule: K=${K} outside 1..${WASM_STATE_LIMIT}`);
  const NV = Math.ceil(K / 2);
  const half = (v: number) => 2 * v + 1 === K;
  const K8 = K * 8;
  const KK8 = K * K * 8;
  const checkNegativeZero = K <= UNROLL_LIMIT;
  const params: ValueType[] = [I32, I32, I32, I32, I32, I32, I32, I32, I32, I32, I32];
  const c = new CodeBuilder(params.length);
  const [T, start, end, trans, transBytes, index, indexStride, em, delta, path, maxima] = params.map((_, i) => i);
  const t = c.local(I32);
  const prev = c.local(I32);
  const cur = c.local(I32);
  const tm = c.local(I32);
  const er = c.local(I32);
  const arg = c.local(I32);
  const q = c.local(I32);
  const pp = c.local(I32);
  const rp = c.local(I32);
  const stop = c.local(I32);
  const mx = c.local(I32);
  const q2 = c.local(I32);
  const best = c.local(F64);
  const s = c.local(V128);
  const x = c.local(V128);
  const m = c.local(V128);
  const ok = c.local(V128);
  const inf = c.local(V128);
  const negZero = c.local(V128);
  const acc = Array.from({ length: Math.min(NV, BLOCK) }, () => c.local(V128));
  const sums = Array.from({ length: NV }, () => c.local(V128));

  // Two states of a row at byte `offset` from the address in `base`.
  const loadPair = (base: number, offset: number, v: number) => {
    c.localGet(base);
    if (half(v)) c.v128Load64Splat(offset);
    else c.v128Load(offset, 3);
  };
  // Stores vector local `value` as states 2v, 2v+1 of the row at `base`.
  const storePair = (base: number, v: number, value: number) => {
    c.localGet(base).localGet(value);
    if (half(v)) c.v128Store64Lane(0, 16 * v);
    else c.v128Store(16 * v, 3);
  };
  // ok &= (x < +Infinity) [&& x is not −0], per lane: false for NaN, +Infinity (and −0).
  const checkLattice = (value: number) => {
    c.localGet(ok).localGet(value).localGet(inf).f64x2Lt();
    if (checkNegativeZero) c.localGet(value).localGet(negZero).i64x2Eq().v128AndNot();
    c.v128And().localSet(ok);
  };
  const tree = Array.from({ length: Math.ceil(NV / 2) }, () => c.local(V128));
  // m = the maximum of the sums (vector locals `sums`) in both lanes; no NaN among them.
  const maximum = () => {
    let level = sums;
    while (level.length > 1) {
      const next = tree.slice(0, Math.ceil(level.length / 2));
      for (let k = 0; k < next.length; k++) {
        c.localGet(level[2 * k]);
        if (2 * k + 1 < level.length) c.localGet(level[2 * k + 1]).f64x2Pmax();
        c.localSet(next[k]);
      }
      level = next;
    }
    c.localGet(level[0]).localGet(level[0]).i8x16Shuffle(SWAP_LANES).localGet(level[0]).f64x2Pmax().localSet(m);
  };
  // arg = the lowest state whose sum equals m: the per-vector bitmasks joined by a tree of ors
  // (a shorter dependency chain than one running or).
  const firstEqual = () => {
    const pieces: (() => void)[] = Array.from({ length: NV }, (_, v) => () => {
      c.localGet(sums[v]).localGet(m).f64x2Eq().i64x2Bitmask().i64ExtendI32U();
      if (v > 0) c.i64Const(2 * v).i64Shl();
    });
    const join = (from: number, to: number) => {
      if (to - from === 1) return pieces[from]();
      const mid = (from + to) >> 1;
      join(from, mid);
      join(mid, to);
      c.i64Or();
    };
    join(0, NV);
    c.i64Ctz().i32WrapI64().localSet(arg);
  };
  const firstMaximum = () => {
    maximum();
    firstEqual();
  };
  // tm = transitions + index[t · stride / 4] · K·K·8
  const matrixOf = () => {
    c.localGet(trans).localGet(index).localGet(t).localGet(indexStride).i32Mul().i32Add().i32Load().i32Const(KK8).i32Mul().i32Add().localSet(tm);
  };
  const returnNaNUnlessOk = () => c.block().localGet(ok).i64x2AllTrue().brIf(0).f64Const(NaN).ret().end();
  // acc[v] = (first ? x : pmax(acc[v], x)) for x = s + row vector v, the row at `rowBase` + `rowOffset`.
  const updateRow = (from: number, to: number, rowBase: number, rowOffset: number, first: boolean) => {
    for (let v = from; v < to; v++) {
      const a = acc[v - from];
      if (!first) c.localGet(a);
      c.localGet(s);
      loadPair(rowBase, rowOffset + 16 * v, v);
      c.f64x2Add();
      if (!first) c.f64x2Pmax();
      c.localSet(a);
    }
  };

  c.f64x2Const(Infinity, Infinity).localSet(inf);
  c.v128Const(NEGATIVE_ZERO_BITS).localSet(negZero);
  c.v128Const(ALL_ONES).localSet(ok);
  // Transition and end scores: no NaN, no +Infinity (the caller zero-pads to a multiple of 16 bytes).
  c.localGet(trans).localSet(q);
  c.block().loop();
  c.localGet(q).localGet(trans).localGet(transBytes).i32Add().i32GeU().brIf(1);
  c.localGet(ok).localGet(q).v128Load(0, 3).localGet(inf).f64x2Lt().v128And().localSet(ok);
  c.localGet(q).i32Const(16).i32Add().localSet(q);
  c.br(0).end().end();
  for (let v = 0; v < NV; v++) {
    c.localGet(ok);
    loadPair(end, 16 * v, v);
    c.localGet(inf).f64x2Lt().v128And().localSet(ok);
  }
  returnNaNUnlessOk();

  // delta[0][j] = start[j] + em[0][j]
  for (let v = 0; v < NV; v++) {
    loadPair(start, 16 * v, v);
    loadPair(em, 16 * v, v);
    c.f64x2Add().localSet(x);
    storePair(delta, v, x);
    checkLattice(x);
  }
  // delta[t][j] = max_i (delta[t−1][i] + log P(j | i)) + em[t][j]   (Rabiner 1989, §III-B)
  c.localGet(delta).localSet(prev);
  c.localGet(em).localSet(er);
  c.localGet(maxima).localSet(mx);
  c.i32Const(1).localSet(t);
  c.block().loop();
  c.localGet(t).localGet(T).i32LtS().i32Eqz().brIf(1);
  matrixOf();
  c.localGet(prev).i32Const(K8).i32Add().localSet(cur);
  c.localGet(er).i32Const(K8).i32Add().localSet(er);
  c.localGet(mx).i32Const(K8).i32Add().localSet(mx);
  // Rows 1..K−1 of the matrix in a loop rather than straight-line code: unrolled, the compiler
  // issued every load of the K×K matrix before the first maximum and spilled most of them to the
  // stack (TurboFan keeps loads in program order and schedules pure arithmetic late); in a loop
  // each row's loads meet their maxima in registers. Same additions and maxima in the same order.
  const looped = K - 1 >= 2;
  for (let from = 0; from < NV; from += BLOCK) {
    const to = Math.min(NV, from + BLOCK);
    c.localGet(prev).v128Load64Splat(0).localSet(s);
    updateRow(from, to, tm, 0, true);
    if (looped) {
      c.localGet(prev).i32Const(8).i32Add().localSet(pp);
      c.localGet(tm).i32Const(K8).i32Add().localSet(rp);
      c.localGet(prev).i32Const(K8).i32Add().localSet(stop);
      c.loop();
      c.localGet(pp).v128Load64Splat(0).localSet(s);
      updateRow(from, to, rp, 0, false);
      c.localGet(pp).i32Const(8).i32Add().localSet(pp);
      c.localGet(rp).i32Const(K8).i32Add().localSet(rp);
      c.localGet(pp).localGet(stop).i32Ne().brIf(0);
      c.end();
    } else {
      for (let i = 1; i < K; i++) {
        c.localGet(prev).v128Load64Splat(8 * i).localSet(s);
        updateRow(from, to, tm, i * K8, false);
      }
    }
    for (let v = from; v < to; v++) {
      storePair(mx, v, acc[v - from]);
      c.localGet(acc[v - from]);
      loadPair(er, 16 * v, v);
      c.f64x2Add().localSet(x);
      storePair(cur, v, x);
      checkLattice(x);
    }
  }
  c.localGet(cur).localSet(prev);
  c.localGet(t).i32Const(1).i32Add().localSet(t);
  c.br(0).end().end();
  returnNaNUnlessOk();

  // Last state: the first maximum of delta[T−1][j] + end[j]; `prev` holds row T−1.
  for (let v = 0; v < NV; v++) {
    loadPair(prev, 16 * v, v);
    loadPair(end, 16 * v, v);
    c.f64x2Add().localSet(sums[v]);
  }
  firstMaximum();
  // delta[T−1][last] + end[last], read back rather than taken from the maximum m: with ±0 among
  // tied sums (possible above UNROLL_LIMIT) m's sign of zero need not be the first maximum's.
  c.localGet(arg).i32Const(8).i32Mul().localSet(q);
  c.localGet(prev).localGet(q).i32Add().f64Load().localGet(end).localGet(q).i32Add().f64Load().f64Add().localSet(best);
  c.localGet(path).localGet(T).i32Const(1).i32Sub().i32Const(4).i32Mul().i32Add().localSet(q);
  c.localGet(q).localGet(arg).i32Store();
  c.localGet(T).i32Const(1).i32Sub().localSet(t);
  // Backtrace: path[t−1] = the first i maximising delta[t−1][i] + log P(path[t] | i). That
  // maximum is the forward pass's stored one (the same sums, and pmax returns one of them), so
  // each step needs no maximum of its own: one load beside the column's, then the comparisons.
  c.block().loop();
  c.localGet(t).i32Const(1).i32LtS().brIf(1);
  matrixOf();
  c.localGet(arg).i32Const(8).i32Mul().localSet(q2);
  c.localGet(tm).localGet(q2).i32Add().localSet(tm);
  c.localGet(mx).localGet(q2).i32Add().v128Load64Splat().localSet(m);
  c.localGet(mx).i32Const(K8).i32Sub().localSet(mx);
  c.localGet(prev).i32Const(K8).i32Sub().localSet(prev);
  for (let v = 0; v < NV; v++) {
    loadPair(prev, 16 * v, v);
    // Column `arg` of the matrix: rows 2v and 2v+1, K·8 bytes apart.
    if (!half(v)) c.localGet(tm);
    c.localGet(tm).v128Load64Splat(2 * v * K8);
    if (!half(v)) c.v128Load64Lane(1, (2 * v + 1) * K8);
    c.f64x2Add().localSet(sums[v]);
  }
  firstEqual();
  c.localGet(q).i32Const(4).i32Sub().localSet(q);
  c.localGet(q).localGet(arg).i32Store();
  c.localGet(t).i32Const(1).i32Sub().localSet(t);
  c.br(0).end().end();
  c.localGet(best);
  return encodeModule([{ name: "decode", params, results: [F64], code: c }], 1);
}

type WasmMemory = { readonly buffer: ArrayBuffer; grow(pages: number): number };
type WasmInstance = { readonly exports: Record<string, unknown> };
/** The part of the WebAssembly JavaScript API used here (not in this package's TypeScript libs). */
type WasmApi = {
  validate(bytes: Uint8Array): boolean;
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object) => WasmInstance;
};

type DecodeExport = (
  length: number,
  start: number,
  end: number,
  transitions: number,
  transitionBytes: number,
  index: number,
  indexStride: number,
  emissions: number,
  delta: number,
  path: number,
  maxima: number,
) => number;

/**
 * One instance per K and its memory, laid out for up to `tokens` tokens and `matrixValues`
 * transition scores (byte offsets below); grown, never shrunk. The views of the first T lattice
 * entries are kept per T, so copying results out allocates nothing once warm.
 */
type Kernel = {
  readonly K: number;
  readonly decode: DecodeExport;
  readonly gather: GatherRows;
  readonly stage: StageVectors;
  readonly memory: WasmMemory;
  f64: Float64Array;
  i32: Int32Array;
  tokens: number;
  matrixValues: number;
  pathAt: number;
  indexAt: number;
  startAt: number;
  endAt: number;
  emAt: number;
  transAt: number;
  maxAt: number;
  deltaViews: Float64Array[];
};

const wasmApi = (globalThis as { WebAssembly?: WasmApi }).WebAssembly;
let simdSupported: boolean | undefined;
const kernels = new Map<number, Kernel>();

/** Whether this engine runs WebAssembly with 128-bit SIMD (validated once on a tiny module). */
export function isWasmSimdAvailable(): boolean {
  if (simdSupported === undefined) {
    const probe = new CodeBuilder(0);
    const v = probe.local(V128);
    probe.f64x2Const(1, 2).f64x2Const(3, 0).f64x2Pmax().localSet(v);
    simdSupported = wasmApi !== undefined && typeof wasmApi.validate === "function" && wasmApi.validate(encodeModule([{ name: "probe", params: [], results: [], code: probe }], 1));
  }
  return simdSupported;
}

/** Copies rows `rows[0..length)` of a table with K columns to `out` from index `at`, row after row. */
type GatherRows = (out: Float64Array, at: number, scores: Float64Array, rows: Int32Array, length: number) => void;

/**
 * The body of a GatherRows for K columns, unrolled over the columns: a loop over K is not
 * unrolled by the engine and costs about twice as much per copied score (built from integers only).
 */
function gatherSource(K: number): string {
  const copies = Array.from({ length: K }, (_, j) => `out[at + ${j}] = scores[r + ${j}];`).join(" ");
  return `for (let t = 0; t < length; t++, at += ${K}) { const r = rows[t] * ${K}; ${copies} }`;
}

const align16 = (bytes: number) => Math.ceil(bytes / 16) * 16;

/** Copies start (K) and end (K, zeros for null) to f64 indices `startAt` and `endAt`. */
type StageVectors = (out: Float64Array, startAt: number, start: Float64Array, endAt: number, end: Float64Array | null) => void;

/**
 * The body of a StageVectors for K, unrolled: TypedArray `set` costs about 28 ns per call here
 * whatever the length (measured with 9 values), more than nine plain copies (built from integers only).
 */
function stageSource(K: number): string {
  const starts = Array.from({ length: K }, (_, j) => `out[startAt + ${j}] = start[${j}];`).join(" ");
  const ends = Array.from({ length: K }, (_, j) => `out[endAt + ${j}] = end[${j}];`).join(" ");
  const zeros = Array.from({ length: K }, (_, j) => `out[endAt + ${j}] = 0;`).join(" ");
  return `${starts} if (end === null) { ${zeros} } else { ${ends} }`;
}

function kernelFor(K: number): Kernel {
  let kernel = kernels.get(K);
  if (kernel === undefined) {
    const instance = new wasmApi!.Instance(new wasmApi!.Module(buildViterbiModule(K)));
    const memory = instance.exports.memory as WasmMemory;
    kernel = {
      K,
      decode: instance.exports.decode as DecodeExport,
      gather: new Function("out", "at", "scores", "rows", "length", gatherSource(K)) as GatherRows,
      stage: new Function("out", "startAt", "start", "endAt", "end", stageSource(K)) as StageVectors,
      memory,
      f64: new Float64Array(0),
      i32: new Int32Array(0),
      tokens: 0,
      matrixValues: 0,
      pathAt: 0,
      indexAt: 0,
      startAt: 0,
      endAt: 0,
      emAt: 0,
      transAt: 0,
      maxAt: 0,
      deltaViews: [],
    };
    kernels.set(K, kernel);
  }
  return kernel;
}

/** Memory beyond this is not worth it for one sentence: larger problems decode in JavaScript. */
const MEMORY_LIMIT = 1 << 30;

/**
 * Lays the memory out again for at least `tokens` tokens and `matrixValues` transition scores
 * (doubling, so that a corpus of growing sentences re-lays it a few times only). Returns false,
 * changing nothing, when that would pass MEMORY_LIMIT.
 */
function reserve(kernel: Kernel, tokens: number, matrixValues: number): boolean {
  const K = kernel.K;
  const n = tokens <= kernel.tokens ? kernel.tokens : Math.max(tokens, 2 * kernel.tokens, 64);
  const values = matrixValues <= kernel.matrixValues ? kernel.matrixValues : Math.max(matrixValues, 2 * kernel.matrixValues, K * K);
  // The lattice starts at 0 so that the view of its first T rows depends on T only.
  const pathAt = align16(n * K * 8);
  const indexAt = pathAt + align16(n * 4);
  const startAt = indexAt + align16(n * 4);
  const endAt = startAt + align16(K * 8);
  const emAt = endAt + align16(K * 8);
  const transAt = emAt + align16(n * K * 8);
  // 16 bytes of slack: the transition check reads whole vectors.
  const maxAt = transAt + align16(values * 8) + 16;
  const needed = maxAt + n * K * 8;
  if (needed > MEMORY_LIMIT) return false;
  const have = kernel.memory.buffer.byteLength;
  if (needed > have) kernel.memory.grow(Math.ceil((needed - have) / 65536));
  Object.assign(kernel, { tokens: n, matrixValues: values, pathAt, indexAt, startAt, endAt, emAt, transAt, maxAt });
  kernel.f64 = new Float64Array(kernel.memory.buffer);
  kernel.i32 = new Int32Array(kernel.memory.buffer);
  kernel.deltaViews = [];
  return true;
}

/**
 * {@link decodeViterbi} for 1 ≤ T and K ≤ WASM_STATE_LIMIT, on inputs that already passed its
 * shape checks: writes the path (T state ids) into `path` and, when given, the T×K lattice into
 * `delta`, and returns log P(path, observations) — or null, touching neither, when the scores
 * hold NaN, +Infinity or (K ≤ UNROLL_LIMIT) a −0 lattice entry (see the file comment), for the
 * caller to decode in JavaScript. Copies the sentence's emission rows, the transition matrices
 * it uses, start and end into the kernel's memory (grown when too small, then reused).
 *
 * Gathered rows are copied per call, never a whole table kept between calls: keeping a V×K table
 * by array identity was faster on the benchmark (0.77 instead of 0.67 of C at K = 9) but would
 * silently decode with stale scores after a caller changed the table in place, and the tagger
 * itself passes a new dense lattice per sentence, which no table cache would serve.
 */
export function decodeViterbiWasm(params: HmmParams, input: EmissionInput, path: Int32Array, delta: Float64Array | null): number | null {
  const K = params.states;
  const T = input.length;
  const KK = K * K;
  const { start, transitions, end } = params;
  const tIndex = input.transitionIndex;
  const scores = input.scores;
  const rows = input.rows;
  const matrices = transitions.length / KK;
  // Without an index, or with a single matrix, every step reads matrix 0: copy only that one.
  const indexed = tIndex !== null && matrices > 1;
  const copied = indexed ? matrices * KK : KK;
  const kernel = kernelFor(K);
  if ((T > kernel.tokens || copied > kernel.matrixValues) && !reserve(kernel, T, copied)) return null;
  const { f64, i32 } = kernel;
  kernel.stage(f64, kernel.startAt / 8, start, kernel.endAt / 8, end);
  const transAt = kernel.transAt / 8;
  if (copied === transitions.length) f64.set(transitions, transAt);
  else for (let q = 0; q < copied; q++) f64[transAt + q] = transitions[q];
  if (copied % 2 === 1) f64[transAt + copied] = 0;
  const emAt = kernel.emAt / 8;
  if (rows === null && scores.length === T * K) f64.set(scores, emAt);
  else if (rows === null) for (let q = 0; q < T * K; q++) f64[emAt + q] = scores[q];
  else kernel.gather(f64, emAt, scores, rows, T);
  if (indexed) for (let t = 0; t < T; t++) i32[kernel.indexAt / 4 + t] = tIndex[t];
  else i32[kernel.indexAt / 4] = 0;
  const logProbability = kernel.decode(T, kernel.startAt, kernel.endAt, kernel.transAt, align16(copied * 8), kernel.indexAt, indexed ? 4 : 0, kernel.emAt, 0, kernel.pathAt, kernel.maxAt);
  if (Number.isNaN(logProbability)) return null;
  // A loop: for sentence-length paths it is cheaper than a TypedArray `set` call.
  for (let t = 0, at = kernel.pathAt / 4; t < T; t++) path[t] = i32[at + t];
  if (delta !== null) {
    let deltaView = kernel.deltaViews[T];
    if (deltaView === undefined) {
      deltaView = f64.subarray(0, T * K);
      kernel.deltaViews[T] = deltaView;
    }
    delta.set(deltaView);
  }
  return logProbability;
}
