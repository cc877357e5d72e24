// One k-means restart, and running many of them: on the calling thread alone, or shared with one
// worker thread. Restart r depends only on r (its own random stream createRandom(seed).fork(r)),
// and the kept restart is the lowest within-SS with ties going to the lower r, so the result is
// the same whichever thread ran which restart.
import { workerPool, type WorkerPool } from '../../core/worker-pool';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { createRandom, type Random, type Seed } from '../../random';
import { giveBackWorkspace, runHamerly, takeWorkspace, withinFor, type LloydWorkspace } from './hamerly';
import { centresToMeans } from './partition-summary';
import { createSeedingState, defaultTrials, seedPlusPlus, seedRandomRows, type SeedingState } from './seeding';
import { createSeedingArena, releaseSeedingArena } from './seedingWasm';

export interface RestartPlan {
  data: Float64Array;
  n: number;
  d: number;
  k: number;
  /** 'k-means++', 'random', or given centres (k × d, row-major). */
  start: 'k-means++' | 'random' | Float64Array;
  seed: Seed;
  maxIterations: number;
  /** Absolute tolerance on the summed squared centre movement. */
  tolerance: number;
  trace: boolean;
}

export interface RestartOutcome {
  within: number;
  iterations: number;
  converged: boolean;
  trace?: number[];
}

/** Runs restarts one after another, reusing its arrays; after run(r) the assignment and centres are in `ws` / `centers`. */
export class RestartRunner {
  readonly ws: LloydWorkspace;
  readonly centers: Float64Array;
  private readonly seeding: SeedingState;
  private readonly root: Random;

  constructor(private readonly plan: RestartPlan) {
    this.ws = takeWorkspace(plan.n, plan.d, plan.k);
    this.centers = new Float64Array(plan.k * plan.d);
    // k-means++ sweeps run as WebAssembly where available (same numbers, about twice as fast).
    const arena = plan.start === 'k-means++' && seedingWasmWanted
      ? createSeedingArena(plan.data, plan.n, plan.d, plan.k, 4 * Math.ceil(defaultTrials(plan.k) / 4))
      : undefined; // prettier-ignore
    this.seeding = createSeedingState(plan.n, arena);
    this.root = createRandom(plan.seed);
  }

  /** Done with all restarts: the seeding memory and the workspace go back for reuse by the next call. */
  release(): void {
    releaseSeedingArena(this.seeding.arena);
    giveBackWorkspace(this.ws);
  }

  run(r: number): RestartOutcome {
    const { data, n, d, k, start, maxIterations, tolerance, trace } = this.plan;
    const centers = this.centers;
    let seeded: SeedingState | undefined;
    if (start instanceof Float64Array) centers.set(start);
    else if (start === 'random') seedRandomRows(data, n, d, k, this.root.fork(r), centers);
    else {
      seedPlusPlus(data, n, d, k, this.root.fork(r), centers, this.seeding);
      seeded = this.seeding;
    }
    const run = runHamerly(data, centers, this.ws, maxIterations, tolerance, trace, seeded);
    // Exact finish: centres to the means of their rows (sums from scratch), within-SS from them.
    centresToMeans(data, centers, this.ws);
    const within = withinFor(data, centers, this.ws.assignment, n, d);
    return { within, iterations: run.iterations, converged: run.converged, trace: run.trace };
  }
}

export interface KeptRestart extends RestartOutcome {
  restart: number;
  assignment: Int32Array;
  centers: Float64Array;
}

export interface RestartsResult {
  kept: KeptRestart;
  withinByRestart: number[];
  /** Restarts run by the worker thread (0 when none was used). */
  byWorker: number;
}

let threadsWanted = 2;
let seedingWasmWanted = true;

/** @internal Run the k-means++ sweep as WebAssembly (default) or JavaScript (tests compare them). Returns the previous setting. */
export function setSeedingWasm(use: boolean): boolean {
  const previous = seedingWasmWanted;
  seedingWasmWanted = use;
  return previous;
}

/**
 * Threads k-means may use for its restarts: 1 (calling thread only) or 2 (default; used only for
 * large inputs, from the compiled package). Returns the previous setting. Results are identical.
 */
export function setKmeansThreads(count: 1 | 2): number {
  const previous = threadsWanted;
  threadsWanted = count === 2 ? 2 : 1;
  return previous;
}

/** Below this much work per restart (rows × columns × k) a worker's start-up costs more than it saves. */
const MIN_WORK_FOR_WORKER = 2_000_000;

export function runRestarts(plan: RestartPlan, restarts: number, onDone: (done: number) => void): RestartsResult {
  const workerFile = join(__dirname, 'kmeans-worker.js');
  const useWorker =
    threadsWanted > 1 &&
    restarts > 1 &&
    !plan.trace &&
    plan.n * plan.d * plan.k >= MIN_WORK_FOR_WORKER &&
    typeof SharedArrayBuffer === 'function' &&
    existsSync(workerFile);
  return useWorker ? sharedRestarts(plan, restarts, onDone, workerFile) : localRestarts(plan, restarts, onDone);
}

