import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { screeView, profileCardsView } from '../../src/views';
import { progressDisplay, resendPlotting, insideNotebookKernel } from '../../src/notebook';
import { allViews } from '../views/gallery';

// A stand-in for the tslab kernel: records display_data and update_display_data messages.
function fakeKernel() {
  const shown: string[] = [];
  const updates: string[][] = [];
  const tslab = {
    display: { html: (s: string) => shown.push(s), text: () => undefined },
    newDisplay: () => {
      const entry: string[] = [];
      updates.push(entry);
      return { html: (s: string) => entry.push(s), text: () => undefined };
    },
  };
  return { shown, updates, tslab };
}

describe('inside the notebook kernel', () => {
  let kernel: ReturnType<typeof fakeKernel>;
  beforeEach(() => {
    kernel = fakeKernel();
    (globalThis as Record<string, unknown>).__tslab__ = { require: (id: string) => (id === 'tslab' ? kernel.tslab : undefined) };
    resendPlotting();
  });
  afterEach(() => {
    delete (globalThis as Record<string, unknown>).__tslab__;
  });

  it('shows inline and sends the plotting bundle with the first chart only', async () => {
    // kernel.ts caches the module; reload so this test's stand-in is used.
    vi.resetModules();
    const views = await import('../../src/views');
    const v = allViews(false);
    expect(insideNotebookKernel()).toBe(true);
    views.screeView(v.projection).show();
    views.kEvidenceView(v.comparison).show();
    views.profileCardsView(v.profiles).show();
    expect(kernel.shown.length).toBe(3);
    const bundles = kernel.shown.map((s) => s.split('window.__kinsortDefine=window.define').length - 1);
    expect(bundles).toEqual([1, 0, 0]);
    expect(kernel.shown[1]).toContain('class="kinsort-view"');
  });

  it('progress overwrites one display entry, the last step always drawn', async () => {
    vi.resetModules();
    const nb = await import('../../src/notebook');
    const progress = nb.progressDisplay('Sweep <k>', { every: 10_000 });
    for (let done = 0; done <= 5; done++) progress({ task: 'k-means restarts', done, total: 5, detail: 'k = 4' });
    expect(kernel.updates.length).toBe(1);
    const entry = kernel.updates[0];
    expect(entry.length).toBe(2); // the first call and the final one; throttled between
    expect(entry[1]).toContain('5 of 5 · done');
    expect(entry[1]).toContain('Sweep &lt;k&gt;');
  });
});

describe('outside the kernel', () => {
  let dir: string;
  let cwd: string;
  beforeEach(() => {
    cwd = process.cwd();
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-show-'));
    process.chdir(dir);
  });
  afterEach(() => {
    process.chdir(cwd);
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('show() writes a page into kinsort-views/ and prints one line saying where', () => {
    const log = vi.spyOn(console, 'log').mockImplementation(() => undefined);
    const v = allViews(false);
    screeView(v.projection).show();
    profileCardsView(v.profiles).show();
    expect(log).toHaveBeenCalledTimes(2);
    const files = fs.readdirSync(path.join(dir, 'kinsort-views'));
    expect(files.length).toBe(2);
    expect(files.some((f) => /^\d\d-variance-explained-by-each-principal-component\.html$/.test(f))).toBe(true);
    expect(String(log.mock.calls[0][0])).toContain(path.join(dir, 'kinsort-views'));
    const page = fs.readFileSync(path.join(dir, 'kinsort-views', files.find((f) => f.includes('variance'))!), 'utf8');
    expect(page).toContain('window.__kinsortDefine');
    log.mockRestore();
  });

  it('save(path) writes the same offline page', () => {
    const v = allViews(false);
    const view = screeView(v.projection);
    const file = view.save(path.join(dir, 'nested', 'scree.html'));
    expect(fs.readFileSync(file, 'utf8')).toBe(view.html());
  });

  it('progress rewrites one line on a terminal and stays silent otherwise', () => {
    const written: string[] = [];
    const tty = { isTTY: true, write: (s: string) => written.push(s) };
    const p = progressDisplay('gap', { every: 0, stream: tty });
    p({ task: 'reference sets', done: 1, total: 2 });
    p({ task: 'reference sets', done: 2, total: 2 });
    expect(written.length).toBe(2);
    expect(written.every((w) => w.startsWith('\r'))).toBe(true);
    expect(written[1].endsWith('\n')).toBe(true);
    const quiet: string[] = [];
    const q = progressDisplay('gap', { every: 0, stream: { isTTY: false, write: (s: string) => quiet.push(s) } });
    q({ task: 'reference sets', done: 2, total: 2 });
    expect(quiet).toEqual([]);
  });
});
