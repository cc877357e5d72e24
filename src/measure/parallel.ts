// Sharing the euclidean pair loop with one worker thread, synchronously: the output and a chunk
// counter live in shared memory, both threads claim row chunks until none are left, and the
// calling thread waits on the counter. If the worker is slow to start (or never starts) the
// calling thread simply claims every chunk itself, so the result never depends on the worker.
import { finish, pairSum, squaredDifferencesRows } from './euclideanKernel';

/** Below this many rows a worker's start-up (tens of ms) costs more than it saves. */
const MIN_ROWS_FOR_WORKER = 3000;
const CHUNKS = 48;

let threadsWanted = defaultThreads();

function defaultThreads(): number {
  try {
    // eslint-disable-next-line @typescript-eslint/no-var-requires
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

/** The condensed output, in shared memory when a worker may write into it. */
export function sharedOutput(n: number, pairs: number): Float64Array {
  if (threadsWanted > 1 && n >= MIN_ROWS_FOR_WORKER && typeof SharedArrayBuffer === 'function') {
    return new Float64Array(new SharedArrayBuffer(pairs * 8));
  }
  return new Float64Array(pairs);
}

export function squaredDifferencesShared(data: Float64Array, n: number, d: number, out: Float64Array, root: boolean): void {
  const worker = out.buffer instanceof ArrayBuffer ? undefined : startWorker();
  if (!worker) {
    squaredDifferencesRows(data, n, d, out, root, 0, n);
    return;
  }
  const bounds = chunkBounds(n);
  const shared = new Float64Array(new SharedArrayBuffer(data.length * 8));
  shared.set(data);
  // control[0]: next chunk to claim; control[1]: chunks finished; control[2]: chunks the worker did.
  const control = new Int32Array(new SharedArrayBuffer(12));
  const chunks = bounds.length - 1;
  let thread;
  try {
    thread = new worker.Worker(WORKER_SOURCE, {
      eval: true,
      workerData: { data: shared, out, control, bounds, n, d, root },
    });
    thread.unref();
    thread.on('error', () => undefined); // the calling thread finishes any chunk the worker leaves
  } catch {
    thread = undefined;
  }
  for (;;) {
    const c = Atomics.add(control, 0, 1);
    if (c >= chunks) break;
    squaredDifferencesRows(shared, n, d, out, root, bounds[c], bounds[c + 1]);
    Atomics.add(control, 1, 1);
  }
  // Wait for the chunk the worker may still be on.
  for (;;) {
    const done = Atomics.load(control, 1);
    if (done >= chunks) break;
    Atomics.wait(control, 1, done, 50);
  }
  if (thread) void thread.terminate();
  lastShare = { chunks, byWorker: Atomics.load(control, 2) };
}

let lastShare = { chunks: 0, byWorker: 0 };

/** How the last shared euclidean run was split (for benchmarks and diagnostics). */
export function lastDissimilarityShare(): { chunks: number; byWorker: number } {
  return { ...lastShare };
}

/** Even row boundaries splitting the pairs into roughly equal chunks (row i has n − i − 1 pairs). */
function chunkBounds(n: number): Int32Array {
  const total = (n * (n - 1)) / 2;
  const bounds = [0];
  let pairs = 0;
  let next = total / CHUNKS;
  for (let i = 0; i < n; i += 2) {
    pairs += (n - i - 1) + (n - i - 2);
    if (pairs >= next && i + 2 < n) {
      bounds.push(i + 2);
      next = (total * bounds.length) / CHUNKS;
    }
  }
  bounds.push(n);
  return Int32Array.from(bounds);
}

type WorkerThreads = typeof import('worker_threads');

function startWorker(): WorkerThreads | undefined {
  try {
    // eslint-disable-next-line @typescript-eslint/no-var-requires
    return require('worker_threads') as WorkerThreads;
  } catch {
    return undefined;
  }
}

// The worker runs the same kernel source (compiled JS under dist/, transformed TS under vitest),
// so both threads compute every pair identically.
const WORKER_SOURCE = `
'use strict';
const { workerData } = require('worker_threads');
${pairSum.toString()}
${finish.toString()}
${squaredDifferencesRows.toString()}
const { data, out, control, bounds, n, d, root } = workerData;
const chunks = bounds.length - 1;
for (;;) {
  const c = Atomics.add(control, 0, 1);
  if (c >= chunks) break;
  ${squaredDifferencesRows.name}(data, n, d, out, root, bounds[c], bounds[c + 1]);
  Atomics.add(control, 2, 1);
  Atomics.add(control, 1, 1);
  Atomics.notify(control, 1);
}
`;