function localRestarts(plan: RestartPlan, restarts: number, onDone: (done: number) => void): RestartsResult {
  const runner = new RestartRunner(plan);
  const withinByRestart: number[] = [];
  let kept: KeptRestart | undefined;
  try {
    for (let r = 0; r < restarts; r++) {
      const outcome = runner.run(r);
      withinByRestart.push(outcome.within);
      if (kept === undefined || outcome.within < kept.within) {
        kept = { ...outcome, restart: r, assignment: runner.ws.assignment.slice(), centers: runner.centers.slice() };
      }
      onDone(r + 1);
    }
  } finally {
    runner.release();
  }
  return { kept: kept!, withinByRestart, byWorker: 0 };
}

/** Shared memory laid out for the worker: see kmeans-worker.ts. */
export interface SharedRestarts {
  plan: RestartPlan;
  restarts: number;
  /** [0] next restart to claim, [1] restarts finished, [2] worker's best written (1), [3] restarts the worker claimed. */
  control: Int32Array;
  within: Float64Array;
  iterations: Float64Array;
  converged: Float64Array;
  /** The worker's best restart: r, then its assignment and centres. */
  workerBest: Float64Array;
  workerAssignment: Int32Array;
  workerCenters: Float64Array;
}

function sharedArray<T extends Float64Array | Int32Array>(make: new (b: SharedArrayBuffer) => T, length: number, bytes: number): T {
  return new make(new SharedArrayBuffer(length * bytes));
}

// The shared copy of the rows of the last call, reused by the next call of the same size (a fresh
// one pays its allocation and page faults). Taken while in use, so a nested call gets its own.
let spareRows: Float64Array | undefined;

function sharedRestarts(plan: RestartPlan, restarts: number, onDone: (done: number) => void, workerFile: string): RestartsResult {
  const reuse = spareRows !== undefined && spareRows.length === plan.data.length;
  const data = reuse ? spareRows! : sharedArray(Float64Array, plan.data.length, 8);
  spareRows = undefined;
  data.set(plan.data);
  const sharedPlan: RestartPlan = { ...plan, data };
  const shared: SharedRestarts = {
    plan: sharedPlan,
    restarts,
    control: sharedArray(Int32Array, 4, 4),
    within: sharedArray(Float64Array, restarts, 8),
    iterations: sharedArray(Float64Array, restarts, 8),
    converged: sharedArray(Float64Array, restarts, 8),
    workerBest: sharedArray(Float64Array, 1, 8),
    workerAssignment: sharedArray(Int32Array, plan.n, 4),
    workerCenters: sharedArray(Float64Array, plan.k * plan.d, 8),
  };
  const { control } = shared;
  const thread = pooledWorker(workerFile);
  if (thread) thread.postMessage(shared);
  const runner = new RestartRunner(sharedPlan);
  let kept: KeptRestart | undefined;
  for (;;) {
    const r = Atomics.add(control, 0, 1);
    if (r >= restarts) break;
    const outcome = runner.run(r);
    shared.within[r] = outcome.within;
    shared.iterations[r] = outcome.iterations;
    shared.converged[r] = outcome.converged ? 1 : 0;
    if (kept === undefined || outcome.within < kept.within || (outcome.within === kept.within && r < kept.restart)) {
      kept = { ...outcome, restart: r, assignment: runner.ws.assignment.slice(), centers: runner.centers.slice() };
    }
    onDone(Atomics.add(control, 1, 1) + 1);
  }
  runner.release();
  waitFor(control, 1, restarts);
  // Every restart is done: the worker no longer reads the rows (a late worker only finds none left).
  spareRows = data;
  const byWorker = Atomics.load(control, 3);
  if (byWorker > 0) {
    waitFor(control, 2, 1);
    const r = shared.workerBest[0];
    const within = shared.within[r];
    if (kept === undefined || within < kept.within || (within === kept.within && r < kept.restart)) {
      kept = {
        within,
        iterations: shared.iterations[r],
        converged: shared.converged[r] === 1,
        restart: r,
        assignment: shared.workerAssignment.slice(),
        centers: shared.workerCenters.slice(),
      };
    }
  }
  return { kept: kept!, withinByRestart: Array.from(shared.within), byWorker };
}

// One worker, started on first use and kept for later calls (a notebook runs k-means many times:
// k sweeps, gap references, bootstrap), so its start-up is paid once. It is unref'd: it never
// keeps the process alive. If it fails, the calling thread simply does every restart.
// The worker's file is known only at the first call (it sits beside this module in dist/).
let pool: WorkerPool | undefined;
function pooledWorker(workerFile: string): import('worker_threads').Worker | undefined {
  pool ??= workerPool(({ Worker }) => new Worker(workerFile));
  return pool.get();
}

function waitFor(control: Int32Array, slot: number, target: number): void {
  for (;;) {
    const value = Atomics.load(control, slot);
    if (value >= target) return;
    Atomics.wait(control, slot, value, 50);
  }
}
