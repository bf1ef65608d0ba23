/**
 * A table from (word, sentence-initial or not) to a non-negative number below 2^30, for the
 * tagging path's per-word-type cache: open addressing with linear probing over typed arrays, hashed over
 * the word's UTF-16 code units (FNV-1a, Fowler–Noll–Vo, from memory; seeded apart for the two
 * positions, then mixed as in MurmurHash3's finaliser). A slot of 32 bytes holds the 32-bit hash,
 * the value with the position flag, the length and, for words of up to INLINE_UNITS code
 * units, the code units themselves (longer words keep theirs in one shared Uint16Array), so a
 * lookup of a short word reads one cache line; two JavaScript Maps (one per position) cost a
 * bucket, an entry, the key pointer and the key string each.
 */
export type WordTable = {
  /**
   * Power-of-two index of 8-int slots: hash, (value·2 + position flag) + 1 (0 = empty slot),
   * length, then the code units two per int (low half first), or for a longer word the offset of
   * its code units in `units`.
   */
  slots: Int32Array;
  units: Uint16Array;
  unitCount: number;
  /** Number of words stored. */
  size: number;
};

const SLOT = 8;
/** Words of up to this many UTF-16 code units are stored in their slot. */
const INLINE_UNITS = 10;

/** An empty table with room for `capacity` entries before it grows. */
export function createWordTable(capacity = 1024): WordTable {
  let slots = 16;
  while (slots < 2 * capacity) slots *= 2;
  return { slots: new Int32Array(SLOT * slots), units: new Uint16Array(capacity), unitCount: 0, size: 0 };
}

/** The 32-bit hash of (word, first) (exported for tests). */
export function hashWord(word: string, first: boolean): number {
  let h = first ? 0x2f6b8c1d : 0x811c9dc5;
  for (let x = 0; x < word.length; x++) h = Math.imul(h ^ word.charCodeAt(x), 0x01000193);
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  return h ^ (h >>> 16);
}

/** The value stored for (word, first), or −1. */
export function findWord(table: WordTable, word: string, first: boolean): number {
  return findHashedWord(table, word, first, hashWord(word, first));
}

/**
 * The first slot word a lookup of hash h reads (for the tagging path, which reads it for every
 * token of a sentence in a loop of its own, so that the tokens' cache misses overlap).
 */
export function firstProbe(table: WordTable, h: number): number {
  return table.slots[SLOT * (h & (table.slots.length / SLOT - 1)) + 1];
}

/** {@link findWord} with h = hashWord(word, first) already computed. */
export function findHashedWord(table: WordTable, word: string, first: boolean, h: number): number {
  const { slots } = table;
  const mask = slots.length / SLOT - 1;
  const flag = first ? 1 : 0;
  const n = word.length;
  for (let i = h & mask; ; i = (i + 1) & mask) {
    const s = SLOT * i;
    const tag = slots[s + 1];
    if (tag === 0) return -1;
    if (slots[s] !== h || ((tag - 1) & 1) !== flag || slots[s + 2] !== n) continue;
    let x = 0;
    if (n <= INLINE_UNITS) {
      while (x < n && ((slots[s + 3 + (x >> 1)] >>> ((x & 1) << 4)) & 0xffff) === word.charCodeAt(x)) x++;
    } else {
      const units = table.units;
      const at = slots[s + 3];
      while (x < n && units[at + x] === word.charCodeAt(x)) x++;
    }
    if (x === n) return (tag - 1) >> 1;
  }
}

/** The slot where a key with hash h goes (the first empty one on its probe sequence). */
function freeSlot(slots: Int32Array, h: number): number {
  const mask = slots.length / SLOT - 1;
  let i = h & mask;
  while (slots[SLOT * i + 1] !== 0) i = (i + 1) & mask;
  return SLOT * i;
}

/** Adds (word, first), which must not be in the table yet, with `value` (an integer in 0..2^30−1). */
export function insertWord(table: WordTable, word: string, first: boolean, value: number): void {
  insertHashedWord(table, word, first, value, hashWord(word, first));
}

/** {@link insertWord} with h = hashWord(word, first) already computed. */
export function insertHashedWord(table: WordTable, word: string, first: boolean, value: number, h: number): void {
  if (!(Number.isInteger(value) && value >= 0 && value < 2 ** 30)) throw new RangeError(`word table: value ${value} is not an integer in [0, 2^30)`);
  table.size++;
  const n = word.length;
  if (4 * SLOT * table.size > 3 * table.slots.length) {
    const old = table.slots;
    const slots = new Int32Array(2 * old.length);
    for (let s = 0; s < old.length; s += SLOT) if (old[s + 1] !== 0) slots.set(old.subarray(s, s + SLOT), freeSlot(slots, old[s]));
    table.slots = slots;
  }
  const slots = table.slots;
  const s = freeSlot(slots, h);
  slots[s] = h;
  slots[s + 1] = 2 * value + (first ? 1 : 0) + 1;
  slots[s + 2] = n;
  if (n <= INLINE_UNITS) {
    for (let x = 3; x < SLOT; x++) slots[s + x] = 0;
    for (let x = 0; x < n; x++) slots[s + 3 + (x >> 1)] |= word.charCodeAt(x) << ((x & 1) << 4);
  } else {
    const at = table.unitCount;
    if (at + n > table.units.length) {
      const units = new Uint16Array(Math.max(at + n, 2 * table.units.length));
      units.set(table.units.subarray(0, at));
      table.units = units;
    }
    for (let x = 0; x < n; x++) table.units[at + x] = word.charCodeAt(x);
    table.unitCount = at + n;
    slots[s + 3] = at;
  }
}

/** Removes every word; keeps the allocated arrays. */
export function clearWords(table: WordTable): void {
  table.slots.fill(0);
  table.unitCount = 0;
  table.size = 0;
}
