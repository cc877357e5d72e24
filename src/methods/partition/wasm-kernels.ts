// The WebAssembly kernels of k-means: written as WebAssembly text in kernels/*.wat (read those
// for what each does), assembled by scripts/assemble-kernels.js into kernels/assembled.ts. Each
// kernel runs over the memory of one k-means call (kmeans-memory.ts); its JavaScript twin in
// seeding.ts, centre-update.ts or hamerly-sweep.ts is the path where WebAssembly is missing and
// the oracle of the bit-identity tests (test/methods/partition/wasm-kernels.test.ts).
// Every argument is an i32 byte offset or count unless its name says otherwise.
import { compiledOnce } from '../../core/wasm-encoding';
import { ASSEMBLED_KERNELS } from './kernels/assembled';

/** kernels/trial-totals.wat: the k-means++ trial sweep for four trials. */
export type TrialTotals = (
  rows: number, trials: number, closest: number, count: number, rowBytes: number, stored: number, storedStride: number, totals: number,
) => void; // prettier-ignore
/** kernels/take.wat: the k-means++ take step; returns the block's new potential. */
export type TakeKernel = (
  closest: number, nearest: number, secondLower: number, cumulative: number, stored: number, count: number, storedStride: number, centre: number,
) => number; // prettier-ignore
/** kernels/segment-sums.wat: segment sums and counts of a range of rows. */
export type SegmentSums = (
  rows: number,
  assignment: number,
  sums: number,
  counts: number,
  count: number,
  rowBytes: number,
  pairBytes: number,
) => void;
/** kernels/pair-scan.wat: squared distances of two rows to every padded centre. */
export type PairScan = (rowA: number, rowB: number, centres: number, groups: number, rowBytes: number, outA: number, outB: number) => void;
/** kernels/bound-pass.wat: the bound pass of a Hamerly sweep; returns the rows listed for a full scan. */
export type BoundPass = (
  assignment: number, upper: number, lower: number, rows: number, centres: number, moved: number, halfGap: number,
  count: number, rowBytes: number, mostAt: number, first: number, list: number, most: number, secondMost: number,
) => number; // prettier-ignore

export type KernelName = keyof typeof ASSEMBLED_KERNELS;

/** The binary of one kernel, as assembled from its .wat file. */
export function kernelBytes(name: KernelName): Uint8Array {
  return Uint8Array.from(Buffer.from(ASSEMBLED_KERNELS[name], 'base64'));
}

const compiled = Object.fromEntries(
  (Object.keys(ASSEMBLED_KERNELS) as KernelName[]).map((name) => [name, compiledOnce(() => kernelBytes(name))]),
) as Record<KernelName, () => WebAssembly.Module | undefined>;

/** The compiled kernel, or undefined where WebAssembly (or its 128-bit vectors) is missing. */
export function kernelModule(name: KernelName): WebAssembly.Module | undefined {
  return compiled[name]();
}
