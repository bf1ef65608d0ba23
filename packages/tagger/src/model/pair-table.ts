/**
 * A map from pairs of non-negative int32 numbers (previous symbol, symbol) to an int32 value, for
 * the tagging path's pool of patched step matrices: open addressing with linear probing over one
 * Int32Array of 4-int slots (first + 1, second, value, unused), so a lookup reads one slot, where
 * a CountTable reads its slot, key and value arrays.
 */
export type PairTable = { slots: Int32Array; size: number };

const SLOT = 4;

/** An empty table with room for `capacity` pairs before it grows. */
export function createPairTable(capacity = 1024): PairTable {
  let slots = 16;
  while (slots < 2 * capacity) slots *= 2;
  return { slots: new Int32Array(SLOT * slots), size: 0 };
}

function slotOf(first: number, second: number, mask: number): number {
  let h = Math.imul(first, 0x9e3779b1) ^ Math.imul(second ^ 0x5bd1e995, 0x85ebca6b);
  h ^= h >>> 15;
  h = Math.imul(h, 0x2c1b3c6d);
  h ^= h >>> 13;
  return h & mask;
}

/** Slot offset of the pair, or −1. */
function find(table: PairTable, first: number, second: number): number {
  const { slots } = table;
  const mask = slots.length / SLOT - 1;
  for (let i = slotOf(first, second, mask); ; i = (i + 1) & mask) {
    const x = SLOT * i;
    const tag = slots[x];
    if (tag === 0) return -1;
    if (tag === first + 1 && slots[x + 1] === second) return x;
  }
}

/** The value stored for (first, second), or `missing`. */
export function getPair(table: PairTable, first: number, second: number, missing: number): number {
  const x = find(table, first, second);
  return x < 0 ? missing : table.slots[x + 2];
}

function place(slots: Int32Array, first: number, second: number, value: number): void {
  const mask = slots.length / SLOT - 1;
  let i = slotOf(first, second, mask);
  while (slots[SLOT * i] !== 0) i = (i + 1) & mask;
  const x = SLOT * i;
  slots[x] = first + 1;
  slots[x + 1] = second;
  slots[x + 2] = value;
}

/** Stores `value` for (first, second), replacing any earlier value. Both must be in 0..2^31−2. */
export function setPair(table: PairTable, first: number, second: number, value: number): void {
  if (!(Number.isInteger(first) && first >= 0 && first < 0x7fffffff && Number.isInteger(second) && second >= 0 && second <= 0x7fffffff)) {
    throw new RangeError(`pair table: (${first}, ${second}) is not a pair of non-negative int32 numbers`);
  }
  const x = find(table, first, second);
  if (x >= 0) {
    table.slots[x + 2] = value;
    return;
  }
  table.size++;
  if (2 * SLOT * table.size > table.slots.length) {
    const old = table.slots;
    const slots = new Int32Array(2 * old.length);
    for (let y = 0; y < old.length; y += SLOT) if (old[y] !== 0) place(slots, old[y] - 1, old[y + 1], old[y + 2]);
    table.slots = slots;
  }
  place(table.slots, first, second, value);
}

/** Removes every pair; keeps the allocated slots. */
export function clearPairs(table: PairTable): void {
  table.slots.fill(0);
  table.size = 0;
}
