/**
 * A small seeded pseudo-random generator, so that sampling, bootstrap resampling and data
 * splits are reproducible from one integer seed. The model package never calls Math.random.
 *
 * Algorithm: sfc32 (Chris Doty-Humphrey's "small fast counter", from the PractRand suite),
 * seeded through splitmix32 so that nearby seeds give unrelated streams.
 */
export type Rng = {
  /** A float in [0, 1) with 32 bits of randomness. */
  next(): number;
  /** An integer in [0, n). */
  nextInt(n: number): number;
  /** The seed the generator was made from. */
  readonly seed: number;
};

function splitmix32(state: number): () => number {
  let s = state >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
}

/** Creates a generator from an integer seed; the same seed always gives the same stream. */
export function createRng(seed: number): Rng {
  if (!Number.isInteger(seed)) throw new TypeError(`seed must be an integer, got ${seed}`);
  const init = splitmix32(seed);
  let a = init();
  let b = init();
  let c = init();
  let d = init();
  const next32 = (): number => {
    const t = (((a + b) >>> 0) + d) >>> 0;
    d = (d + 1) >>> 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) >>> 0;
    c = ((c << 21) | (c >>> 11)) >>> 0;
    c = (c + t) >>> 0;
    return t;
  };
  // Discard the first outputs: sfc32 mixes its state over its first few steps.
  for (let i = 0; i < 12; i++) next32();
  return {
    seed,
    next: () => next32() / 4294967296,
    nextInt: (n: number) => {
      if (!(n > 0) || !Number.isInteger(n)) throw new RangeError(`nextInt needs a positive integer, got ${n}`);
      return Math.floor((next32() / 4294967296) * n);
    },
  };
}
