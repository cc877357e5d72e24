// One k-means call from start to finish on one memory: the spread of the rows, every restart in
// turn (restart r depends only on r: its own random stream createRandom(seed).fork(r)), the
// lowest within-SS kept (ties: the lower r), then the exact finish and the figures. Everything
// runs on the calling thread (a second worker thread was measured and did not pay: BENCH.md).
import { createRandom, type Seed } from '../../random';
import { centresToMeans } from './centre-update';
import { settleExactly } from './exact-finish';
import { grandSpread } from './grand-spread';
import { runHamerly, type LloydRun } from './hamerly';
import { releaseKmeansMemory, takeKmeansMemory, type KmeansMemory } from './kmeans-memory';
import { partitionFigures, type PartitionFigures } from './partition-figures';
import { seedPlusPlusOn, seedRandomRows } from './seeding';
import { withinOn } from './within-ss';

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
}

export function runKmeans(plan: RestartPlan, onDone: (done: number) => void): KmeansRun {
  const mem = takeKmeansMemory(plan.data, plan.n, plan.d, plan.k);
  try {
    return runOn(mem, plan, onDone);
  } finally {
    releaseKmeansMemory(mem);
  }
}

function runOn(mem: KmeansMemory, plan: RestartPlan, onDone: (done: number) => void): KmeansRun {
  const { n, d, k, start, restarts, maxIterations } = plan;
  // The total sum of squares scales the tolerance (total / (n·d) is the mean of the column
  // variances) and is reported with the figures.
  const spread = grandSpread(mem);
  const tolerance = plan.relativeTolerance * (spread.totalSS / (n * d));
  const root = createRandom(plan.seed);
  const withinByRestart: number[] = [];
  let kept: (LloydRun & { restart: number; within: number; assignment: Int32Array; centres: Float64Array }) | undefined;
  for (let r = 0; r < restarts; r++) {
    if (start instanceof Float64Array) mem.centres.set(start);
    else if (start === 'random') seedRandomRows(mem.rows, n, d, k, root.fork(r), mem.centres);
    else seedPlusPlusOn(mem, root.fork(r));
    const run = runHamerly(mem, maxIterations, tolerance, plan.trace, start === 'k-means++');
    // Exact finish: centres to the means of their rows (sums from scratch), within-SS from them.
    centresToMeans(mem);
    const within = withinOn(mem);
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
  const extra = settleExactly(mem, Math.max(1, maxIterations - best.iterations));
  const figures = partitionFigures(mem, spread);
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
