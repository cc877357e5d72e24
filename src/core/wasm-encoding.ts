// The WebAssembly binary vocabulary our small hand-assembled kernels are written in (the
// euclidean pair loop, the k-means++ trial sweep): LEB128 numbers, sections, and the few
// instructions they use. Kept in one place so each kernel file reads as its instruction list.

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
