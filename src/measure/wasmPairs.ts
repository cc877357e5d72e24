// The euclidean pair loop as a small WebAssembly function using two-lane float64 vectors
// (f64x2): each lane is a different pair, summed in column order from 0 with separate multiply
// and add (WebAssembly has no fused multiply-add here), so every value is bit for bit the number
// the plain JavaScript kernel gives — only about twice as fast, since one instruction serves two
// pairs and WebAssembly loads carry no bounds checks.
//
// The module is assembled here from its instructions (no build step, no binary file). Its one
// function, `pairs`, measures two rows (a0, a1) against `count` groups of four later rows and
// writes the eight results to out0 / out1 (row a0's and row a1's next output slots):
//
//   pairs(a0, a1, p, count, rowBytes, out0, out1, root)
//     for each group: acc[4] = 0
//       for u = 0, 8, …, rowBytes − 8:
//         x = splat(f64 at a0 + u), y = splat(f64 at a1 + u)
//         P1 = f64x2 at p + 2u            (rows j, j+1 column u/8, interleaved)
//         P2 = f64x2 at p + 2·rowBytes + 2u (rows j+2, j+3)
//         acc0 += (x − P1)², acc1 += (x − P2)², acc2 += (y − P1)², acc3 += (y − P2)²
//       if root: acc = sqrt(acc)
//       store acc0, acc1 at out0 and acc2, acc3 at out1; p += 4·rowBytes; out0, out1 += 32
//
// All addresses are bytes into one shared memory laid out by `pairsLayout`.
import {
  localGet,
  localSet,
  localTee,
  i32Const,
  I32_ADD,
  I32_SUB,
  I32_SHL,
  I32_LT_U,
  I32_EQZ,
  F64_LOAD,
  V128_LOAD,
  v128Store,
  V128_ZERO,
  F64X2_SPLAT,
  F64X2_SQRT,
  F64X2_ADD,
  F64X2_SUB,
  F64X2_MUL,
  BLOCK,
  LOOP,
  IF,
  END,
  brIf,
  oneFunctionModule,
  compiledOnce,
  I32,
  V128,
} from '../core/wasm-encoding';

/** Byte offsets in the shared memory: the condensed output first, then the rows, then the rows interleaved in pairs. */
export interface PairsLayout {
  readonly dataAt: number;
  readonly pairedAt: number;
  readonly bytes: number;
}

/** WebAssembly memories are at most 65,536 pages of 64 KiB; larger problems use the JavaScript kernel. */
const MAX_BYTES = 65536 * 65536 - 65536;

export function pairsLayout(n: number, d: number): PairsLayout | undefined {
  const pairs = (n * (n - 1)) / 2;
  const dataAt = Math.ceil((pairs * 8) / 16) * 16;
  const pairedAt = dataAt + n * d * 8;
  const bytes = pairedAt + Math.ceil(n / 2) * 2 * d * 8;
  return bytes <= MAX_BYTES ? { dataAt, pairedAt, bytes } : undefined;
}

/** Copy the rows into the memory: as they are, and interleaved by pairs (an odd last row is paired with itself). */
export function fillPairsInputs(memory: Float64Array, data: Float64Array, n: number, d: number, layout: PairsLayout): void {
  memory.set(data.subarray(0, n * d), layout.dataAt / 8);
  const at = layout.pairedAt / 8;
  for (let q = 0; 2 * q < n; q++) {
    const r0 = 2 * q * d;
    const r1 = (2 * q + 1 < n ? 2 * q + 1 : 2 * q) * d;
    const base = at + q * 2 * d;
    for (let t = 0; t < d; t++) {
      memory[base + 2 * t] = data[r0 + t];
      memory[base + 2 * t + 1] = data[r1 + t];
    }
  }
}

/**
 * The pairs of rows iFrom..iTo−1 (iFrom even) into the condensed output at the start of
 * `memory`: the `pairs` function for groups of four later rows, a plain column-order loop for
 * the rest. Self-contained (no imports): its source is also run inside a worker.
 */
export function pairsRowsWasm(
  pairs: (a0: number, a1: number, p: number, count: number, rowBytes: number, out0: number, out1: number, root: number) => void,
  memory: Float64Array,
  n: number,
  d: number,
  root: boolean,
  dataAt: number,
  pairedAt: number,
  iFrom: number,
  iTo: number,
): void {
  const rowBytes = d * 8;
  const at = dataAt / 8;
  const one = (a: number, b: number): number => {
    let s = 0;
    for (let t = 0; t < d; t++) {
      const e = memory[at + a * d + t] - memory[at + b * d + t];
      s += e * e;
    }
    return root ? Math.sqrt(s) : s;
  };
  for (let i = iFrom; i < iTo && i + 1 < n; i += 2) {
    let k0 = n * i - (i * (i + 1)) / 2;
    let k1 = k0 + (n - i - 1);
    memory[k0++] = one(i, i + 1);
    const groups = Math.floor((n - i - 2) / 4);
    if (groups > 0) {
      pairs(
        dataAt + i * rowBytes,
        dataAt + (i + 1) * rowBytes,
        pairedAt + ((i + 2) / 2) * 2 * rowBytes,
        groups,
        rowBytes,
        k0 * 8,
        k1 * 8,
        root ? 1 : 0,
      );
      k0 += 4 * groups;
      k1 += 4 * groups;
    }
    for (let j = i + 2 + 4 * groups; j < n; j++) {
      memory[k0++] = one(i, j);
      memory[k1++] = one(i + 1, j);
    }
  }
}

