/**
 * A minimal WebAssembly binary encoder: just what the generated kernels need (one memory, i32
 * and i64 arithmetic, loops, 128-bit SIMD loads, stores, arithmetic and comparisons). Kernels are
 * emitted as bytes at run time, so the package ships no binary and needs no build step. Encoding
 * follows the WebAssembly Core Specification 2.0, chapter 5 (binary format), including its
 * fixed-width SIMD (vector) instructions.
 */

/** Value types (spec §5.3, number and vector types). */
export const I32 = 0x7f;
export const I64 = 0x7e;
export const F64 = 0x7c;
export const V128 = 0x7b;
export type ValueType = typeof I32 | typeof I64 | typeof F64 | typeof V128;

function pushUnsigned(bytes: number[], value: number): void {
  if (!Number.isInteger(value) || value < 0 || value > 0xffffffff) throw new RangeError(`LEB128: ${value} is not a u32`);
  let v = value;
  do {
    const byte = v & 0x7f;
    v = Math.floor(v / 128);
    bytes.push(v === 0 ? byte : byte | 0x80);
  } while (v !== 0);
}

function pushSigned(bytes: number[], value: number): void {
  if (!Number.isInteger(value) || value < -0x80000000 || value > 0x7fffffff) throw new RangeError(`LEB128: ${value} is not an s32`);
  let v = value;
  for (;;) {
    const byte = v & 0x7f;
    v >>= 7;
    // Done when the remaining bits are all copies of the sign bit just written.
    if ((v === 0 && (byte & 0x40) === 0) || (v === -1 && (byte & 0x40) !== 0)) {
      bytes.push(byte);
      return;
    }
    bytes.push(byte | 0x80);
  }
}

/**
 * The body of one function: locals beyond the parameters, then instructions. Methods append one
 * instruction each and return the builder, so code reads in stack order. Memory offsets are
 * static byte offsets added to the address on the stack (the `offset` immediate).
 */
export class CodeBuilder {
  readonly bytes: number[] = [];
  /** Types of the declared locals, in index order after the parameters. */
  readonly localTypes: ValueType[] = [];

  constructor(private readonly parameterCount: number) {}

  /** Declares a local of type `type` and returns its index. */
  local(type: ValueType): number {
    this.localTypes.push(type);
    return this.parameterCount + this.localTypes.length - 1;
  }

  private op(code: number): this {
    this.bytes.push(code);
    return this;
  }

  private simd(code: number): this {
    this.bytes.push(0xfd);
    pushUnsigned(this.bytes, code);
    return this;
  }

  private memarg(alignLog2: number, offset: number): this {
    pushUnsigned(this.bytes, alignLog2);
    pushUnsigned(this.bytes, offset);
    return this;
  }

