// All state of one k-means call in one block of memory: the rows, what k-means++ learns about
// them, the Lloyd bounds and assignment, and small per-block totals. Where the platform has them
// it is a WebAssembly memory, so the kernels run as WebAssembly on it; otherwise plain arrays
// over the caller's own rows (no copy).
//
// The rows are cut into `blocks` fixed ranges (eight for large inputs, chosen from the shape
// alone). Every sum over rows is summed block by block and the block totals then added in block
// order: a fixed summation order (as scikit-learn sums over fixed chunks of rows), which keeps
// the rounding of the large sums independent of how a pass is written.
import { defaultTrials } from './seeding-trials';
import {
  kernelModule,
  type BoundPass,
  type KernelName,
  type PairScan,
  type SegmentSums,
  type TakeKernel,
  type TrialTotals,
} from './wasm-kernels';

export interface KmeansLayout {
  readonly n: number;
  readonly d: number;
  readonly k: number;
  /** Trials per k-means++ step rounded up to a multiple of four (the row stride of `stored`). */
  readonly padded: number;
  readonly blocks: number;
  /** Block b is rows [starts[b], starts[b + 1]); every start is even, for the paired sweep. */
  readonly starts: readonly number[];
  readonly bytes: number;
  /** Byte offset and length (elements; 0 for arrays left out) of every array. */
  readonly at: Readonly<Record<Float64Field | Int32Field, number>>;
  readonly length: Readonly<Record<Float64Field | Int32Field, number>>;
}

const FLOAT64_FIELDS = [
  'rows', 'closest', 'secondLower', 'cumulative', 'upper', 'lower', 'stored', 'candidates', 'candidatesPaired', 'totals',
  'sums', 'counts', 'centres', 'centresPaired', 'scan', 'previous', 'moved', 'halfGap', 'parts', 'blockValue', 'grand', 'params',
] as const; // prettier-ignore
const INT32_FIELDS = ['nearest', 'assignment', 'listed'] as const;
type Float64Field = (typeof FLOAT64_FIELDS)[number];
type Int32Field = (typeof INT32_FIELDS)[number];

/** Indices into `params`: the largest and second-largest centre moves, and where the largest was. */
export const PARAM_MOST = 0;
export const PARAM_SECOND_MOST = 1;
export const PARAM_MOST_AT = 2;
/** 1 when the k-means++ steps run as WebAssembly, 0 for the JavaScript loops (tests compare them). */
export const PARAM_SEEDING_WASM = 3;

export interface KmeansMemory {
  readonly layout: KmeansLayout;
  /** The WebAssembly memory, when the state lives in one. */
  readonly wasm?: WebAssembly.Memory;
  /** The WebAssembly kernels over `wasm` (wasm-kernels.ts). */
  readonly sweep?: TrialTotals;
  readonly take?: TakeKernel;
  readonly segmentSums?: SegmentSums;
  readonly pairScan?: PairScan;
  readonly boundPass?: BoundPass;
  readonly rows: Float64Array;
  /** k-means++: squared distance to the nearest chosen centre, its number, and a lower bound on the squared distance to the others. */
  readonly closest: Float64Array;
  readonly nearest: Int32Array;
  readonly secondLower: Float64Array;
  /** Running totals of `closest` within each block (the weights of the draws). */
  readonly cumulative: Float64Array;
  /** Distances of every row to the current trials: stored[i × padded + t]. */
  readonly stored: Float64Array;
  /** Trial rows one after another (padded × d), and interleaved in pairs for the WebAssembly sweep. */
  readonly candidates: Float64Array;
  readonly candidatesPaired: Float64Array;
  /** Trial totals by block: totals[b × padded + t]. */
  readonly totals: Float64Array;
  readonly assignment: Int32Array;
  /** Per block, from the block's first row on: rows a Hamerly sweep must scan in full. */
  readonly listed: Int32Array;
  readonly upper: Float64Array;
  readonly lower: Float64Array;
  /** Segment sums and counts by block: sums[(b × k + c) × d + j], counts[b × k + c]. */
  readonly sums: Float64Array;
  readonly counts: Float64Array;
  readonly centres: Float64Array;
  /**
   * The same centres followed by copies at infinity up to a multiple of four, so the distance
   * loops take centres four at a time with no remainder: a centre at infinity is never nearest.
   */
  readonly paddedCentres: Float64Array;
  /** The padded centres interleaved in pairs, four to a group, for the WebAssembly scan. */
  readonly centresPaired: Float64Array;
  /** Per block: squared distances of two rows to every padded centre (scan[b × 2 × k4 …]). */
  readonly scan: Float64Array;
  readonly previous: Float64Array;
  readonly moved: Float64Array;
  readonly halfGap: Float64Array;
  /** Per-segment within-SS by block: parts[b × k + c]. */
  readonly parts: Float64Array;
  /** One number per block from the last phase (a potential, a total, a count of changes). */
  readonly blockValue: Float64Array;
  /** Column sums by block: grand[b × d + j]; the grand mean goes in the first d. */
  readonly grand: Float64Array;
  readonly params: Float64Array;
}

