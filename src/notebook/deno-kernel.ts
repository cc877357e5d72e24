// Deno's built-in Jupyter kernel. Deno.jupyter.display sends display_data (and, with `update`,
// update_display_data for the same display_id) and returns a promise. Deno only sends while its
// event loop turns, and a cell with nothing left to await ends at once: a display not yet sent
// then arrives after the cell is over and a headless run (nbconvert) drops it. So every send is
// kept until it settles, and `settled()` gives one promise for all of them: a view left as a
// cell's value waits for it before it is drawn, and `await view.show()` waits for it too.
// Progress of a synchronous computation therefore arrives when the cell ends, showing its final
// state.
import type { NotebookKernel } from './kernel';

export interface DenoJupyter {
  display(obj: unknown, options?: { raw?: boolean; update?: boolean; display_id?: string }): Promise<void>;
}

export function denoJupyter(): DenoJupyter | undefined {
  const deno = (globalThis as { Deno?: { jupyter?: DenoJupyter } }).Deno;
  const j = deno?.jupyter;
  return j && typeof j.display === 'function' ? j : undefined;
}

const pending = new Set<Promise<void>>();
let warned = false;

/** Keep `p` until it settles; a failed send is reported once on stderr, never thrown. */
function track(p: Promise<void>): Promise<void> {
  const kept = p.catch((e: unknown) => {
    if (warned) return;
    warned = true;
    console.error(`kinsort: the Deno kernel did not take a display (${e instanceof Error ? e.message : String(e)}).`);
  });
  pending.add(kept);
  void kept.then(() => pending.delete(kept));
  return kept;
}

/** Settles when every display sent so far (and any sent meanwhile) has been taken by the kernel. */
async function settled(): Promise<void> {
  while (pending.size > 0) await Promise.all([...pending]);
}

let entries = 0;

export function denoKernel(): NotebookKernel | undefined {
  const j = denoJupyter();
  if (!j) return undefined;
  return {
    name: 'deno',
    html: (s) => track(j.display({ 'text/html': s }, { raw: true })),
    settled,
    entry: () => {
      const id = `kinsort-${Date.now().toString(36)}-${++entries}`;
      let shown = false;
      // While one state is on its way, later ones wait and only the newest is sent. During
      // synchronous work nothing is sent anyway, and a burst of queued updates at the end of a
      // cell is what makes Deno drop messages (the plotting bundle among them).
      let sending = false;
      let next: string | undefined;
      const send = (s: string): void => {
        sending = true;
        const update = shown;
        shown = true;
        void track(j.display({ 'text/html': s }, { raw: true, display_id: id, update })).then(() => {
          sending = false;
          if (next !== undefined) {
            const newest = next;
            next = undefined;
            send(newest);
          }
        });
      };
      return {
        html: (s) => {
          if (sending) next = s;
          else send(s);
        },
      };
    },
  };
}