  localGet(index: number): this {
    this.op(0x20);
    pushUnsigned(this.bytes, index);
    return this;
  }
  localSet(index: number): this {
    this.op(0x21);
    pushUnsigned(this.bytes, index);
    return this;
  }
  i32Const(value: number): this {
    this.op(0x41);
    pushSigned(this.bytes, value);
    return this;
  }
  i32Add(): this {
    return this.op(0x6a);
  }
  i32Sub(): this {
    return this.op(0x6b);
  }
  i32Mul(): this {
    return this.op(0x6c);
  }
  i32LtS(): this {
    return this.op(0x48);
  }
  i32Eqz(): this {
    return this.op(0x45);
  }
  i32Ne(): this {
    return this.op(0x47);
  }
  /** `loop` with no result; `br 0` inside jumps back to its start. */
  loop(): this {
    return this.op(0x03).op(0x40);
  }
  /** `block` with no result; `br 0` inside jumps past its end. */
  block(): this {
    return this.op(0x02).op(0x40);
  }
  brIf(depth: number): this {
    this.op(0x0d);
    pushUnsigned(this.bytes, depth);
    return this;
  }
  end(): this {
    return this.op(0x0b);
  }
  i32Load(offset = 0): this {
    return this.op(0x28).memarg(2, offset);
  }
  f64Load(offset = 0): this {
    return this.op(0x2b).memarg(3, offset);
  }
  f64Add(): this {
    return this.op(0xa0);
  }
  /** v128.load; `alignLog2` 3 when only 8-byte alignment is guaranteed (a hint, never a trap). */
  v128Load(offset = 0, alignLog2 = 4): this {
    return this.simd(0x00).memarg(alignLog2, offset);
  }
  v128Store(offset = 0, alignLog2 = 4): this {
    return this.simd(0x0b).memarg(alignLog2, offset);
  }
  /** One f64 from memory in both lanes. */
  v128Load64Splat(offset = 0): this {
    return this.simd(0x0a).memarg(3, offset);
  }
  f64x2Add(): this {
    return this.simd(0xf0);
  }
  /** IEEE 754-2019 maximum per lane: NaN if either is NaN, +0 above −0 (JavaScript's Math.max). */
  f64x2Max(): this {
    return this.simd(0xf5);
  }
  /** Pseudo-maximum per lane: `a < b ? b : a` (keeps a on ties and when either is NaN). */
  f64x2Pmax(): this {
    return this.simd(0xf7);
  }
  /** Loads 8 bytes into lane `lane` of the vector on the stack, keeping the other lane. */
  v128Load64Lane(lane: number, offset = 0): this {
    this.simd(0x57).memarg(3, offset);
    this.bytes.push(lane);
    return this;
  }
  /** Stores lane `lane` (8 bytes) of the vector on the stack. */
  v128Store64Lane(lane: number, offset = 0): this {
    this.simd(0x5b).memarg(3, offset);
    this.bytes.push(lane);
    return this;
  }
  /** A constant vector of two f64 lanes (little-endian, as WebAssembly stores them). */
  f64x2Const(low: number, high: number): this {
    this.simd(0x0c);
    const lanes = new DataView(new ArrayBuffer(16));
    lanes.setFloat64(0, low, true);
    lanes.setFloat64(8, high, true);
    for (let k = 0; k < 16; k++) this.bytes.push(lanes.getUint8(k));
    return this;
  }
  /** f64.const (little-endian IEEE 754 bits). */
  f64Const(value: number): this {
    this.op(0x44);
    const bits = new DataView(new ArrayBuffer(8));
    bits.setFloat64(0, value, true);
    for (let k = 0; k < 8; k++) this.bytes.push(bits.getUint8(k));
    return this;
  }
  /** Lane `lane` of an f64x2 vector as an f64. */
  f64x2ExtractLane(lane: number): this {
    this.simd(0x21);
    this.bytes.push(lane);
    return this;
  }
  /** A constant vector of sixteen bytes (lane 0 first). */
  v128Const(bytes: readonly number[]): this {
    if (bytes.length !== 16) throw new RangeError(`v128.const needs 16 bytes, got ${bytes.length}`);
    this.simd(0x0c);
    this.bytes.push(...bytes);
    return this;
  }
  /** Lanes of two vectors picked by sixteen byte indices (0-15 first vector, 16-31 second). */
  i8x16Shuffle(lanes: readonly number[]): this {
    if (lanes.length !== 16) throw new RangeError(`i8x16.shuffle needs 16 lane indices, got ${lanes.length}`);
    this.simd(0x0d);
    this.bytes.push(...lanes);
    return this;
  }
  /** Per lane: all ones when a < b (false for NaN), else zero. */
  f64x2Lt(): this {
    return this.simd(0x49);
  }
  /** Per lane: all ones when a == b (false for NaN; −0 equals +0), else zero. */
  f64x2Eq(): this {
    return this.simd(0x47);
  }
  /** Per lane: all ones when the 64-bit patterns are equal. */
  i64x2Eq(): this {
    return this.simd(0xd6);
  }
  /** The top bit of each 64-bit lane as an i32 (lane 0 in bit 0). */
  i64x2Bitmask(): this {
    return this.simd(0xc4);
  }
  /** 1 when every 64-bit lane is non-zero. */
  i64x2AllTrue(): this {
    return this.simd(0xc3);
  }
  v128And(): this {
    return this.simd(0x4e);
  }
  /** a & ~b. */
  v128AndNot(): this {
    return this.simd(0x4f);
  }
  i32Store(offset = 0): this {
    return this.op(0x36).memarg(2, offset);
  }
  i32WrapI64(): this {
    return this.op(0xa7);
  }
  /** i64.const for values that fit 32 bits (shift counts and masks here). */
  i64Const(value: number): this {
    this.op(0x42);
    pushSigned(this.bytes, value);
    return this;
  }
  i64ExtendI32U(): this {
    return this.op(0xad);
  }
  i64Shl(): this {
    return this.op(0x86);
  }
  i64Or(): this {
    return this.op(0x84);
  }
  i64Ctz(): this {
    return this.op(0x7a);
  }
  br(depth: number): this {
    this.op(0x0c);
    pushUnsigned(this.bytes, depth);
    return this;
  }
  i32GeU(): this {
    return this.op(0x4f);
  }
  /** Returns from the function with the values on the stack. */
  ret(): this {
    return this.op(0x0f);
  }
}

