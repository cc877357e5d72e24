// One worker thread kept between calls: starting a thread costs more than many small jobs, so a
// module asks its pool for the same worker each time. The thread does not keep the process alive,
// and a worker that errors or exits is dropped so the next call starts a fresh one. Where threads
// cannot be had at all, `get()` answers undefined for good and the caller works alone.
import type { Worker } from 'worker_threads';

export interface WorkerPool {
  get(): Worker | undefined;
}

export function workerPool(start: (threads: typeof import('worker_threads')) => Worker): WorkerPool {
  let pooled: Worker | undefined;
  let failed = false;
  return {
    get() {
      if (pooled || failed) return pooled;
      try {
        const worker = start(require('worker_threads') as typeof import('worker_threads'));
        worker.unref();
        const drop = () => {
          if (pooled === worker) pooled = undefined;
        };
        worker.on('error', drop);
        worker.on('exit', drop);
        pooled = worker;
      } catch {
        failed = true;
      }
      return pooled;
    },
  };
}

/**
 * For a pooled worker, to call after a job: a full garbage collection of the worker's own
 * (small) heap. The worker receives a new shared memory with large jobs; a memory is freed only
 * when every thread that saw it has dropped it, and a worker that allocates almost nothing would
 * otherwise keep each one (hundreds of MB per call) for good. Where the engine does not allow
 * it, the returned function does nothing.
 */
export function sharedMemoryReleaser(): () => void {
  try {
    require('v8').setFlagsFromString('--expose-gc');

    const gc = require('vm').runInNewContext('gc');
    return typeof gc === 'function' ? () => gc() : () => undefined;
  } catch {
    return () => undefined;
  }
}

/** The same, as source for a worker started from a string. */
export const releaseSharedSource = `const releaseShared = (${sharedMemoryReleaser.toString()})();`;
