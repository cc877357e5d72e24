// The k-means++ take step (takeCandidate in kmeans-blocks.ts) as a small WebAssembly function
// over the shared k-means memory, without branches: the row's nearest distance becomes the
// smaller of its own and the chosen trial's, the larger one tightens the lower bound on the
// others, and the running total of the nearest distances is written row by row and returned.
// The same comparisons and the same additions in the same order as the JavaScript loop, so the
// numbers are bit for bit the same.
//
//   take(closest, nearest, secondLower, cumulative, stored, count, storedStride, centre) → total
//     (byte offsets of the block's first row; `stored` already points at the chosen trial)
import {
  localGet, localSet, localTee, i32Const, I32_ADD, I32_SUB, I32_EQZ, I32_LOAD, F64_LOAD, F64_STORE, F64_ADD, f64Const, BLOCK, LOOP, END, brIf, compiledOnce, F64_LT, SELECT, I32_STORE, oneFunctionModule, I32, F64,
} from '../../core/wasm-encoding';

export type TakeKernel = (
  closest: number, nearest: number, secondLower: number, cumulative: number, stored: number, count: number, storedStride: number, centre: number,
) => number; // prettier-ignore

export function takeModuleBytes(): Uint8Array {
  const [CLOSEST, NEAREST, SECOND, CUMULATIVE, STORED, COUNT, STRIDE, CENTRE, WIN] = Array.from({ length: 9 }, (_, i) => i);
  const [OWN, S, LOW, HIGH, RUN, OLD] = Array.from({ length: 6 }, (_, i) => 9 + i);
  const advance = (pointer: number, by: number[]) => [...localGet(pointer), ...by, ...I32_ADD, ...localSet(pointer)];
  const body = [
    ...f64Const(0), ...localSet(RUN),
    ...BLOCK, ...localGet(COUNT), ...I32_EQZ, ...brIf(0),
    ...LOOP,
    ...localGet(CLOSEST), ...F64_LOAD, ...localSet(OWN),
    ...localGet(STORED), ...F64_LOAD, ...localSet(S),
    ...localGet(S), ...localGet(OWN), ...F64_LT, ...localSet(WIN),
    // closest = win ? s : own
    ...localGet(CLOSEST), ...localGet(S), ...localGet(OWN), ...localGet(WIN), ...SELECT, ...localTee(LOW), ...F64_STORE,
    // nearest = win ? centre : nearest
    ...localGet(NEAREST), ...localGet(CENTRE), ...localGet(NEAREST), ...I32_LOAD, ...localGet(WIN), ...SELECT, ...I32_STORE,
    // secondLower = high < secondLower ? high : secondLower, with high = win ? own : s
    ...localGet(OWN), ...localGet(S), ...localGet(WIN), ...SELECT, ...localSet(HIGH),
    ...localGet(SECOND), ...localGet(HIGH), ...localGet(SECOND), ...F64_LOAD, ...localTee(OLD), ...localGet(HIGH), ...localGet(OLD), ...F64_LT, ...SELECT, ...F64_STORE,
    // cumulative = running += low
    ...localGet(CUMULATIVE), ...localGet(RUN), ...localGet(LOW), ...F64_ADD, ...localTee(RUN), ...F64_STORE,
    ...advance(CLOSEST, i32Const(8)), ...advance(NEAREST, i32Const(4)), ...advance(SECOND, i32Const(8)), ...advance(CUMULATIVE, i32Const(8)),
    ...advance(STORED, localGet(STRIDE)),
    ...localGet(COUNT), ...i32Const(1), ...I32_SUB, ...localTee(COUNT), ...brIf(0),
    ...END,
    ...END,
    ...localGet(RUN),
    ...END,
  ]; // prettier-ignore
  return oneFunctionModule({ name: 'take', params: 8, result: F64, locals: [[1, I32], [6, F64]], body, sharedMemory: true });
}

export const takeModule = compiledOnce(takeModuleBytes);
