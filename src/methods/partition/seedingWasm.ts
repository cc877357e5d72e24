// The k-means++ trial sweep (measureTrials in seeding.ts) as a small WebAssembly function with
// two-lane float64 vectors: the lanes are two candidates, each distance summed in column order
// from 0 with separate multiply and add, and each trial's total summed in row order — so every
// number is bit for bit what the JavaScript sweep gives, with one instruction serving two candidates. Every row is
// measured; a vector select adds the smaller of the candidate's and the row's own distance.
//
//   trialTotals(rows, cand, closest, count, rowBytes, stored, storedStride, totals)   (byte offsets and counts)
//     tot01 = tot23 = 0
//     for each of `count` row pairs, each row of the pair in turn (two rows share each candidate load):
//       own = splat(closest)
//       acc01, acc23 = Σ over columns (x − candidate)²   (candidates interleaved in pairs at cand)
//       stored[0..3] = acc
//       tot += acc < own ? acc : own
//     totals[0..3] = tot
import {
  localGet, localSet, localTee, i32Const, I32_ADD, I32_SUB, I32_EQZ, F64_LOAD, f64LoadAt, v128Store, V128_ZERO, F64X2_SPLAT, F64X2_LT, V128_BITSELECT, F64X2_ADD, BLOCK, LOOP, END, brIf, compiledOnce, oneFunctionModule, I32, V128,
} from '../../core/wasm-encoding';
import { twoRowsByFour } from './scan-wasm';
export type PairsTotals = (
  rows: number, cand: number, closest: number, count: number, rowBytes: number, stored: number, storedStride: number, totals: number,
) => void; // prettier-ignore

/** The sweep compiled for a shared memory (see kmeans-memory.ts); undefined where WebAssembly or its threads are missing. */
export const sharedTrialModule = compiledOnce(trialModuleBytes);

// ---- assembling the module (encoding helpers: src/core/wasm-encoding.ts) ----

export function trialModuleBytes(): Uint8Array {
  const [ROWS, CAND, CLOSEST, COUNT, ROW_BYTES, STORED, STORED_STRIDE, TOTALS, U, NEXT_ROW] = Array.from({ length: 10 }, (_, i) => i);
  const [OWN0, OWN1, X, A0, B0, A1, B1, E, TOT01, TOT23, C01, C23] = Array.from({ length: 12 }, (_, i) => 10 + i);
  // tot += acc < own ? acc : own
  const contribute = (tot: number, acc: number, own: number) => [
    ...localGet(tot), ...localGet(acc), ...localGet(own), ...localGet(acc), ...localGet(own), ...F64X2_LT, ...V128_BITSELECT,
    ...F64X2_ADD, ...localSet(tot),
  ]; // prettier-ignore
  // Two rows per turn (four independent sums; each candidate load serves both rows). `count` is
  // the number of row pairs; the caller measures an odd last row itself.
  const body = [
    ...V128_ZERO, ...localSet(TOT01), ...V128_ZERO, ...localSet(TOT23),
    ...BLOCK, ...localGet(COUNT), ...I32_EQZ, ...brIf(0),
    ...LOOP,
    ...localGet(CLOSEST), ...F64_LOAD, ...F64X2_SPLAT, ...localSet(OWN0),
    ...localGet(CLOSEST), ...f64LoadAt(8), ...F64X2_SPLAT, ...localSet(OWN1),
    ...localGet(ROWS), ...localGet(ROW_BYTES), ...I32_ADD, ...localSet(NEXT_ROW),
    ...twoRowsByFour({ rowA: ROWS, rowB: NEXT_ROW, candidates: CAND, rowBytes: ROW_BYTES, u: U, x: X, e: E, c01: C01, c23: C23, a01: A0, a23: B0, b01: A1, b23: B1 }),
    ...localGet(STORED), ...localGet(A0), ...v128Store(0), ...localGet(STORED), ...localGet(B0), ...v128Store(16),
    ...localGet(STORED), ...localGet(STORED_STRIDE), ...I32_ADD, ...localSet(U),
    ...localGet(U), ...localGet(A1), ...v128Store(0), ...localGet(U), ...localGet(B1), ...v128Store(16),
    // Row order within each total: the first row of the pair, then the second.
    ...contribute(TOT01, A0, OWN0), ...contribute(TOT23, B0, OWN0),
    ...contribute(TOT01, A1, OWN1), ...contribute(TOT23, B1, OWN1),
    ...localGet(NEXT_ROW), ...localGet(ROW_BYTES), ...I32_ADD, ...localSet(ROWS),
    ...localGet(CLOSEST), ...i32Const(16), ...I32_ADD, ...localSet(CLOSEST),
    ...localGet(U), ...localGet(STORED_STRIDE), ...I32_ADD, ...localSet(STORED),
    ...localGet(COUNT), ...i32Const(1), ...I32_SUB, ...localTee(COUNT), ...brIf(0),
    ...END,
    ...END,
    ...localGet(TOTALS), ...localGet(TOT01), ...v128Store(0), ...localGet(TOTALS), ...localGet(TOT23), ...v128Store(16),
    ...END,
  ]; // prettier-ignore
  return oneFunctionModule({ name: 'trialTotals', params: 8, locals: [[2, I32], [12, V128]], body, sharedMemory: true });
}
