// Worker thread for k-means (see kmeans-team.ts). It stays alive between calls; for each call it
// attaches to the shared memory and runs the blocks it can claim of every phase until told to stop.
import { parentPort } from 'node:worker_threads';
import { sharedMemoryReleaser } from '../../core/worker-pool';
import { runBlock } from './kmeans-blocks';
import { attachSharedMemory } from './kmeans-memory';
import { ARG0, ARG1, awaitGeneration, claimBlock, DONE, PHASE, STOP, WORKER_BLOCKS, WORKER_FAILED, type TeamJob } from './kmeans-team';

function serve(job: TeamJob): void {
  const { control, layout } = job;
  const mem = attachSharedMemory(layout, job.memory);
  let seen = 0;
  for (;;) {
    const generation = awaitGeneration(control, seen);
    seen = generation;
    const phase = Atomics.load(control, PHASE);
    if (phase === STOP) return;
    const arg0 = Atomics.load(control, ARG0);
    const arg1 = Atomics.load(control, ARG1);
    for (;;) {
      const b = claimBlock(control, generation, layout.blocks);
      if (b < 0) break;
      try {
        runBlock(mem, phase, b, arg0, arg1);
      } catch {
        Atomics.store(control, WORKER_FAILED, 1);
        Atomics.notify(control, DONE);
        return;
      }
      Atomics.add(control, WORKER_BLOCKS, 1);
      Atomics.add(control, DONE, 1);
      Atomics.notify(control, DONE);
    }
  }
}

// Each call's memory is dropped here after the call (a new size brings a new memory).
const releaseShared = sharedMemoryReleaser();
parentPort?.on('message', (job: TeamJob) => {
  serve(job);
  releaseShared();
});
