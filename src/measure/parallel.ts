// The euclidean pair loop, on the calling thread or shared with one worker thread,
// synchronously: the output and a chunk counter live in shared memory, both threads claim row
// chunks until none are left, and the calling thread waits on the counter. If the worker is slow
// to start (or never starts) the calling thread simply claims every chunk itself, so the result
// never depends on the worker. The loop runs as WebAssembly (wasmPairs.ts) where available and
// as plain JavaScript (euclideanKernel.ts) otherwise; both give the same numbers.
import { releaseSharedSource, workerPool } from '../core/worker-pool';
import { finish, pairSum, squaredDifferencesRows } from './euclideanKernel';
import {
  fillPairsInputs,
  instantiatePairs,
  pairsLayout,
  pairsModule,
  pairsRowsWasm,
  type PairsFunction,
  type PairsLayout,
} from './wasmPairs';

/** Below this many rows a worker's hand-over costs more than it saves. */
const MIN_ROWS_FOR_WORKER = 3000;
/**
 * Below this many rows the JavaScript loop is used: the time saved is small, and each
 * WebAssembly memory reserves address space while its result lives.
 */
const MIN_ROWS_FOR_WASM = 1000;
const CHUNKS = 48;

let threadsWanted = defaultThreads();

function defaultThreads(): number {
  try {
    const os = require('os');
    const count = typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length;
    return Math.min(2, Math.max(1, count));
  } catch {
    return 1;
  }
}

/**
 * Threads used by the euclidean dissimilarity for large inputs: 1 (calling thread only) or 2
 * (default where the machine has two or more cores). Returns the previous setting. Results are
 * identical either way; each pair is computed the same way by whichever thread claims it.
 */
export function setDissimilarityThreads(count: 1 | 2): number {
  const previous = threadsWanted;
  threadsWanted = count === 2 ? 2 : 1;
  return previous;
}

let wasmWanted = true;

/** @internal Use the WebAssembly loop (default) or the JavaScript one (tests compare them). Returns the previous setting. */
export function setDissimilarityWasm(use: boolean): boolean {
  const previous = wasmWanted;
  wasmWanted = use;
  return previous;
}

let lastShare = { chunks: 0, byWorker: 0, wasm: false };

/** How the last euclidean run was split, and whether it ran as WebAssembly (for benchmarks and diagnostics). */
export function lastDissimilarityShare(): { chunks: number; byWorker: number; wasm: boolean } {
  return { ...lastShare };
}

/** Called as parts of the work finish: `done` of `total` parts (parts hold about equal numbers of pairs). */
export type PartsDone = (done: number, total: number) => void;

/**
 * Euclidean (root) or squared euclidean distances of all pairs of rows, condensed. With `onParts`
 * the rows are taken in parts even on one thread, so progress can be told; each pair is computed
 * the same way whichever part or thread holds it, so the result is the same to the bit.
 */
export function euclideanCondensed(data: Float64Array, n: number, d: number, root: boolean, onParts?: PartsDone): Float64Array {
  const pairs = (n * (n - 1)) / 2;
  const shareWork = threadsWanted > 1 && n >= MIN_ROWS_FOR_WORKER && typeof SharedArrayBuffer === 'function';
  const module = wasmWanted && n >= MIN_ROWS_FOR_WASM ? pairsModule(shareWork) : undefined;
  const layout = module ? pairsLayout(n, d) : undefined;
  if (module && layout) {
    // A memory this large may be refused (address space, limits): then the JavaScript loop runs.
    const made = tryInstantiate(module, layout, shareWork);
    if (made) return wasmCondensed(made.memory, made.pairs, module, layout, data, n, d, root, shareWork, onParts);
  }
  if (!shareWork) {
    const out = new Float64Array(pairs);
    runChunks(n, undefined, (from, to) => squaredDifferencesRows(data, n, d, out, root, from, to), onParts);
    return out;
  }
  const out = new Float64Array(new SharedArrayBuffer(pairs * 8));
  const shared = new Float64Array(new SharedArrayBuffer(data.length * 8));
  shared.set(data);
  const job: ScriptJob = { kind: 'script', data: shared, out, n, d, root };
  runChunks(n, job, (from, to) => squaredDifferencesRows(shared, n, d, out, root, from, to), onParts);
  lastShare.wasm = false;
  return out;
}

function tryInstantiate(module: WebAssembly.Module, layout: PairsLayout, shared: boolean): ReturnType<typeof instantiatePairs> | undefined {
  try {
    return instantiatePairs(module, layout, shared);
  } catch {
    return undefined;
  }
}

