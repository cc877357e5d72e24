// One k-means call from start to finish on one memory and one team: the spread of the rows,
// every restart in turn (restart r depends only on r: its own random stream createRandom(seed).fork(r)),
// the lowest within-SS kept (ties: the lower r), then the exact finish and the figures. Each
// restart's sweeps are shared between the threads of the team block by block, so the result is
// the same on one thread or two.
import { createRandom, type Seed } from '../../random';
import { runHamerly, type LloydRun } from './hamerly';
import { releaseKmeansMemory, takeKmeansMemory, type KmeansMemory } from './kmeans-memory';
import { kmeansTeam, type KmeansTeam } from './kmeans-team';
import { centresToMeans, grandSpread, partitionFigures, settleExactly, withinOn, type PartitionFigures } from './partition-summary';
import { seedPlusPlusOn, seedRandomRows } from './seeding';

export { setKmeansThreads } from './kmeans-team';
export { setSeedingWasm } from './seeding';

export interface RestartPlan {
  data: Float64Array;
  n: number;
  d: number;
  k: number;
  /** 'k-means++', 'random', or given centres (k × d, row-major). */
  start: 'k-means++' | 'random' | Float64Array;
  seed: Seed;
  restarts: number;
  maxIterations: number;
  /** Tolerance on the summed squared centre movement, relative to the mean column variance. */
  relativeTolerance: number;
  trace: boolean;
}

export interface KmeansRun {
  restart: number;
  assignment: Int32Array;
  centres: Float64Array;
  /** Centre updates of the kept restart, including those of the exact finish. */
  iterations: number;
  converged: boolean;
  withinByRestart: number[];
  figures: PartitionFigures;
  trace?: number[];
  /** Blocks of rows run by the worker thread (0 when none was used). */
  byWorker: number;
}

export function runKmeans(plan: RestartPlan, onDone: (done: number) => void): KmeansRun {
  const mem = takeKmeansMemory(plan.data, plan.n, plan.d, plan.k);
  const team = kmeansTeam(mem);
  let run: Omit<KmeansRun, 'byWorker'>;
  let byWorker: number;
  try {
    run = runOn(team, mem, plan, onDone);
  } finally {
    byWorker = team.close();
    releaseKmeansMemory(mem);
  }
  return { ...run, byWorker };
}

function runOn(team: KmeansTeam, mem: KmeansMemory, plan: RestartPlan, onDone: (done: number) => void): Omit<KmeansRun, 'byWorker'> {
  const { n, d, k, start, restarts, maxIterations } = plan;
  // The total sum of squares scales the tolerance (total / (n·d) is the mean of the column
  // variances) and is reported with the figures.
  const spread = grandSpread(team, mem);
  const tolerance = plan.relativeTolerance * (spread.totalSS / (n * d));
  const root = createRandom(plan.seed);
  const withinByRestart: number[] = [];
  let kept: (LloydRun & { restart: number; within: number; assignment: Int32Array; centres: Float64Array }) | undefined;
  for (let r = 0; r < restarts; r++) {
    if (start instanceof Float64Array) mem.centres.set(start);
    else if (start === 'random') seedRandomRows(mem.rows, n, d, k, root.fork(r), mem.centres);
    else seedPlusPlusOn(team, mem, root.fork(r));
    const run = runHamerly(team, mem, maxIterations, tolerance, plan.trace, start === 'k-means++');
    // Exact finish: centres to the means of their rows (sums from scratch), within-SS from them.
    centresToMeans(team, mem);
    const within = withinOn(team, mem);
    withinByRestart.push(within);
    if (kept === undefined || within < kept.within) {
      kept = { ...run, restart: r, within, assignment: mem.assignment.slice(), centres: mem.centres.slice() };
    }
    onDone(r + 1);
  }
  const best = kept!;
  // One full exact scan of the kept restart (the iterations skipped rows by their bounds).
  mem.assignment.set(best.assignment);
  mem.centres.set(best.centres);
  const extra = settleExactly(team, mem, Math.max(1, maxIterations - best.iterations));
  const figures = partitionFigures(team, mem, spread);
  if (extra > 0) withinByRestart[best.restart] = figures.withinSS;
  return {
    restart: best.restart,
    assignment: mem.assignment.slice(),
    centres: mem.centres.slice(),
    iterations: best.iterations + extra,
    converged: best.converged,
    withinByRestart,
    figures,
    trace: best.trace,
  };
}
