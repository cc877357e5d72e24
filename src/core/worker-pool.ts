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
        // eslint-disable-next-line @typescript-eslint/no-var-requires
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
