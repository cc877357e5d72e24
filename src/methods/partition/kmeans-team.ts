// Who runs the blocks of each k-means phase: the calling thread alone, or the calling thread and
// one worker thread together. Either way every block runs the same code on the same memory, so
// the result does not depend on the team (kmeans-blocks.ts).
//
// With a worker, each phase is published in a small shared control array: the phase and its
// arguments, then a new generation number. Both threads claim blocks from a counter tagged with
// the generation (so a late worker can never claim a block of a later phase), and the caller
// returns when every block is done. A worker that has not started yet simply finds no block
// left: the caller does them all. Waits spin briefly first, since phases are short.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { workerPool, type WorkerPool } from '../../core/worker-pool';
import { runBlock, type Phase } from './kmeans-blocks';
import type { KmeansLayout, KmeansMemory } from './kmeans-memory';

export interface KmeansTeam {
  readonly blocks: number;
  /** Run `phase` on every block; returns when all are done. */
  run(phase: Phase, arg0?: number, arg1?: number): void;
  /** Ends the team; returns how many blocks the worker ran (0 without one). */
  close(): number;
}

/** What the worker is sent once per k-means call. */
export interface TeamJob {
  control: Int32Array;
  memory: WebAssembly.Memory;
  layout: KmeansLayout;
}

// Slots of the control array.
export const GENERATION = 0;
export const CLAIMS = 1;
export const DONE = 2;
export const PHASE = 3;
export const ARG0 = 4;
export const ARG1 = 5;
export const WORKER_BLOCKS = 6;
export const WORKER_FAILED = 7;
/** The phase that tells the worker the call is over. */
export const STOP = -1;
const CONTROL_SLOTS = 8;
/** Claims are generation × 32 + blocks claimed so far. */
const CLAIM_SHIFT = 5;

let threadsWanted = 2;

/**
 * Threads k-means may use: 1 (calling thread only) or 2 (default; used only for large inputs,
 * from the compiled package). Returns the previous setting. Results are identical.
 */
export function setKmeansThreads(count: 1 | 2): number {
  const previous = threadsWanted;
  threadsWanted = count === 2 ? 2 : 1;
  return previous;
}

/** The calling thread runs every block in order. */
export function localTeam(mem: KmeansMemory): KmeansTeam {
  const blocks = mem.layout.blocks;
  return {
    blocks,
    run(phase, arg0 = 0, arg1 = 0) {
      for (let b = 0; b < blocks; b++) runBlock(mem, phase, b, arg0, arg1);
    },
    close: () => 0,
  };
}

/** A team for `mem`: with the worker when there are several blocks, shared memory and the compiled worker file. */
export function kmeansTeam(mem: KmeansMemory): KmeansTeam {
  if (threadsWanted < 2 || mem.layout.blocks < 2 || !mem.wasm) return localTeam(mem);
  const worker = pooledWorker();
  if (!worker) return localTeam(mem);
  const control = new Int32Array(new SharedArrayBuffer(CONTROL_SLOTS * 4));
  const job: TeamJob = { control, memory: mem.wasm, layout: mem.layout };
  worker.postMessage(job);
  const blocks = mem.layout.blocks;
  let generation = 0;
  const publish = (phase: number, arg0: number, arg1: number) => {
    generation++;
    Atomics.store(control, PHASE, phase);
    Atomics.store(control, ARG0, arg0);
    Atomics.store(control, ARG1, arg1);
    Atomics.store(control, DONE, 0);
    Atomics.store(control, CLAIMS, generation << CLAIM_SHIFT);
    Atomics.store(control, GENERATION, generation);
    Atomics.notify(control, GENERATION);
  };
  return {
    blocks,
    run(phase, arg0 = 0, arg1 = 0) {
      publish(phase, arg0, arg1);
      for (;;) {
        const b = claimBlock(control, generation, blocks);
        if (b < 0) break;
        runBlock(mem, phase, b, arg0, arg1);
        Atomics.add(control, DONE, 1);
      }
      awaitDone(control, blocks);
    },
    close() {
      publish(STOP, 0, 0);
      return Atomics.load(control, WORKER_BLOCKS);
    },
  };
}

/** The next unclaimed block of this generation, or −1 when none is left (or the phase is over). */
export function claimBlock(control: Int32Array, generation: number, blocks: number): number {
  for (;;) {
    const word = Atomics.load(control, CLAIMS);
    if (word >> CLAIM_SHIFT !== generation) return -1;
    const claimed = word & ((1 << CLAIM_SHIFT) - 1);
    if (claimed >= blocks) return -1;
    if (Atomics.compareExchange(control, CLAIMS, word, word + 1) === word) return claimed;
  }
}

// Spin this many checks (a few milliseconds) before sleeping: a sleeping thread on a virtual machine
// can take long to wake, and the gaps between phases are short.
const SPINS = 1_000_000;

function awaitDone(control: Int32Array, blocks: number): void {
  for (let spin = 0; ; spin++) {
    const done = Atomics.load(control, DONE);
    if (done >= blocks) return;
    if (Atomics.load(control, WORKER_FAILED) !== 0) {
      throw new Error('kmeans: the worker thread failed during a run; setKmeansThreads(1) works on the calling thread alone.');
    }
    if (spin > SPINS) Atomics.wait(control, DONE, done, 5);
  }
}

/** Waits until the generation differs from `seen` and returns it (worker side). */
export function awaitGeneration(control: Int32Array, seen: number): number {
  for (let spin = 0; ; spin++) {
    const generation = Atomics.load(control, GENERATION);
    if (generation !== seen) return generation;
    if (spin > SPINS) Atomics.wait(control, GENERATION, seen, 50);
  }
}

// One worker, started on first use and kept for later calls (a notebook runs k-means many times:
// k sweeps, gap references, bootstrap), so its start-up is paid once. It is unref'd: it never
// keeps the process alive. If it cannot start, the calling thread does every block. The worker's
// file sits beside this module in dist/ (from the TypeScript sources it does not exist).
let pool: WorkerPool | undefined;
function pooledWorker(): import('worker_threads').Worker | undefined {
  const workerFile = join(__dirname, 'kmeans-worker.js');
  if (!existsSync(workerFile)) return undefined;
  pool ??= workerPool(({ Worker }) => new Worker(workerFile));
  return pool.get();
}
