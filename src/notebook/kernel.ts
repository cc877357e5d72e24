// Which notebook kernel runs this code, behind one small interface: show HTML once, or open an
// entry that later calls redraw in place. Two kernels are known:
// - tslab sets globalThis.__tslab__ before running a cell and hooks require('tslab') to its own
//   running instance, so we ask that hook first (a second copy loaded by plain require would not
//   be connected to the kernel);
// - Deno's built-in kernel (`deno jupyter`) exposes Deno.jupyter.display.
import { denoJupyter, denoKernel } from './deno-kernel';

/** One display entry that can be redrawn in place (progress). */
export interface KernelEntry {
  html(s: string): void;
}

export interface NotebookKernel {
  readonly name: 'tslab' | 'deno';
  /** Show HTML as a new output of the running cell (Deno: settled once the kernel took it). */
  html(s: string): void | Promise<void>;
  /** A new output that each html() call replaces. */
  entry(): KernelEntry;
  /** Deno: settles when every display sent so far was taken (see deno-kernel.ts). */
  settled?(): Promise<void>;
}

interface TslabModule {
  display: { html(s: string): void };
  newDisplay(): { html(s: string): void };
}

interface TslabGlobal {
  require?: (id: string) => unknown;
}

const tslabGlobal = (): TslabGlobal | undefined => {
  const g = (globalThis as { __tslab__?: TslabGlobal }).__tslab__;
  return typeof g === 'object' && g !== null ? g : undefined;
};

export function insideNotebookKernel(): boolean {
  return tslabGlobal() !== undefined || denoJupyter() !== undefined;
}

let cachedTslab: TslabModule | undefined;

function tslabModule(g: TslabGlobal): TslabModule {
  if (cachedTslab) return cachedTslab;
  try {
    if (typeof g.require === 'function') cachedTslab = g.require('tslab') as TslabModule;
  } catch {
    /* fall through to our own require */
  }
  // tslab is an optional peer: present whenever its kernel is the one running this code.

  cachedTslab ??= require('tslab') as TslabModule;
  return cachedTslab;
}

/** The running notebook kernel, or undefined outside any. */
export function currentKernel(): NotebookKernel | undefined {
  const g = tslabGlobal();
  if (g) {
    const tslab = tslabModule(g);
    return {
      name: 'tslab',
      html: (s) => tslab.display.html(s),
      entry: () => {
        const d = tslab.newDisplay();
        return { html: (s) => d.html(s) };
      },
    };
  }
  return denoKernel();
}
