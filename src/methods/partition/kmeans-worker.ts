// Worker thread for k-means restarts (see restarts.ts). It stays alive between calls; for each
// job it claims restarts until none are left, records each one's figures, and hands back its
// best restart's assignment and centres through shared memory.
import { parentPort } from 'node:worker_threads';
import { RestartRunner, type SharedRestarts } from './restarts';

function runJob(shared: SharedRestarts): void {
  const { control, restarts } = shared;
  let runner: RestartRunner | undefined;
  let best = -1;
  let bestWithin = Infinity;
  for (;;) {
    const r = Atomics.add(control, 0, 1);
    if (r >= restarts) break;
    Atomics.add(control, 3, 1);
    runner ??= new RestartRunner(shared.plan);
    const outcome = runner.run(r);
    shared.within[r] = outcome.within;
    shared.iterations[r] = outcome.iterations;
    shared.converged[r] = outcome.converged ? 1 : 0;
    if (outcome.within < bestWithin || (outcome.within === bestWithin && r < best)) {
      best = r;
      bestWithin = outcome.within;
      shared.workerAssignment.set(runner.ws.assignment);
      shared.workerCenters.set(runner.centers);
    }
    Atomics.add(control, 1, 1);
    Atomics.notify(control, 1);
  }
  runner?.release();
  if (best >= 0) shared.workerBest[0] = best;
  Atomics.store(control, 2, 1);
  Atomics.notify(control, 2);
}

parentPort?.on('message', runJob);
