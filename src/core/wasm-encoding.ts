// The WebAssembly binary vocabulary our small hand-assembled kernels are written in (the
// euclidean pair loop and the k-means kernels): LEB128 numbers, sections, the few instructions
// they use, and the one-function module around each. Kept in one place so each kernel file reads as its instruction list.

/** Unsigned LEB128. */
export function uleb(value: number): number[] {
  const out: number[] = [];
  do {
    let byte = value & 0x7f;
    value >>>= 7;
    if (value !== 0) byte |= 0x80;
    out.push(byte);
  } while (value !== 0);
  return out;
}

/** Signed LEB128 (what i32.const takes). */
export function sleb(value: number): number[] {
  const out: number[] = [];
  for (;;) {
    const byte = value & 0x7f;
    value >>= 7;
    if ((value === 0 && (byte & 0x40) === 0) || (value === -1 && (byte & 0x40) !== 0)) {
      out.push(byte);
      return out;
    }
    out.push(byte | 0x80);
  }
}

export const section = (id: number, bytes: number[]): number[] => [id, ...uleb(bytes.length), ...bytes];
export const vector = (items: number[][]): number[] => [...uleb(items.length), ...items.flat()];
export const text = (s: string): number[] => [...uleb(s.length), ...Array.from(s, (c) => c.charCodeAt(0))];
export const localGet = (i: number) => [0x20, ...uleb(i)];
export const localSet = (i: number) => [0x21, ...uleb(i)];
export const localTee = (i: number) => [0x22, ...uleb(i)];
export const i32Const = (v: number) => [0x41, ...sleb(v)];
export const vectorOp = (op: number) => [0xfd, ...uleb(op)];
export const I32_ADD = [0x6a];
export const I32_SUB = [0x6b];
export const I32_SHL = [0x74];
export const I32_LT_U = [0x49];
export const I32_EQZ = [0x45];
/** f64.load, align 2^3, offset 0. */
export const F64_LOAD = [0x2b, 3, 0];
export const f64LoadAt = (offset: number) => [0x2b, 3, ...uleb(offset)];
/** v128.load, align 1 (unaligned allowed). */
export const v128Load = (offset: number) => [...vectorOp(0), 0, ...uleb(offset)];
export const V128_LOAD = v128Load(0);
export const v128Store = (offset: number) => [...vectorOp(11), 0, ...uleb(offset)];
export const V128_ZERO = [...vectorOp(12), ...new Array<number>(16).fill(0)];
export const F64X2_SPLAT = vectorOp(20);
export const F64X2_LT = vectorOp(73);
export const V128_BITSELECT = vectorOp(82);
export const F64X2_SQRT = vectorOp(239);
export const F64X2_ADD = vectorOp(240);
export const F64X2_SUB = vectorOp(241);
export const F64X2_MUL = vectorOp(242);
export const BLOCK = [0x02, 0x40];
export const LOOP = [0x03, 0x40];
export const IF = [0x04, 0x40];
export const END = [0x0b];
export const brIf = (depth: number) => [0x0d, depth];
export const I32_MUL = [0x6c];
/** i32.load, align 2^2, offset 0. */
export const I32_LOAD = [0x28, 2, 0];
/** f64.store, align 2^3, offset 0. */
export const F64_STORE = [0x39, 3, 0];
export const F64_ADD = [0xa0];
/** f64.const: the opcode and the value's eight bytes, little-endian. */
export function f64Const(value: number): number[] {
  const bytes = new Uint8Array(new Float64Array([value]).buffer);
  return [0x44, ...Array.from(bytes)];
}

/**
 * A module compiled on first use and kept, or undefined for good where WebAssembly (or what the
 * module needs, such as shared memory) is missing: callers then use their JavaScript loop.
 */
export function compiledOnce(bytes: () => Uint8Array): () => WebAssembly.Module | undefined {
  let compiled: WebAssembly.Module | null | undefined;
  return () => {
    if (compiled === undefined) {
      try {
        // Built from number arrays, so never shared memory (the type only says "could be").
        const b = bytes() as Uint8Array<ArrayBuffer>;
        compiled = typeof WebAssembly === 'object' && WebAssembly.validate(b) ? new WebAssembly.Module(b) : null;
      } catch {
        compiled = null;
      }
    }
    return compiled ?? undefined;
  };
}

export const I32 = 0x7f;
export const F64 = 0x7c;
export const V128 = 0x7b;

/**
 * A module of one exported function over an imported memory (`env.memory`, shared or private,
 * up to 4 GiB): `params` i32 parameters (or their types, in order), an optional result type,
 * locals as [count, type] runs.
 */
export function oneFunctionModule(spec: {
  name: string;
  params: number | number[];
  result?: number;
  locals: [number, number][];
  body: number[];
  sharedMemory: boolean;
}): Uint8Array {
  const code = [...vector(spec.locals.map(([count, type]) => [...uleb(count), type])), ...spec.body];
  const results = spec.result === undefined ? [0] : vector([[spec.result]]);
  const paramTypes = typeof spec.params === 'number' ? new Array<number>(spec.params).fill(I32) : spec.params;
  return new Uint8Array([
    0x00, 0x61, 0x73, 0x6d, 1, 0, 0, 0, // magic, version 1
    ...section(1, vector([[0x60, ...vector(paramTypes.map((t) => [t])), ...results]])),
    // Imported memory: limits flag 3 = shared with a maximum, 1 = private with a maximum.
    ...section(2, vector([[...text('env'), ...text('memory'), 0x02, spec.sharedMemory ? 0x03 : 0x01, ...uleb(0), ...uleb(65536)]])),
    ...section(3, vector([[0]])),
    ...section(7, vector([[...text(spec.name), 0x00, 0]])),
    ...section(10, vector([[...uleb(code.length), ...code]])),
  ]); // prettier-ignore
}

export const ELSE = [0x05];
export const SELECT = [0x1b];
export const I32_EQ = [0x46];
/** i32.store, align 2^2, offset 0. */
export const I32_STORE = [0x36, 2, 0];
export const F64_LT = [0x63];
export const F64_GT = [0x64];
export const F64_SUB = [0xa1];
export const F64_MUL = [0xa2];
export const F64_SQRT = [0x9f];
