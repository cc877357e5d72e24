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

describe('progress text', () => {
  it('says the title once when the task has the same name (no "k-means restarts · k-means restarts")', async () => {
    const { progressHtml } = await import('../../src/notebook');
    const h = progressHtml('k-means restarts', { task: 'k-means restarts', done: 5, total: 5, detail: 'k = 5' });
    expect(h.split('k-means restarts').length - 1).toBe(1);
    expect(h).toContain('k = 5');
    const written: string[] = [];
    const p = progressDisplay('K-means restarts', { every: 0, stream: { isTTY: true, write: (s: string) => written.push(s) } });
    p({ task: 'k-means restarts', done: 1, total: 1, detail: 'k = 5' });
    expect(written[0].toLowerCase().split('k-means restarts').length - 1).toBe(1);
    // Different words all stay.
    expect(progressHtml('Comparing k', { task: 'k-means restarts', done: 1, total: 2, detail: 'k = 3' })).toMatch(
      /Comparing k<\/b> · k-means restarts · k = 3/,
    );
  });
});

// A stand-in for Deno's kernel: Deno.jupyter.display records each call and its options.
function fakeDeno() {
  const calls: { bundle: Record<string, string>; options: { raw?: boolean; update?: boolean; display_id?: string } }[] = [];
  const jupyter = {
    display: (bundle: Record<string, string>, options = {}) => {
      calls.push({ bundle, options });
      return Promise.resolve();
    },
  };
  return { calls, jupyter };
}