/** Inputs at least this large (rows × columns) … */
const MIN_VALUES_FOR_BLOCKS = 200_000;
/** … with at least this much work per restart (rows × columns × k) are cut in blocks of rows. */
const MIN_WORK_FOR_BLOCKS = 2_000_000;
const BLOCKS = 8;

function align16(bytes: number): number {
  return Math.ceil(bytes / 16) * 16;
}

/**
 * Where every array lives. `rowsInside` false leaves no room for the rows (plain memory uses the
 * caller's); `lloyd` false leaves none for the k-means++ and bound arrays either (an exact finish
 * needs only the assignment and the per-segment totals).
 */
export function kmeansLayout(n: number, d: number, k: number, { rowsInside = true, lloyd = true } = {}): KmeansLayout {
  const padded = 4 * Math.ceil(defaultTrials(k) / 4);
  const blocks = n * d >= MIN_VALUES_FOR_BLOCKS && n * d * k >= MIN_WORK_FOR_BLOCKS ? BLOCKS : 1;
  const starts = Array.from({ length: blocks + 1 }, (_, b) => (b === blocks ? n : 2 * Math.floor((b * n) / (2 * blocks))));
  const lengths: Record<Float64Field | Int32Field, number> = {
    rows: rowsInside ? n * d : 0, closest: n, secondLower: lloyd ? n : 0, cumulative: lloyd ? n : 0, upper: lloyd ? n : 0,
    lower: lloyd ? n : 0, stored: lloyd ? n * padded : 0,
    candidates: padded * d, candidatesPaired: padded * d, totals: blocks * padded, sums: blocks * k * d, counts: blocks * k,
    centres: 4 * Math.ceil(k / 4) * d, centresPaired: lloyd ? 4 * Math.ceil(k / 4) * d : 0, scan: lloyd ? blocks * 8 * Math.ceil(k / 4) : 0,
    previous: k * d, moved: k, halfGap: k, parts: blocks * k, blockValue: blocks, grand: blocks * d, params: 4,
    nearest: lloyd ? n : 0, assignment: n, listed: lloyd ? n : 0,
  }; // prettier-ignore
  const at = {} as Record<Float64Field | Int32Field, number>;
  let bytes = 0;
  for (const f of FLOAT64_FIELDS) {
    at[f] = bytes;
    bytes = align16(bytes + lengths[f] * 8);
  }
  for (const f of INT32_FIELDS) {
    at[f] = bytes;
    bytes = align16(bytes + lengths[f] * 4);
  }
  return { n, d, k, padded, blocks, starts, bytes, at, length: lengths };
}

/**
 * Rows of d values, `count` of them (a multiple of four), interleaved in pairs for the WebAssembly
 * kernels: in each group of four, rows 0 and 1 side by side column by column, then rows 2 and 3.
 */
export function interleaveInPairs(from: Float64Array, to: Float64Array, count: number, d: number): void {
  for (let t0 = 0; t0 < count; t0 += 4) {
    const base = t0 * d;
    for (let j = 0; j < d; j++) {
      to[base + 2 * j] = from[base + j];
      to[base + 2 * j + 1] = from[base + d + j];
      to[base + 2 * d + 2 * j] = from[base + 2 * d + j];
      to[base + 2 * d + 2 * j + 1] = from[base + 3 * d + j];
    }
  }
}

/**
 * One figure summed across the blocks in block order: values[at], then values[stride + at], …
 * (each block holds its own copy of the figure, `stride` apart). Every total over rows is made
 * this way: one fixed summation order.
 */
export function acrossBlocks(values: Float64Array, blocks: number, stride: number, at: number): number {
  let total = values[at];
  for (let b = 1; b < blocks; b++) total += values[b * stride + at];
  return total;
}

/** Run `step` on every block of rows in block order: rows [lo, hi) of block b. */
export function forEachBlock(mem: KmeansMemory, step: (lo: number, hi: number, b: number) => void): void {
  const { starts, blocks } = mem.layout;
  for (let b = 0; b < blocks; b++) step(starts[b], starts[b + 1], b);
}

/** The rows of block b: [start, end). */
export function blockRange(layout: KmeansLayout, b: number): [number, number] {
  return [layout.starts[b], layout.starts[b + 1]];
}

/** The block that holds row i. */
export function blockOf(layout: KmeansLayout, i: number): number {
  let b = 0;
  while (i >= layout.starts[b + 1]) b++;
  return b;
}

