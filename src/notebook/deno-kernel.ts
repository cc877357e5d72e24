// Deno's built-in Jupyter kernel. Deno.jupyter.display sends display_data (and, with `update`,
// update_display_data for the same display_id) and returns a promise. That promise settles before
// the message has left: Deno 2.9 writes it out only while the cell's event loop keeps turning, and
// its kernel reports the cell finished (status idle) without waiting. A message still on its way
// then arrives after the cell is over, and a headless run (nbconvert), like a live frontend that
// has closed the cell, drops it. Measured with the kernel driven directly (2026-12-03): two small
// displays at the end of a cell arrived late in 4 of 30 cells, a value's execute_result in up to
// 6 of 15; with the loop kept turning 30 ms after the last send, none of 30 small displays did.
// So every send is kept until it settles, and `settled()` then keeps the loop turning for a grace
// that grows with the bytes sent (the 5 MB plotting bundle needs longer than a progress line).
// `await view.show()` and a view left as a cell's value both wait for it.
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
/** Bytes of HTML handed to the kernel since the last grace ran. */
let unflushedBytes = 0;

/** Milliseconds the event loop keeps turning after the last send: 40 ms, plus 40 ms per MB sent. */
export function graceAfterSending(bytes: number): number {
  return 40 + Math.ceil((40 * bytes) / 1_000_000);
}

/** Keep `p` until it settles; a failed send is reported once on stderr, never thrown. */
function track(p: Promise<void>, bytes: number): Promise<void> {
  unflushedBytes += bytes;
  const kept = p.catch((e: unknown) => {
    if (warned) return;
    warned = true;
    console.error(`kinsort: the Deno kernel did not take a display (${e instanceof Error ? e.message : String(e)}).`);
  });
  pending.add(kept);
  void kept.then(() => pending.delete(kept));
  return kept;
}

/** Settles when every display sent so far (and any sent meanwhile) has been taken by the kernel
 * and given time to leave it. */
async function settled(): Promise<void> {
  while (pending.size > 0 || unflushedBytes > 0) {
    await Promise.all([...pending]);
    const grace = graceAfterSending(unflushedBytes);
    unflushedBytes = 0;
    await new Promise<void>((resolve) => setTimeout(resolve, grace));
  }
}

let entries = 0;

export function denoKernel(): NotebookKernel | undefined {
  const j = denoJupyter();
  if (!j) return undefined;
  return {
    name: 'deno',
    html: (s) => track(j.display({ 'text/html': s }, { raw: true }), s.length),
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
        void track(j.display({ 'text/html': s }, { raw: true, display_id: id, update }), s.length).then(() => {
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