const compiledShared = compiledOnce(() => pairsModuleBytes(true));
const compiledPrivate = compiledOnce(() => pairsModuleBytes(false));

/**
 * The compiled module for a shared memory (two threads) or a private one, or undefined where
 * WebAssembly with 128-bit vectors is not available.
 */
export function pairsModule(shared: boolean): WebAssembly.Module | undefined {
  return shared ? compiledShared() : compiledPrivate();
}

/** A memory of the layout's size (shared or private, as the module was built) with the module instantiated on it. */
export function instantiatePairs(
  module: WebAssembly.Module,
  layout: PairsLayout,
  shared: boolean,
): { memory: WebAssembly.Memory; pairs: PairsFunction } {
  const pages = Math.ceil(layout.bytes / 65536);
  const memory = new WebAssembly.Memory({ initial: pages, maximum: pages, shared });
  const instance = new WebAssembly.Instance(module, { env: { memory } });
  return { memory, pairs: instance.exports.pairs as PairsFunction };
}

export type PairsFunction = (
  a0: number,
  a1: number,
  p: number,
  count: number,
  rowBytes: number,
  out0: number,
  out1: number,
  root: number,
) => void;

// ---- assembling the module (encoding helpers: src/core/wasm-encoding.ts) ----

export function pairsModuleBytes(shared: boolean): Uint8Array {
  // Parameters 0..7, then locals: i32 u, u2, pb; v128 x, y, P1, P2, e, acc0..acc3.
  const [A0, A1, P, COUNT, ROW_BYTES, OUT0, OUT1, ROOT, U, U2, PB, X, Y, P1, P2, E] = Array.from({ length: 16 }, (_, i) => i);
  const ACC = [16, 17, 18, 19];
  // acc += (v − p)²: the square first, then the add, as `s += e * e` in JavaScript.
  const accumulate = (acc: number, v: number, p: number) => [
    ...localGet(acc), ...localGet(v), ...localGet(p), ...F64X2_SUB, ...localTee(E), ...localGet(E), ...F64X2_MUL, ...F64X2_ADD, ...localSet(acc),
  ]; // prettier-ignore
  const body = [
    ...BLOCK, ...localGet(COUNT), ...I32_EQZ, ...brIf(0),
    ...LOOP,
    ...ACC.flatMap((a) => [...V128_ZERO, ...localSet(a)]),
    ...localGet(P), ...localGet(ROW_BYTES), ...i32Const(1), ...I32_SHL, ...I32_ADD, ...localSet(PB),
    ...i32Const(0), ...localSet(U),
    ...LOOP,
    ...localGet(U), ...i32Const(1), ...I32_SHL, ...localSet(U2),
    ...localGet(A0), ...localGet(U), ...I32_ADD, ...F64_LOAD, ...F64X2_SPLAT, ...localSet(X),
    ...localGet(A1), ...localGet(U), ...I32_ADD, ...F64_LOAD, ...F64X2_SPLAT, ...localSet(Y),
    ...localGet(P), ...localGet(U2), ...I32_ADD, ...V128_LOAD, ...localSet(P1),
    ...localGet(PB), ...localGet(U2), ...I32_ADD, ...V128_LOAD, ...localSet(P2),
    ...accumulate(ACC[0], X, P1), ...accumulate(ACC[1], X, P2), ...accumulate(ACC[2], Y, P1), ...accumulate(ACC[3], Y, P2),
    ...localGet(U), ...i32Const(8), ...I32_ADD, ...localTee(U), ...localGet(ROW_BYTES), ...I32_LT_U, ...brIf(0),
    ...END,
    ...localGet(ROOT), ...IF, ...ACC.flatMap((a) => [...localGet(a), ...F64X2_SQRT, ...localSet(a)]), ...END,
    ...localGet(OUT0), ...localGet(ACC[0]), ...v128Store(0), ...localGet(OUT0), ...localGet(ACC[1]), ...v128Store(16),
    ...localGet(OUT1), ...localGet(ACC[2]), ...v128Store(0), ...localGet(OUT1), ...localGet(ACC[3]), ...v128Store(16),
    ...localGet(PB), ...localGet(ROW_BYTES), ...i32Const(1), ...I32_SHL, ...I32_ADD, ...localSet(P),
    ...localGet(OUT0), ...i32Const(32), ...I32_ADD, ...localSet(OUT0),
    ...localGet(OUT1), ...i32Const(32), ...I32_ADD, ...localSet(OUT1),
    ...localGet(COUNT), ...i32Const(1), ...I32_SUB, ...localTee(COUNT), ...brIf(0),
    ...END,
    ...END,
    ...END,
  ]; // prettier-ignore
  return oneFunctionModule({
    name: 'pairs',
    params: 8,
    locals: [
      [3, I32],
      [9, V128],
    ],
    body,
    sharedMemory: shared,
  });
}
