/**
 * A sparse table of counts keyed by non-negative integers below 2^53, in typed arrays: entries in
 * insertion order (keys[i], values[i]) plus an open-addressing index (linear probing) from key to
 * entry. It replaces Map<number, number> for the large sparse statistics (previous-word,
 * context-emission and trigram counts): keys above 2^31 would be boxed numbers in a Map, costing
 * several times the memory and time. Insertion order is part of the data: estimation sums in that
 * order and serialization keeps it, so a loaded model reproduces every sum bit for bit.
 */
export type CountTable = {
  keys: Float64Array;
  values: Float64Array;
  /** Number of entries. */
  size: number;
  /** Power-of-two index: entry number + 1, or 0 for an empty slot. */
  slots: Int32Array;
};

/** An empty table with room for `capacity` entries before growing. */
export function createCountTable(capacity = 16): CountTable {
  const n = Math.max(4, capacity);
  let slots = 8;
  while (slots < 2 * n) slots *= 2;
  return { keys: new Float64Array(n), values: new Float64Array(n), size: 0, slots: new Int32Array(slots) };
}

function hashKey(key: number): number {
  const lo = key >>> 0;
  const hi = (key / 4294967296) >>> 0;
  let h = Math.imul(lo ^ Math.imul(hi, 0x27d4eb2d), 0x9e3779b1);
  h ^= h >>> 15;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  return h >>> 0;
}

/** Entry number of `key`, or −1. */
export function findEntry(table: CountTable, key: number): number {
  const { slots, keys } = table;
  const mask = slots.length - 1;
  let i = hashKey(key) & mask;
  for (;;) {
    const slot = slots[i];
    if (slot === 0) return -1;
    if (keys[slot - 1] === key) return slot - 1;
    i = (i + 1) & mask;
  }
}

/** The count stored for `key` (0 when absent). */
export function getCount(table: CountTable, key: number): number {
  const entry = findEntry(table, key);
  return entry < 0 ? 0 : table.values[entry];
}

function grow(table: CountTable): void {
  const capacity = table.keys.length * 2;
  const keys = new Float64Array(capacity);
  const values = new Float64Array(capacity);
  keys.set(table.keys.subarray(0, table.size));
  values.set(table.values.subarray(0, table.size));
  table.keys = keys;
  table.values = values;
  if (table.slots.length < 2 * capacity) {
    const slots = new Int32Array(table.slots.length * 2);
    const mask = slots.length - 1;
    for (let e = 0; e < table.size; e++) {
      let i = hashKey(keys[e]) & mask;
      while (slots[i] !== 0) i = (i + 1) & mask;
      slots[i] = e + 1;
    }
    table.slots = slots;
  }
}

/** Adds `value` to the count of `key` (a new key becomes the last entry). Throws on an invalid key. */
export function addCount(table: CountTable, key: number, value: number): void {
  const mask = table.slots.length - 1;
  let i = hashKey(key) & mask;
  for (;;) {
    const slot = table.slots[i];
    if (slot === 0) break;
    if (table.keys[slot - 1] === key) {
      table.values[slot - 1] += value;
      return;
    }
    i = (i + 1) & mask;
  }
  if (!(Number.isInteger(key) && key >= 0 && key < 2 ** 53)) throw new RangeError(`count table key ${key} is not an integer in [0, 2^53)`);
  if (table.size === table.keys.length) {
    grow(table);
    addCount(table, key, value);
    return;
  }
  table.keys[table.size] = key;
  table.values[table.size] = value;
  table.slots[i] = ++table.size;
}

/** A copy with the same entries in the same order. */
export function cloneCountTable(table: CountTable): CountTable {
  return { keys: table.keys.slice(), values: table.values.slice(), size: table.size, slots: table.slots.slice() };
}

/** A table from [key, count] pairs, in the given order. */
export function countTableFromEntries(entries: ReadonlyArray<readonly [number, number]>): CountTable {
  const table = createCountTable(entries.length);
  for (const [key, value] of entries) addCount(table, key, value);
  return table;
}
