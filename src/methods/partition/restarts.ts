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
import { transferRows } from './transfers';
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
  /** Single-row transfers (Hartigan's rule) after Lloyd in every restart. */
  refine: boolean;
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
  /** Rows moved by single transfers in the kept restart. */
  refinedRows: number;
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
  let kept:
    (LloydRun & { restart: number; within: number; refinedRows: number; assignment: Int32Array; centres: Float64Array }) | undefined;
  for (let r = 0; r < restarts; r++) {
    if (start instanceof Float64Array) mem.centres.set(start);
    else if (start === 'random') seedRandomRows(mem.rows, n, d, k, root.fork(r), mem.centres);
    else seedPlusPlusOn(mem, root.fork(r));
    const run = runHamerly(mem, maxIterations, tolerance, plan.trace, start === 'k-means++' ? 'seeded' : 'centres');
    const refinedRows = plan.refine ? refineByTransfers(mem, run, maxIterations, tolerance, plan.trace) : 0;
    // Exact finish: centres to the means of their rows (sums from scratch), within-SS from them.
    centresToMeans(mem);
    const within = withinOn(mem);
    withinByRestart.push(within);
    if (kept === undefined || within < kept.within) {
      kept = { ...run, restart: r, within, refinedRows, assignment: mem.assignment.slice(), centres: mem.centres.slice() };
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
    refinedRows: best.refinedRows,
    figures,
    trace: best.trace,
  };
}

/** Transfer passes this many at a time; between them Lloyd's iterations carry on what the transfers began. */
const PASSES_PER_ROUND = 2;

/**
 * Single-row transfers after Lloyd (transfers.ts), alternating with Lloyd: when a pair of
 * transfer passes still moves rows, a segment is often migrating one row at a time, which
 * Lloyd's iterations finish in a few sweeps. Ends at a fixed point of the transfer rule (or when
 * the centre updates reach `maxIterations`). Returns the rows moved by transfers; `run` counts
 * the extra Lloyd updates.
 */
function refineByTransfers(mem: KmeansMemory, run: LloydRun, maxIterations: number, tolerance: number, trace: boolean): number {
  let moves = 0;
  for (;;) {
    const step = transferRows(mem, PASSES_PER_ROUND);
    moves += step.moves;
    if (step.settled || run.iterations >= maxIterations) break;
    // The transfers leave bounds valid for their centres: Lloyd goes on from them.
    const more = runHamerly(mem, maxIterations - run.iterations, tolerance, trace, 'kept');
    run.iterations += more.iterations;
    if (run.trace && more.trace) run.trace.push(...more.trace);
  }
  return moves;
}