/** Views of every array over `buffer` (rows may live elsewhere: the caller's own, for plain memory). */
export function memoryViews(
  layout: KmeansLayout,
  buffer: ArrayBufferLike,
  extra: {
    wasm?: WebAssembly.Memory;
    sweep?: TrialTotals;
    take?: TakeKernel;
    segmentSums?: SegmentSums;
    pairScan?: PairScan;
    boundPass?: BoundPass;
    rows?: Float64Array;
  } = {},
): KmeansMemory {
  const { at, length } = layout;
  const f64 = (f: Float64Field) => new Float64Array(buffer, at[f], length[f]);
  const i32 = (f: Int32Field) => new Int32Array(buffer, at[f], length[f]);
  return {
    layout, wasm: extra.wasm, sweep: extra.sweep, take: extra.take, segmentSums: extra.segmentSums, pairScan: extra.pairScan, boundPass: extra.boundPass,
    rows: extra.rows ?? f64('rows'), closest: f64('closest'), nearest: i32('nearest'), secondLower: f64('secondLower'),
    cumulative: f64('cumulative'), listed: i32('listed'), stored: f64('stored'), candidates: f64('candidates'),
    candidatesPaired: f64('candidatesPaired'), totals: f64('totals'), assignment: i32('assignment'),
    upper: f64('upper'), lower: f64('lower'), sums: f64('sums'), counts: f64('counts'),
    centres: f64('centres').subarray(0, layout.k * layout.d), paddedCentres: f64('centres'), centresPaired: f64('centresPaired'), scan: f64('scan'), previous: f64('previous'), moved: f64('moved'), halfGap: f64('halfGap'),
    parts: f64('parts'), blockValue: f64('blockValue'), grand: f64('grand'), params: f64('params'),
  }; // prettier-ignore
}

/** Views of a WebAssembly memory, with the kernels instantiated over it. */
function attachWasmMemory(layout: KmeansLayout, wasm: WebAssembly.Memory): KmeansMemory {
  return memoryViews(layout, wasm.buffer, {
    wasm,
    sweep: kernel<TrialTotals>('trial-totals', wasm, 'trialTotals'),
    take: kernel<TakeKernel>('take', wasm, 'take'),
    segmentSums: kernel<SegmentSums>('segment-sums', wasm, 'segmentSums'),
    pairScan: kernel<PairScan>('pair-scan', wasm, 'pairScan'),
    boundPass: kernel<BoundPass>('bound-pass', wasm, 'boundPass'),
  });
}

function kernel<T>(name: KernelName, wasm: WebAssembly.Memory, exported: string): T {
  return new WebAssembly.Instance(kernelModule(name)!, { env: { memory: wasm } }).exports[exported] as T;
}

const KERNELS: KernelName[] = ['trial-totals', 'take', 'segment-sums', 'pair-scan', 'bound-pass'];

// One spare WebAssembly memory kept between calls: a notebook runs k-means again and again on
// rows of the same size, and a fresh memory pays its allocation and page faults each time. A
// taken memory is no longer spare, so a nested call gets one of its own.
let spare: WebAssembly.Memory | undefined;

/**
 * Memory for k-means on `data` (n × d, k segments). 'wasm' asks for a WebAssembly memory where
 * the platform has it (the rows are then copied in; even for small inputs the kernels more than
 * pay for the copy, and a memory of the same size is reused); otherwise, and for 'plain', the
 * arrays are plain and `rows` is `data` itself. 'finish' is plain with only what the exact
 * finish of a run needs (assignment, centres, per-segment totals).
 */
export function takeKmeansMemory(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  kind: 'wasm' | 'plain' | 'finish' = 'wasm',
): KmeansMemory {
  if (kind === 'wasm') {
    const inWasm = wasmMemory(kmeansLayout(n, d, k));
    if (inWasm) {
      inWasm.rows.set(data.subarray(0, n * d));
      inWasm.paddedCentres.fill(Infinity, k * d);
      return inWasm;
    }
  }
  const layout = kmeansLayout(n, d, k, { rowsInside: false, lloyd: kind !== 'finish' });
  const plain = memoryViews(layout, new ArrayBuffer(layout.bytes), { rows: data });
  plain.paddedCentres.fill(Infinity, k * d);
  return plain;
}

function wasmMemory(layout: KmeansLayout): KmeansMemory | undefined {
  if (typeof WebAssembly !== 'object' || KERNELS.some((name) => !kernelModule(name))) return undefined;
  const pages = Math.ceil(layout.bytes / 65536);
  if (pages > 32768) return undefined; // over 2 GiB: plain arrays
  try {
    let wasm: WebAssembly.Memory;
    if (spare !== undefined && spare.buffer.byteLength === pages * 65536) {
      wasm = spare;
      spare = undefined;
    } else {
      wasm = new WebAssembly.Memory({ initial: pages, maximum: pages });
    }
    return attachWasmMemory(layout, wasm);
  } catch {
    return undefined;
  }
}

/** Done with a memory: a WebAssembly one is kept for the next call of the same size. */
export function releaseKmeansMemory(memory: KmeansMemory): void {
  if (memory.wasm) spare = memory.wasm;
}