describe("inside Deno's kernel", () => {
  let deno: ReturnType<typeof fakeDeno>;
  beforeEach(() => {
    deno = fakeDeno();
    (globalThis as Record<string, unknown>).Deno = { jupyter: deno.jupyter };
  });
  afterEach(() => {
    delete (globalThis as Record<string, unknown>).Deno;
    delete process.env.KINSORT_LIGHT;
  });

  it('show() displays raw HTML, the bundle with the first chart only; a view as a cell value draws through Symbol.for("Jupyter.display")', async () => {
    vi.resetModules();
    const views = await import('../../src/views');
    const nb = await import('../../src/notebook');
    expect(nb.insideNotebookKernel()).toBe(true);
    expect(nb.currentKernel()?.name).toBe('deno');
    const v = allViews(false);
    // show() hands back the send, to await when a cell has nothing else to wait for.
    await expect(views.screeView(v.projection).show()).resolves.toBeUndefined();
    // A view left as a cell's value: it displays itself (the plotting bundle with the first
    // chart only), waits until the display has had time to leave Deno, then gives Deno an empty
    // bundle, so the view is drawn once and the kernel's own result message carries nothing.
    const evidence = views.kEvidenceView(v.comparison);
    const own = (evidence as unknown as Record<symbol, () => Promise<Record<string, string>>>)[Symbol.for('Jupyter.display')];
    expect(typeof own).toBe('function');
    const before = deno.calls.length;
    const bundle = await own.call(evidence);
    expect(bundle).toEqual({});
    expect(deno.calls.length).toBe(before + 1);
    const sent = deno.calls[before];
    expect(sent.options.raw).toBe(true);
    expect(sent.bundle['text/html']).toContain('data-view="k-evidence"');
    // The plotting bundle went out once, with the first chart (the scree view's show()).
    expect(deno.calls.map((c) => c.bundle['text/html'].split('window.__kinsortDefine=window.define').length - 1)).toEqual([1, 0]);
    // Not enumerable: the value lists, copies and serialises as before.
    expect(Object.keys(evidence)).not.toContain(Symbol.for('Jupyter.display').toString());
    expect(JSON.stringify(Object.keys(evidence))).toBe(
      JSON.stringify(['kind', 'title', 'caption', 'fragment', 'html', 'svg', 'save', 'show']),
    );
  });

  it('a view as a cell value settles only after a grace that grows with the bytes sent (Deno sends while its loop turns)', async () => {
    vi.resetModules();
    const views = await import('../../src/views');
    const { graceAfterSending } = await import('../../src/notebook/deno-kernel');
    expect(graceAfterSending(0)).toBe(40);
    expect(graceAfterSending(5_000_000)).toBe(240);
    const evidence = views.kEvidenceView(allViews(false).comparison);
    const own = (evidence as unknown as Record<symbol, () => Promise<Record<string, string>>>)[Symbol.for('Jupyter.display')];
    const started = Date.now();
    await own.call(evidence);
    // The first chart carries the plotting bundle (about 5 MB): at least the grace for its size.
    const sent = deno.calls[0].bundle['text/html'];
    expect(sent.startsWith('<script>window.__kinsortDefine=window.define')).toBe(true);
    expect(sent).toContain('<figure class="kinsort-view"');
    expect(Date.now() - started).toBeGreaterThanOrEqual(graceAfterSending(sent.length) - 5);
  });

  it('progress opens one display entry and updates it by display_id', async () => {
    vi.resetModules();
    const nb = await import('../../src/notebook');
    const p = nb.progressDisplay('Comparing k', { every: 0 });
    for (let done = 1; done <= 3; done++) p({ task: 'k-means restarts', done, total: 3 });
    // The first state goes out at once; the later ones wait for it and only the newest follows.
    expect(deno.calls.length).toBe(1);
    await nb.currentKernel()!.settled!();
    expect(deno.calls.map((c) => c.options.update)).toEqual([false, true]);
    const ids = new Set(deno.calls.map((c) => c.options.display_id));
    expect(ids.size).toBe(1);
    expect([...ids][0]).toMatch(/^kinsort-/);
    expect(deno.calls[1].bundle['text/html']).toContain('3 of 3 · done');
  });

  it('light mode: still pictures only, no plotting bundle and no live chart (setting or KINSORT_LIGHT=1)', async () => {
    for (const how of ['call', 'env'] as const) {
      vi.resetModules();
      deno.calls.length = 0;
      const views = await import('../../src/views');
      const nb = await import('../../src/notebook');
      if (how === 'call') expect(nb.lightNotebook()).toBe(true);
      else process.env.KINSORT_LIGHT = '1';
      expect(nb.isLightNotebook()).toBe(true);
      const v = allViews(false);
      views.screeView(v.projection).show();
      views.profileCardsView(v.profiles).show();
      const sent = deno.calls.map((c) => c.bundle['text/html']);
      expect(sent.length).toBe(2);
      for (const h of sent) {
        expect(h).not.toContain('window.__kinsortDefine');
        expect(h).not.toContain('ks-spec');
        expect(h).toMatch(/<div class="ks-static"><svg|<div class="ks-static">.*ks-card/s);
        expect(h.length).toBeLessThan(100_000);
      }
      nb.lightNotebook(false);
      expect(nb.isLightNotebook()).toBe(false);
    }
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

  it('show() writes a page into kinsort-views/ named by its content, the plotting bundle once beside it, and one line saying where', () => {
    const log = vi.spyOn(console, 'log').mockImplementation(() => undefined);
    const v = allViews(false);
    const first = screeView(v.projection);
    first.show();
    profileCardsView(v.profiles).show();
    expect(log).toHaveBeenCalledTimes(2);
    const folder = path.join(dir, 'kinsort-views');
    const files = fs.readdirSync(folder).sort();
    expect(files.length).toBe(3);
    const scree = files.find((f) => /^variance-explained-by-each-principal-component-[0-9a-f]{10}\.html$/.test(f));
    expect(scree).toBeDefined();
    const bundle = files.find((f) => /^kinsort-plotting-\d+\.\d+\.\d+\.js$/.test(f))!;
    expect(bundle).toBeDefined();
    expect(String(log.mock.calls[0][0])).toContain(folder);
    // The page loads the shared bundle from beside itself instead of carrying 5 MB of its own.
    const page = fs.readFileSync(path.join(folder, scree!), 'utf8');
    expect(page).toContain(`<script src="${bundle}"></script>`);
    expect(page).not.toContain('window.__kinsortDefine');
    expect(page.length).toBeLessThan(200_000);
    const script = fs.readFileSync(path.join(folder, bundle), 'utf8');
    expect(script.startsWith('window.__kinsortDefine=window.define;')).toBe(true);
    expect(script.length).toBeGreaterThan(1_000_000);
    // The same view shown again is the same file (same bytes); another view with the same title
    // is a new file, never written over the first.
    first.show();
    expect(fs.readdirSync(folder).length).toBe(3);
    screeView(v.projection).show();
    expect(fs.readdirSync(folder).filter((f) => f.startsWith('variance-explained')).length).toBe(2);
    expect(fs.readFileSync(path.join(folder, scree!), 'utf8')).toBe(page);
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
