// The full scan of Hamerly rows whose bounds fail (sweep in kmeans-blocks.ts): squared distances
// of two rows to every centre, as a small WebAssembly function over the shared k-means memory.
// Two-lane float64 vectors hold two centres; each distance is summed in column order from 0 with
// separate multiply and add, so every number is bit for bit what twoByFour gives in JavaScript,
// with one instruction serving two centres and each centre load serving both rows.
//
//   pairScan(rowA, rowB, centres, groups, rowBytes, outA, outB)   (byte offsets and counts)
//     centres: the padded centres interleaved in pairs, four to a group (as the trial rows of
//     the k-means++ sweep); for each group of four: outA[0..3], outB[0..3] = squared distances
import {
  localGet, localSet, localTee, i32Const, I32_ADD, I32_SUB, I32_SHL, I32_LT_U, I32_EQZ, F64_LOAD, v128Load, v128Store, V128_ZERO,
  F64X2_SPLAT, F64X2_ADD, F64X2_SUB, F64X2_MUL, BLOCK, LOOP, END, brIf, compiledOnce, oneFunctionModule, I32, V128,
} from '../../core/wasm-encoding';

export type PairScan = (rowA: number, rowB: number, centres: number, groups: number, rowBytes: number, outA: number, outB: number) => void;

/** Local indices for twoRowsByFour. */
export interface TwoRowsByFourLocals {
  rowA: number; rowB: number; candidates: number; rowBytes: number; u: number; x: number; e: number;
  c01: number; c23: number; a01: number; a23: number; b01: number; b23: number;
} // prettier-ignore

/**
 * The column loop shared by the k-means++ trial sweep and the pair scan: zero four two-lane
 * accumulators, then for every column load the four candidates (interleaved in pairs) once and
 * add (x − candidate)² for each of two rows. a01 / a23 end up holding row A's squared distances
 * to candidates 0 and 1, 2 and 3; b01 / b23 row B's. Column order, separate multiply and add.
 */
export function twoRowsByFour(l: TwoRowsByFourLocals): number[] {
  const accumulate = (acc: number, candidates: number) => [
    ...localGet(acc), ...localGet(l.x), ...localGet(candidates), ...F64X2_SUB, ...localTee(l.e), ...localGet(l.e), ...F64X2_MUL, ...F64X2_ADD, ...localSet(acc),
  ]; // prettier-ignore
  return [
    ...V128_ZERO, ...localSet(l.a01), ...V128_ZERO, ...localSet(l.a23), ...V128_ZERO, ...localSet(l.b01), ...V128_ZERO, ...localSet(l.b23),
    ...i32Const(0), ...localSet(l.u),
    ...LOOP,
    ...localGet(l.candidates), ...localGet(l.u), ...i32Const(1), ...I32_SHL, ...I32_ADD, ...v128Load(0), ...localSet(l.c01),
    ...localGet(l.candidates), ...localGet(l.rowBytes), ...localGet(l.u), ...I32_ADD, ...i32Const(1), ...I32_SHL, ...I32_ADD, ...v128Load(0), ...localSet(l.c23),
    ...localGet(l.rowA), ...localGet(l.u), ...I32_ADD, ...F64_LOAD, ...F64X2_SPLAT, ...localSet(l.x),
    ...accumulate(l.a01, l.c01), ...accumulate(l.a23, l.c23),
    ...localGet(l.rowB), ...localGet(l.u), ...I32_ADD, ...F64_LOAD, ...F64X2_SPLAT, ...localSet(l.x),
    ...accumulate(l.b01, l.c01), ...accumulate(l.b23, l.c23),
    ...localGet(l.u), ...i32Const(8), ...I32_ADD, ...localTee(l.u), ...localGet(l.rowBytes), ...I32_LT_U, ...brIf(0),
    ...END,
  ]; // prettier-ignore
}

export function pairScanModuleBytes(): Uint8Array {
  const [ROW_A, ROW_B, CENTRES, GROUPS, ROW_BYTES, OUT_A, OUT_B, U] = Array.from({ length: 8 }, (_, i) => i);
  const [X, E, A01, A23, B01, B23, C01, C23] = Array.from({ length: 8 }, (_, i) => 8 + i);
  const body = [
    ...BLOCK, ...localGet(GROUPS), ...I32_EQZ, ...brIf(0),
    ...LOOP,
    ...twoRowsByFour({ rowA: ROW_A, rowB: ROW_B, candidates: CENTRES, rowBytes: ROW_BYTES, u: U, x: X, e: E, c01: C01, c23: C23, a01: A01, a23: A23, b01: B01, b23: B23 }),
    ...localGet(OUT_A), ...localGet(A01), ...v128Store(0), ...localGet(OUT_A), ...localGet(A23), ...v128Store(16),
    ...localGet(OUT_B), ...localGet(B01), ...v128Store(0), ...localGet(OUT_B), ...localGet(B23), ...v128Store(16),
    ...localGet(OUT_A), ...i32Const(32), ...I32_ADD, ...localSet(OUT_A),
    ...localGet(OUT_B), ...i32Const(32), ...I32_ADD, ...localSet(OUT_B),
    // The next group of four centres: 4 × d values on.
    ...localGet(CENTRES), ...localGet(ROW_BYTES), ...i32Const(2), ...I32_SHL, ...I32_ADD, ...localSet(CENTRES),
    ...localGet(GROUPS), ...i32Const(1), ...I32_SUB, ...localTee(GROUPS), ...brIf(0),
    ...END,
    ...END,
    ...END,
  ]; // prettier-ignore
  return oneFunctionModule({ name: 'pairScan', params: 7, locals: [[1, I32], [8, V128]], body, sharedMemory: true });
}

/** The kernel compiled for a shared memory; undefined where WebAssembly or its threads are missing. */
export const pairScanModule = compiledOnce(pairScanModuleBytes);
