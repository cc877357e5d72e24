// The bound pass of a Hamerly sweep (sweep in kmeans-blocks.ts) as a small WebAssembly function
// over the shared k-means memory: every row's bounds follow the last centre moves; a row whose
// upper bound is below max(lower bound, half the gap from its centre to the nearest other)
// keeps its segment; otherwise its own distance is measured (column order, as in JavaScript)
// and, if that still cannot rule a change out, the row is listed for the full scan. The same
// comparisons and arithmetic as the JavaScript loop, so bounds and list are bit for bit the same.
//
//   boundPass(assignment, upper, lower, rows, centres, moved, halfGap, count, rowBytes, mostAt,
//             first, list, most, secondMost) → rows listed
//     (byte offsets of the block's first row; `first` is its row number; moved / halfGap / centres
//     are the whole arrays; `list` receives row numbers in increasing order)
import {
  localGet, localSet, localTee, i32Const, I32_ADD, I32_SUB, I32_MUL, I32_SHL, I32_LT_U, I32_EQZ, I32_EQ, I32_LOAD, I32_STORE, F64_LOAD,
  F64_STORE, F64_ADD, F64_SUB, F64_MUL, F64_SQRT, F64_LT, F64_GT, f64Const, SELECT, BLOCK, LOOP, IF, ELSE, END, brIf, compiledOnce,
  oneFunctionModule, I32, F64,
} from '../../core/wasm-encoding';

export type BoundPass = (
  assignment: number, upper: number, lower: number, rows: number, centres: number, moved: number, halfGap: number,
  count: number, rowBytes: number, mostAt: number, first: number, list: number, most: number, secondMost: number,
) => number; // prettier-ignore

export function boundPassModuleBytes(): Uint8Array {
  const [ASSIGN, UPPER, LOWER, ROWS, CENTRES, MOVED, HALFGAP, COUNT, ROW_BYTES, MOST_AT, ROW, LIST, MOST, SECOND] = Array.from({ length: 14 }, (_, i) => i);
  const [A, AB, U, LISTED] = Array.from({ length: 4 }, (_, i) => 14 + i);
  const [UP, LOW, HG, BOUND, OWN, DIFF] = Array.from({ length: 6 }, (_, i) => 18 + i);
  const advance = (pointer: number, by: number[]) => [...localGet(pointer), ...by, ...I32_ADD, ...localSet(pointer)];
  const body = [
    ...i32Const(0), ...localSet(LISTED),
    ...BLOCK, ...localGet(COUNT), ...I32_EQZ, ...brIf(0),
    ...LOOP,
    ...localGet(ASSIGN), ...I32_LOAD, ...localSet(A),
    // up = upper + moved[a]
    ...localGet(UPPER), ...F64_LOAD, ...localGet(MOVED), ...localGet(A), ...i32Const(3), ...I32_SHL, ...I32_ADD, ...F64_LOAD, ...F64_ADD, ...localSet(UP),
    // lower = low = lower − (a = mostAt ? secondMost : most)
    ...localGet(LOWER),
    ...localGet(LOWER), ...F64_LOAD, ...localGet(SECOND), ...localGet(MOST), ...localGet(A), ...localGet(MOST_AT), ...I32_EQ, ...SELECT, ...F64_SUB,
    ...localTee(LOW), ...F64_STORE,
    // bound = halfGap[a] > low ? halfGap[a] : low
    ...localGet(HALFGAP), ...localGet(A), ...i32Const(3), ...I32_SHL, ...I32_ADD, ...F64_LOAD, ...localTee(HG),
    ...localGet(LOW), ...localGet(HG), ...localGet(LOW), ...F64_GT, ...SELECT, ...localSet(BOUND),
    ...localGet(UP), ...localGet(BOUND), ...F64_LT,
    ...IF,
    ...localGet(UPPER), ...localGet(UP), ...F64_STORE,
    ...ELSE,
    // own = sqrt(Σ (row − centre[a])²), columns in order
    ...localGet(CENTRES), ...localGet(A), ...localGet(ROW_BYTES), ...I32_MUL, ...I32_ADD, ...localSet(AB),
    ...f64Const(0), ...localSet(OWN), ...i32Const(0), ...localSet(U),
    ...LOOP,
    ...localGet(ROWS), ...localGet(U), ...I32_ADD, ...F64_LOAD, ...localGet(AB), ...localGet(U), ...I32_ADD, ...F64_LOAD, ...F64_SUB, ...localTee(DIFF),
    ...localGet(DIFF), ...F64_MUL, ...localGet(OWN), ...F64_ADD, ...localSet(OWN),
    ...localGet(U), ...i32Const(8), ...I32_ADD, ...localTee(U), ...localGet(ROW_BYTES), ...I32_LT_U, ...brIf(0),
    ...END,
    ...localGet(UPPER), ...localGet(OWN), ...F64_SQRT, ...localTee(OWN), ...F64_STORE,
    ...localGet(OWN), ...localGet(BOUND), ...F64_LT, ...I32_EQZ,
    ...IF,
    ...localGet(LIST), ...localGet(LISTED), ...i32Const(2), ...I32_SHL, ...I32_ADD, ...localGet(ROW), ...I32_STORE,
    ...localGet(LISTED), ...i32Const(1), ...I32_ADD, ...localSet(LISTED),
    ...END,
    ...END,
    ...advance(ASSIGN, i32Const(4)), ...advance(UPPER, i32Const(8)), ...advance(LOWER, i32Const(8)), ...advance(ROWS, localGet(ROW_BYTES)), ...advance(ROW, i32Const(1)),
    ...localGet(COUNT), ...i32Const(1), ...I32_SUB, ...localTee(COUNT), ...brIf(0),
    ...END,
    ...END,
    ...localGet(LISTED),
    ...END,
  ]; // prettier-ignore
  return oneFunctionModule({
    name: 'boundPass', params: [...new Array<number>(12).fill(I32), F64, F64], result: I32, locals: [[4, I32], [6, F64]], body, sharedMemory: true,
  }); // prettier-ignore
}

/** The kernel compiled for a shared memory; undefined where WebAssembly or its threads are missing. */
export const boundPassModule = compiledOnce(boundPassModuleBytes);
