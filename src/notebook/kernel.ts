// Are we inside the TypeScript notebook kernel (tslab)? The kernel sets globalThis.__tslab__
// before running a cell and hooks require('tslab') to its own running instance, so we ask that
// hook first: a second copy of tslab loaded by plain require would not be connected.

export interface KernelDisplay {
  html(s: string): void;
  text(s: string): void;
}

interface TslabModule {
  display: KernelDisplay;
  newDisplay(): KernelDisplay;
}

interface TslabGlobal {
  require?: (id: string) => unknown;
}

export function insideNotebookKernel(): boolean {
  const g = (globalThis as { __tslab__?: TslabGlobal }).__tslab__;
  return typeof g === 'object' && g !== null;
}

let cached: TslabModule | undefined;

/** The running kernel's tslab module, or undefined outside the kernel. */
export function kernelModule(): TslabModule | undefined {
  if (!insideNotebookKernel()) return undefined;
  if (cached) return cached;
  const g = (globalThis as { __tslab__?: TslabGlobal }).__tslab__!;
  try {
    if (typeof g.require === 'function') cached = g.require('tslab') as TslabModule;
  } catch {
    /* fall through to our own require */
  }
  if (!cached) {
    // eslint-disable-next-line @typescript-eslint/no-var-requires
    cached = require('tslab') as TslabModule;
  }
  return cached;
}
