// Progress that overwrites itself. In the kernel: one display entry updated in place (tslab's
// newDisplay sends update_display_data). Outside: one stderr line rewritten with \r when stderr
// is a terminal; silent otherwise, so logs and pipes stay clean.
import type { ProgressCallback, ProgressEvent } from '../core/progress';
import { kernelModule } from './kernel';

const esc = (s: string): string =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function fraction(e: ProgressEvent): number {
  return e.total > 0 ? Math.min(1, Math.max(0, e.done / e.total)) : 0;
}

function line(title: string | undefined, e: ProgressEvent): string {
  const pct = Math.round(fraction(e) * 100);
  const width = 24;
  const filled = Math.round(fraction(e) * width);
  const bar = '█'.repeat(filled) + '░'.repeat(width - filled);
  return `${title ? title + ' · ' : ''}${e.task} ${bar} ${e.done}/${e.total} (${pct}%)${e.detail ? ' · ' + e.detail : ''}`;
}

/** The HTML of one progress state (all text escaped). */
export function progressHtml(title: string | undefined, e: ProgressEvent): string {
  const pct = (fraction(e) * 100).toFixed(0);
  const done = e.done >= e.total;
  return (
    `<div class="kinsort-progress" style="font:13px system-ui,sans-serif;color:#22262b;max-width:560px;margin:4px 0">` +
    `<div style="display:flex;justify-content:space-between;gap:12px"><span>${title ? `<b>${esc(title)}</b> · ` : ''}${esc(e.task)}` +
    `${e.detail ? ` · ${esc(e.detail)}` : ''}</span><span>${e.done} of ${e.total}${done ? ' · done' : ''}</span></div>` +
    `<div style="height:8px;background:#e3e6ea;border-radius:4px;margin-top:4px;overflow:hidden">` +
    `<div style="height:8px;width:${pct}%;background:${done ? '#1a8066' : '#1a6699'}"></div></div></div>`
  );
}

export interface ProgressDisplayOptions {
  /** Minimum milliseconds between redraws (default 120); the last step is always drawn. */
  every?: number;
  /** Where to write outside the kernel (default process.stderr). */
  stream?: NodeJS.WriteStream | { isTTY?: boolean; write(s: string): unknown };
}

/** A ProgressCallback that draws itself in place. */
export function progressDisplay(title?: string, options: ProgressDisplayOptions = {}): ProgressCallback {
  const every = options.every ?? 120;
  const tslab = kernelModule();
  const entry = tslab ? tslab.newDisplay() : undefined;
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
