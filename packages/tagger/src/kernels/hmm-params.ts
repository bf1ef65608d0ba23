/**
 * The first-order HMM that every dense kernel reads: K states, a start distribution, one or
 * more K×K transition matrices (several when transitions depend on position or context) and an
 * optional end distribution. Emission scores come separately (see {@link EmissionInput}) because
 * they are per token: a known word gathers a row of a table, an unknown word gets a row computed
 * from its features.
 *
 * Everything is natural-log probability, Float64Array, flat and row-major.
 */
export type HmmParams = {
  /** Number of states K. */
  readonly states: number;
  /** K log-probabilities of the first state. */
  readonly start: Float64Array;
  /** M×K×K log-probabilities, [m][from][to]; M ≥ 1 matrices. */
  readonly transitions: Float64Array;
  /** K log-probabilities of ending after each state, or null when the model has no end state. */
  readonly end: Float64Array | null;
};

/**
 * Per-token emission scores of one sequence of length T. Token t reads row `rows[t]` of the
 * R×K table `scores` (gather, as a tagger does with a vocabulary table), or row t when `rows`
 * is null (a dense T×K lattice). `transitionIndex[t]` (t ≥ 1) names which of the M transition
 * matrices scores the step into token t; null means matrix 0 everywhere.
 */
export type EmissionInput = {
  readonly length: number;
  readonly scores: Float64Array;
  readonly rows: Int32Array | null;
  readonly transitionIndex: Int32Array | null;
};

/** Number of transition matrices M held by the parameters. */
export function transitionMatrixCount(params: HmmParams): number {
  return params.transitions.length / (params.states * params.states);
}

/**
 * Checks that a sequence fits the parameters; every dense kernel calls this once at entry so its
 * inner loops can index without checks. Throws RangeError naming the sizes that disagree.
 */
export function checkShapes(params: HmmParams, input: EmissionInput, kernel: string): void {
  const K = params.states;
  if (!Number.isInteger(K) || K < 1) throw new RangeError(`${kernel}: states must be a positive integer, got ${K}`);
  if (params.start.length !== K) throw new RangeError(`${kernel}: start has length ${params.start.length}, expected K=${K}`);
  const KK = K * K;
  if (params.transitions.length === 0 || params.transitions.length % KK !== 0) {
    throw new RangeError(`${kernel}: transitions has length ${params.transitions.length}, not a positive multiple of K×K=${KK}`);
  }
  if (params.end !== null && params.end.length !== K) {
    throw new RangeError(`${kernel}: end has length ${params.end.length}, expected K=${K}`);
  }
  const T = input.length;
  if (!Number.isInteger(T) || T < 0) throw new RangeError(`${kernel}: length must be a non-negative integer, got ${T}`);
  if (input.scores.length % K !== 0) {
    throw new RangeError(`${kernel}: emission scores have length ${input.scores.length}, not a multiple of K=${K}`);
  }
  const R = input.scores.length / K;
  if (input.rows === null) {
    if (R < T) throw new RangeError(`${kernel}: dense emission lattice has ${R} rows for T=${T} tokens`);
  } else {
    if (input.rows.length < T) throw new RangeError(`${kernel}: rows has length ${input.rows.length}, expected T=${T}`);
    for (let t = 0; t < T; t++) {
      const r = input.rows[t];
      if (r < 0 || r >= R) throw new RangeError(`${kernel}: rows[${t}]=${r} outside the ${R}×${K} emission table`);
    }
  }
  if (input.transitionIndex !== null) {
    const M = params.transitions.length / KK;
    if (input.transitionIndex.length < T) {
      throw new RangeError(`${kernel}: transitionIndex has length ${input.transitionIndex.length}, expected T=${T}`);
    }
    for (let t = 1; t < T; t++) {
      const m = input.transitionIndex[t];
      if (m < 0 || m >= M) throw new RangeError(`${kernel}: transitionIndex[${t}]=${m} outside the M=${M} transition matrices`);
    }
  }
}

/**
 * Builds log-space parameters from probabilities given as nested arrays (for worked examples and
 * tests): start K, transition K×K (rows = from), emission K×V (rows = state), optional end K.
 * Returns the params and the V×K emission table (rows = symbol) that {@link EmissionInput} gathers.
 */
export function createHmmFromProbabilities(spec: {
  start: readonly number[];
  transition: readonly (readonly number[])[];
  emission: readonly (readonly number[])[];
  end?: readonly number[];
}): { params: HmmParams; emissionTable: Float64Array; symbols: number } {
  const K = spec.start.length;
  if (spec.transition.length !== K || spec.transition.some((row) => row.length !== K)) {
    throw new RangeError(`transition must be ${K}×${K}`);
  }
  if (spec.emission.length !== K) throw new RangeError(`emission must have K=${K} rows, got ${spec.emission.length}`);
  const V = spec.emission[0]?.length ?? 0;
  if (spec.emission.some((row) => row.length !== V)) throw new RangeError(`emission rows must all have V=${V} columns`);
  if (spec.end !== undefined && spec.end.length !== K) throw new RangeError(`end must have length K=${K}`);
  const start = Float64Array.from(spec.start, Math.log);
  const transitions = new Float64Array(K * K);
  for (let i = 0; i < K; i++) for (let j = 0; j < K; j++) transitions[i * K + j] = Math.log(spec.transition[i][j]);
  const emissionTable = new Float64Array(V * K);
  for (let k = 0; k < K; k++) for (let v = 0; v < V; v++) emissionTable[v * K + k] = Math.log(spec.emission[k][v]);
  const end = spec.end === undefined ? null : Float64Array.from(spec.end, Math.log);
  return { params: { states: K, start, transitions, end }, emissionTable, symbols: V };
}

/** A gather input over a V×K emission table for the symbol ids `observations`. */
export function gatherInput(emissionTable: Float64Array, observations: Int32Array, transitionIndex: Int32Array | null = null): EmissionInput {
  return { length: observations.length, scores: emissionTable, rows: observations, transitionIndex };
}
