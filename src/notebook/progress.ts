// Progress that overwrites itself. In a notebook kernel: one display entry updated in place
// (update_display_data in tslab and Deno), so a saved notebook keeps one final line. Outside: one
// stderr line rewritten with \r when stderr is a terminal; silent otherwise, so logs and pipes
// stay clean.
import type { ProgressCallback, ProgressEvent } from '../core/progress';
import { currentKernel } from './kernel';

const esc = (s: string): string =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function fraction(e: ProgressEvent): number {
  return e.total > 0 ? Math.min(1, Math.max(0, e.done / e.total)) : 0;
}

/**
 * "title · task · detail" without saying anything twice: callers often title the display with
 * the task's own name ("k-means restarts · k-means restarts · k = 5" before).
 */
function label(title: string | undefined, e: ProgressEvent): { title?: string; rest: string[] } {
  const same = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();
  const t = title && title.trim() ? title : undefined;
  const rest = [e.task, e.detail ?? ''].filter((x, i, all) => x.trim() && !(t && same(x, t)) && all.findIndex((y) => same(y, x)) === i);
  return { title: t, rest };
}

function line(title: string | undefined, e: ProgressEvent): string {
  const pct = Math.round(fraction(e) * 100);
  const width = 24;
  const filled = Math.round(fraction(e) * width);
  const bar = '█'.repeat(filled) + '░'.repeat(width - filled);
  const l = label(title, e);
  return `${[l.title, ...l.rest].filter(Boolean).join(' · ')} ${bar} ${e.done}/${e.total} (${pct}%)`;
}

/** The HTML of one progress state (all text escaped). */
export function progressHtml(title: string | undefined, e: ProgressEvent): string {
  const pct = (fraction(e) * 100).toFixed(0);
  const done = e.done >= e.total;
  const l = label(title, e);
  const words = [l.title ? `<b>${esc(l.title)}</b>` : '', ...l.rest.map(esc)].filter(Boolean).join(' · ');
  return (
    `<div class="kinsort-progress" style="font:13px system-ui,sans-serif;color:#22262b;max-width:560px;margin:4px 0">` +
    `<div style="display:flex;justify-content:space-between;gap:12px"><span>${words}</span><span>${e.done} of ${e.total}${done ? ' · done' : ''}</span></div>` +
    `<div style="height:8px;background:#e3e6ea;border-radius:4px;margin-top:4px;overflow:hidden">` +
    `<div style="height:8px;width:${pct}%;background:${done ? '#1a8066' : '#1a6699'}"></div></div></div>`
  );
}

export interface ProgressDisplayOptions {
  /** Minimum milliseconds between redraws (default 120); the last step is always drawn. */
  every?: number;
  /** Where to write outside the kernel (default process.stderr). Typed by shape, so the shipped
   * types need no @types/node. */
  stream?: { isTTY?: boolean; write(s: string): unknown };
}

/** A ProgressCallback that draws itself in place. */
export function progressDisplay(title?: string, options: ProgressDisplayOptions = {}): ProgressCallback {
  const every = options.every ?? 120;
  const kernel = currentKernel();
  const entry = kernel ? kernel.entry() : undefined;
  const stream = options.stream ?? process.stderr;
  let last = -Infinity;
  let lastLength = 0;
  return (e: ProgressEvent) => {
    const now = Date.now();
    const final = e.done >= e.total;
    if (!final && now - last < every) return;
    last = now;
    if (entry) {
      entry.html(progressHtml(title, e));
      return;
    }
    if (!stream.isTTY) return;
    const text = line(title, e);
    stream.write('\r' + text + ' '.repeat(Math.max(0, lastLength - text.length)) + (final ? '\n' : ''));
    lastLength = final ? 0 : text.length;
  };
}