/** One exported function: its signature and body. */
export type FunctionSpec = { name: string; params: readonly ValueType[]; results: readonly ValueType[]; code: CodeBuilder };

function pushSection(out: number[], id: number, body: number[]): void {
  out.push(id);
  pushUnsigned(out, body.length);
  for (const b of body) out.push(b);
}

function pushName(out: number[], name: string): void {
  const encoded = Array.from(name, (c) => {
    const code = c.charCodeAt(0);
    if (code > 0x7e) throw new RangeError(`export name ${name} must be ASCII`);
    return code;
  });
  pushUnsigned(out, encoded.length);
  out.push(...encoded);
}

/**
 * A module with one exported memory ("memory", `initialPages` × 64 KiB, growable) and the given
 * exported functions, one type per function. Returns the binary (spec §5.5).
 */
export function encodeModule(functions: readonly FunctionSpec[], initialPages: number): Uint8Array {
  const out = [0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00];
  const types: number[] = [];
  pushUnsigned(types, functions.length);
  for (const f of functions) {
    types.push(0x60);
    pushUnsigned(types, f.params.length);
    types.push(...f.params);
    pushUnsigned(types, f.results.length);
    types.push(...f.results);
  }
  pushSection(out, 1, types);
  const declarations: number[] = [];
  pushUnsigned(declarations, functions.length);
  for (let i = 0; i < functions.length; i++) pushUnsigned(declarations, i);
  pushSection(out, 3, declarations);
  const memory: number[] = [1, 0x00];
  pushUnsigned(memory, initialPages);
  pushSection(out, 5, memory);
  const exports: number[] = [];
  pushUnsigned(exports, functions.length + 1);
  pushName(exports, "memory");
  exports.push(0x02, 0);
  functions.forEach((f, i) => {
    pushName(exports, f.name);
    exports.push(0x00);
    pushUnsigned(exports, i);
  });
  pushSection(out, 7, exports);
  const code: number[] = [];
  pushUnsigned(code, functions.length);
  for (const f of functions) {
    const body: number[] = [];
    const locals = f.code.localTypes;
    // Locals are declared as runs of one type (spec §5.5, code section).
    const runs: [number, ValueType][] = [];
    for (const type of locals) {
      const last = runs[runs.length - 1];
      if (last !== undefined && last[1] === type) last[0]++;
      else runs.push([1, type]);
    }
    pushUnsigned(body, runs.length);
    for (const [count, type] of runs) {
      pushUnsigned(body, count);
      body.push(type);
    }
    for (const b of f.code.bytes) body.push(b);
    body.push(0x0b);
    pushUnsigned(code, body.length);
    for (const b of body) code.push(b);
  }
  pushSection(out, 10, code);
  return Uint8Array.from(out);
}
