// Deno's built-in Jupyter kernel. Deno.jupyter.display sends display_data (and, with
// `update`, update_display_data for the same display_id) and returns a promise; we do not make
// callers await it, so a failed send is reported once on stderr instead of as an unhandled
// rejection. Deno sends these messages when its event loop next turns: progress of a
// synchronous computation therefore arrives when the cell ends, and the entry then shows the
// final state, as in tslab.
import type { NotebookKernel } from './kernel';

export interface DenoJupyter {
  display(obj: unknown, options?: { raw?: boolean; update?: boolean; display_id?: string }): Promise<void>;
}

export function denoJupyter(): DenoJupyter | undefined {
  const deno = (globalThis as { Deno?: { jupyter?: DenoJupyter } }).Deno;
  const j = deno?.jupyter;
  return j && typeof j.display === 'function' ? j : undefined;
}

let warned = false;
function settle(p: Promise<void>): void {
  p.catch((e: unknown) => {
    if (warned) return;
    warned = true;
    console.error(`kinsort: the Deno kernel did not take a display (${e instanceof Error ? e.message : String(e)}).`);
  });
}

let entries = 0;

export function denoKernel(): NotebookKernel | undefined {
  const j = denoJupyter();
  if (!j) return undefined;
  return {
    name: 'deno',
    html: (s) => settle(j.display({ 'text/html': s }, { raw: true })),
    entry: () => {
      const id = `kinsort-${Date.now().toString(36)}-${++entries}`;
      let shown = false;
      return {
        html: (s) => {
          settle(j.display({ 'text/html': s }, { raw: true, display_id: id, update: shown }));
          shown = true;
        },
      };
    },
  };
}