function wasmCondensed(
  memory: WebAssembly.Memory,
  measure: PairsFunction,
  module: WebAssembly.Module,
  layout: PairsLayout,
  data: Float64Array,
  n: number,
  d: number,
  root: boolean,
  shareWork: boolean,
  onParts: PartsDone | undefined,
): Float64Array {
  // One memory holds the output (first, so the result is a view from offset 0) and the rows;
  // it is shared only when a worker may write into it.
  const pairs = (n * (n - 1)) / 2;
  const view = new Float64Array(memory.buffer);
  fillPairsInputs(view, data, n, d, layout);
  const job: WasmJob = { kind: 'wasm', module, memory, n, d, root, dataAt: layout.dataAt, pairedAt: layout.pairedAt };
  runChunks(
    n,
    shareWork ? job : undefined,
    (from, to) => pairsRowsWasm(measure, view, n, d, root, layout.dataAt, layout.pairedAt, from, to),
    onParts,
  );
  lastShare.wasm = true;
  const out = new Float64Array(memory.buffer, 0, pairs);
  // Many columns and few rows: the copies of the rows would outweigh the result; keep only the result.
  return layout.bytes - pairs * 8 > pairs + 65536 ? out.slice() : out;
}

interface WasmJob {
  kind: 'wasm';
  module: WebAssembly.Module;
  memory: WebAssembly.Memory;
  n: number;
  d: number;
  root: boolean;
  dataAt: number;
  pairedAt: number;
}

interface ScriptJob {
  kind: 'script';
  data: Float64Array;
  out: Float64Array;
  n: number;
  d: number;
  root: boolean;
}

/** Rows in chunks of about equal pair counts, claimed by this thread and (when given a job) the worker. */
function runChunks(n: number, job: WasmJob | ScriptJob | undefined, rows: (from: number, to: number) => void, onParts?: PartsDone): void {
  const thread = job ? pool.get() : undefined;
  if (!job || !thread) {
    if (onParts === undefined) rows(0, n);
    else {
      // One thread, in parts only so that progress can be told.
      const bounds = chunkBounds(n);
      for (let c = 0; c + 1 < bounds.length; c++) {
        rows(bounds[c], bounds[c + 1]);
        onParts(c + 1, bounds.length - 1);
      }
    }
    lastShare = { chunks: 0, byWorker: 0, wasm: false };
    return;
  }
  const bounds = chunkBounds(n);
  const chunks = bounds.length - 1;
  // control[0]: next chunk to claim; control[1]: chunks finished; control[2]: chunks the worker did.
  const control = new Int32Array(new SharedArrayBuffer(12));
  let told = 0; // parts finished that onParts has been told of
  try {
    thread.postMessage({ ...job, bounds, control });
  } catch {
    // The worker cannot take this job: the loop below claims every chunk.
  }
  for (;;) {
    const c = Atomics.add(control, 0, 1);
    if (c >= chunks) break;
    rows(bounds[c], bounds[c + 1]);
    const finished = Math.min(Atomics.add(control, 1, 1) + 1, chunks);
    if (onParts && finished > told) onParts((told = finished), chunks);
  }
  // Wait for the chunk the worker may still be on.
  for (;;) {
    const done = Atomics.load(control, 1);
    if (done >= chunks) break;
    Atomics.wait(control, 1, done, 50);
  }
  if (onParts && told < chunks) onParts(chunks, chunks);
  lastShare = { chunks, byWorker: Atomics.load(control, 2), wasm: false };
}

/** Even row boundaries splitting the pairs into roughly equal chunks (row i has n − i − 1 pairs). */
function chunkBounds(n: number): Int32Array {
  const total = (n * (n - 1)) / 2;
  const bounds = [0];
  let pairs = 0;
  let next = total / CHUNKS;
  for (let i = 0; i < n; i += 2) {
    pairs += n - i - 1 + (n - i - 2);
    if (pairs >= next && i + 2 < n) {
      bounds.push(i + 2);
      next = (total * bounds.length) / CHUNKS;
    }
  }
  bounds.push(n);
  return Int32Array.from(bounds);
}

// One worker, started on first use and kept for later calls (a notebook computes many matrices),
// so its start-up is paid once. It is unref'd: it never keeps the process alive. If it fails,
// the calling thread simply does every chunk.
const pool = workerPool(({ Worker }) => new Worker(WORKER_SOURCE, { eval: true }));

// The worker runs the same loop sources (compiled JS under dist/, transformed TS under vitest),
// so both threads compute every pair identically.
const WORKER_SOURCE = `
'use strict';
const { parentPort } = require('worker_threads');
${releaseSharedSource}
${pairSum.toString()}
${finish.toString()}
${squaredDifferencesRows.toString()}
${pairsRowsWasm.toString()}
parentPort.on('message', (job) => {
  const { n, d, root, bounds, control } = job;
  let rows;
  if (job.kind === 'wasm') {
    const instance = new WebAssembly.Instance(job.module, { env: { memory: job.memory } });
    const view = new Float64Array(job.memory.buffer);
    rows = (from, to) => ${pairsRowsWasm.name}(instance.exports.pairs, view, n, d, root, job.dataAt, job.pairedAt, from, to);
  } else {
    rows = (from, to) => ${squaredDifferencesRows.name}(job.data, n, d, job.out, root, from, to);
  }
  const chunks = bounds.length - 1;
  for (;;) {
    const c = Atomics.add(control, 0, 1);
    if (c >= chunks) break;
    rows(bounds[c], bounds[c + 1]);
    Atomics.add(control, 2, 1);
    Atomics.add(control, 1, 1);
    Atomics.notify(control, 1);
  }
  releaseShared();
});
`;
