import { describe, expect, it } from "vitest";
import { CodeBuilder, encodeModule, F64, I32, V128 } from "./wasm-emitter";

type WasmForTests = {
  validate(bytes: Uint8Array): boolean;
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object) => { exports: Record<string, unknown> };
};
const wasm = (globalThis as unknown as { WebAssembly: WasmForTests }).WebAssembly;

describe("CodeBuilder", () => {
  it("encodes LEB128 immediates (WebAssembly spec §5.2.2; 624485 is the DWARF example)", () => {
    const signed = (value: number) => new CodeBuilder(0).i32Const(value).bytes.slice(1);
    expect(signed(0)).toEqual([0x00]);
    expect(signed(63)).toEqual([0x3f]);
    expect(signed(64)).toEqual([0xc0, 0x00]);
    expect(signed(-1)).toEqual([0x7f]);
    expect(signed(-64)).toEqual([0x40]);
    expect(signed(-65)).toEqual([0xbf, 0x7f]);
    expect(signed(2147483647)).toEqual([0xff, 0xff, 0xff, 0xff, 0x07]);
    expect(signed(-2147483648)).toEqual([0x80, 0x80, 0x80, 0x80, 0x78]);
    expect(new CodeBuilder(0).localGet(624485).bytes.slice(1)).toEqual([0xe5, 0x8e, 0x26]);
    expect(() => new CodeBuilder(0).i32Const(2 ** 31)).toThrow(RangeError);
    expect(() => new CodeBuilder(0).localGet(-1)).toThrow(RangeError);
  });
});

describe("encodeModule", () => {
  it("builds a module that validates and runs: a loop summing 1..n", () => {
    const code = new CodeBuilder(1);
    const sum = code.local(I32);
    code.block().loop();
    code.localGet(0).i32Eqz().brIf(1);
    code.localGet(sum).localGet(0).i32Add().localSet(sum);
    code.localGet(0).i32Const(1).i32Sub().localSet(0);
    code.br(0).end().end();
    code.localGet(sum);
    const bytes = encodeModule([{ name: "sum", params: [I32], results: [I32], code }], 1);
    expect(wasm.validate(bytes)).toBe(true);
    const instance = new wasm.Instance(new wasm.Module(bytes));
    expect((instance.exports.sum as (n: number) => number)(100)).toBe(5050);
  });

  it("f64x2.pmax keeps its first operand on ties and NaN, f64x2.max is Math.max (why viterbi-wasm.ts declines −0 and NaN)", () => {
    // out[0..1] = pmax(a, b), out[2..3] = max(a, b) for a at byte 0 and b at byte 16.
    const code = new CodeBuilder(0);
    const a = code.local(V128);
    const b = code.local(V128);
    code.i32Const(0).v128Load(0).localSet(a);
    code.i32Const(0).v128Load(16).localSet(b);
    code.i32Const(0).localGet(a).localGet(b).f64x2Pmax().v128Store(32);
    code.i32Const(0).localGet(a).localGet(b).f64x2Max().v128Store(48);
    const instance = new wasm.Instance(new wasm.Module(encodeModule([{ name: "run", params: [], results: [], code }], 1)));
    const memory = new Float64Array((instance.exports.memory as { buffer: ArrayBuffer }).buffer, 0, 8);
    const run = instance.exports.run as () => void;
    const lanes = (x: [number, number], y: [number, number]) => {
      memory.set([...x, ...y]);
      run();
      return { pmax: [memory[4], memory[5]], max: [memory[6], memory[7]] };
    };
    const zeros = lanes([-0, 0], [0, -0]);
    expect(zeros.pmax.map((v) => Object.is(v, -0))).toEqual([true, false]);
    expect(zeros.max.map((v) => Object.is(v, 0))).toEqual([true, true]);
    const nan = lanes([-1, NaN], [NaN, -2]);
    expect(nan.pmax[0]).toBe(-1);
    expect(nan.pmax[1]).toBeNaN();
    expect(nan.max.every(Number.isNaN)).toBe(true);
    const ordinary = lanes([-3, -Infinity], [-2.5, -7]);
    expect(ordinary.pmax).toEqual([-2.5, -7]);
    expect(ordinary.max).toEqual([-2.5, -7]);
  });

  it("encodes f64.const and f64x2.extract_lane (spec §5.4.1, §5.4.8): the bits come back unchanged", () => {
    // f(k) = lane k of the vector (−0, 1/3); g() = f64.const NaN, as the Viterbi kernel declines.
    const f = new CodeBuilder(0);
    f.f64x2Const(-0, 1 / 3).f64x2ExtractLane(1);
    const g = new CodeBuilder(0);
    g.f64Const(NaN);
    const h = new CodeBuilder(0);
    h.f64x2Const(-0, 1 / 3).f64x2ExtractLane(0);
    const bytes = encodeModule(
      [
        { name: "high", params: [], results: [F64], code: f },
        { name: "nan", params: [], results: [F64], code: g },
        { name: "low", params: [], results: [F64], code: h },
      ],
      1,
    );
    expect(wasm.validate(bytes)).toBe(true);
    const exports = new wasm.Instance(new wasm.Module(bytes)).exports as Record<string, () => number>;
    expect(exports.high()).toBe(1 / 3);
    expect(exports.nan()).toBeNaN();
    expect(Object.is(exports.low(), -0)).toBe(true);
  });
});
