// Segment sums and counts of a range of rows (segmentSums in kmeans-blocks.ts) as a small
// WebAssembly function over the shared k-means memory: each row's columns are added to its
// segment's sums two at a time with two-lane float64 vectors. Lanes are independent additions
// in row order, so every sum is bit for bit what the JavaScript loop gives, at a fraction of its
// time (the JavaScript loop waits on a bounds-checked load and store per column).
//
//   segmentSums(rows, assignment, sums, counts, count, rowBytes, pairBytes)   (byte offsets and counts)
//     for each of `count` rows:
//       a = assignment[i];  counts[a] += 1
//       sums[a][0 .. pairBytes) += row[0 .. pairBytes)     (two columns per step)
//       an odd last column is added on its own
//   The caller clears `sums` and `counts` first.
import {
  localGet, localSet, localTee, i32Const, I32_ADD, I32_SUB, I32_SHL, I32_MUL, I32_LT_U, I32_EQZ, I32_LOAD, F64_LOAD, F64_STORE, F64_ADD, f64Const, v128Load, v128Store, F64X2_ADD, BLOCK, LOOP, IF, END, brIf, compiledOnce, oneFunctionModule, I32,
} from '../../core/wasm-encoding';

export type SegmentSums = (rows: number, assignment: number, sums: number, counts: number, count: number, rowBytes: number, pairBytes: number) => void;

export function segmentSumsModuleBytes(): Uint8Array {
  const [ROWS, ASSIGN, SUMS, COUNTS, COUNT, ROW_BYTES, PAIR_BYTES, SB, U, CA] = Array.from({ length: 10 }, (_, i) => i);
  const at = (base: number) => [...localGet(base), ...localGet(U), ...I32_ADD];
  const body = [
    ...BLOCK, ...localGet(COUNT), ...I32_EQZ, ...brIf(0),
    ...LOOP,
    ...localGet(SUMS), ...localGet(ASSIGN), ...I32_LOAD, ...localGet(ROW_BYTES), ...I32_MUL, ...I32_ADD, ...localSet(SB),
    ...localGet(COUNTS), ...localGet(ASSIGN), ...I32_LOAD, ...i32Const(3), ...I32_SHL, ...I32_ADD, ...localTee(CA),
    ...localGet(CA), ...F64_LOAD, ...f64Const(1), ...F64_ADD, ...F64_STORE,
    ...i32Const(0), ...localSet(U),
    ...BLOCK, ...localGet(PAIR_BYTES), ...I32_EQZ, ...brIf(0),
    ...LOOP,
    ...at(SB), ...at(SB), ...v128Load(0), ...at(ROWS), ...v128Load(0), ...F64X2_ADD, ...v128Store(0),
    ...localGet(U), ...i32Const(16), ...I32_ADD, ...localTee(U), ...localGet(PAIR_BYTES), ...I32_LT_U, ...brIf(0),
    ...END,
    ...END,
    ...localGet(U), ...localGet(ROW_BYTES), ...I32_LT_U,
    ...IF, ...at(SB), ...at(SB), ...F64_LOAD, ...at(ROWS), ...F64_LOAD, ...F64_ADD, ...F64_STORE, ...END,
    ...localGet(ROWS), ...localGet(ROW_BYTES), ...I32_ADD, ...localSet(ROWS),
    ...localGet(ASSIGN), ...i32Const(4), ...I32_ADD, ...localSet(ASSIGN),
    ...localGet(COUNT), ...i32Const(1), ...I32_SUB, ...localTee(COUNT), ...brIf(0),
    ...END,
    ...END,
    ...END,
  ]; // prettier-ignore
  return oneFunctionModule({ name: 'segmentSums', params: 7, locals: [[3, I32]], body, sharedMemory: true });
}

export const segmentSumsModule = compiledOnce(segmentSumsModuleBytes);
