// Headless Chromium (Debian package, driven by playwright-core): with scripts on, every chart is
// redrawn by plotly and no hostile string runs; with scripts off, the SVG / HTML stand-ins show.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { chromium, Browser } from 'playwright-core';
import { projectionView, saveViewsPage } from '../../src/views';
import { createMatrix } from '../../src/core/matrix';
import { kmeans } from '../../src/methods/partition';
import { project } from '../../src/methods/project';
import { createRandom } from '../../src/random';
import { allViewsList } from './views-list';
import { CHROMIUM_ARGS } from './notebook-test-kit';

let browser: Browser;
let file: string;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-browser-'));

beforeAll(async () => {
  browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  file = saveViewsPage(path.join(dir, 'all.html'), 'Every view <with a hostile title>', allViewsList(true));
}, 60_000);

afterAll(async () => {
  await browser?.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('one page holding every view (hostile strings in ids, names and levels)', () => {
  it('scripts on: every chart drawn by plotly, stand-ins hidden, nothing injected runs', async () => {
    const context = await browser.newContext({ javaScriptEnabled: true, viewport: { width: 1100, height: 900 } });
    const page = await context.newPage();
    const requests: string[] = [];
    page.on('request', (r) => requests.push(r.url()));
    await page.goto('file://' + file);
    const charts = await page.locator('.kinsort-view .ks-live').count();
    expect(charts).toBe(4); // all but the cards, silhouettes and dendrogram (SVG only)
    await page.waitForFunction((n) => document.querySelectorAll('[data-drawn="plotly"]').length === n, charts, { timeout: 45_000 });
    const state = await page.evaluate(() => ({
      pwned: (window as unknown as { __pwned?: number }).__pwned,
      images: document.querySelectorAll('img').length,
      plots: document.querySelectorAll('.js-plotly-plot').length,
      hiddenStills: Array.from(document.querySelectorAll('[data-drawn="plotly"] > .ks-static')).filter(
        (e) => (e as HTMLElement).offsetHeight === 0,
      ).length,
    }));
    expect(state.pwned).toBeUndefined();
    expect(state.images).toBe(0);
    expect(state.plots).toBe(4);
    expect(state.hiddenStills).toBe(4);
    // Offline: the only request is the page itself.
    expect(requests.filter((u) => !u.startsWith('file://') && !u.startsWith('data:'))).toEqual([]);
    await context.close();
  }, 60_000);

  it('scripts off: the SVG and card stand-ins show, the live areas stay hidden', async () => {
    const context = await browser.newContext({ javaScriptEnabled: false, viewport: { width: 1100, height: 900 } });
    const page = await context.newPage();
    await page.goto('file://' + file);
    const state = await page.evaluate(() => ({
      svgs: Array.from(document.querySelectorAll('.ks-static > svg')).filter((e) => (e as SVGElement).getBoundingClientRect().height > 100)
        .length,
      cards: document.querySelectorAll('.ks-static .ks-card').length,
      liveShown: Array.from(document.querySelectorAll('.ks-live')).filter((e) => (e as HTMLElement).offsetHeight > 0).length,
      title: document.title,
    }));
    expect(state.svgs).toBe(6);
    expect(state.cards).toBe(3);
    expect(state.liveShown).toBe(0);
    expect(state.title).toBe('Every view <with a hostile title>');
    await context.close();
  }, 60_000);
});

describe('a projection of more rows than SVG markers handle (drawn with WebGL)', () => {
  it('draws every row and the numbered centres on the WebGL layer, with scripts on', async () => {
    // Three groups of our own making, 6,000 rows: above the 5,000 where the live chart switches to WebGL.
    const random = createRandom('webgl-projection');
    const n = 6000;
    const d = 4;
    const data = new Float64Array(n * d);
    for (let i = 0; i < n; i++) for (let j = 0; j < d; j++) data[i * d + j] = (i % 3) * 3 * (j === 0 ? 1 : 0.3) + random.normal();
    const m = createMatrix(n, d, data);
    const fit = kmeans(m, { k: 3, seed: 1, restarts: 2 });
    const view = projectionView(project(m, { components: 2 }), fit.assignment);
    const glFile = saveViewsPage(path.join(dir, 'webgl.html'), 'WebGL projection', [view]);
    const context = await browser.newContext({ javaScriptEnabled: true, viewport: { width: 1000, height: 800 } });
    const page = await context.newPage();
    await page.goto('file://' + glFile);
    await page.waitForFunction(() => document.querySelectorAll('[data-drawn="plotly"]').length === 1, undefined, { timeout: 45_000 });
    const state = await page.evaluate(() => {
      const plot = document.querySelector('.js-plotly-plot') as unknown as { _fullData: { type: string; name: string; x: number[] }[] };
      const canvases = Array.from(document.querySelectorAll('.js-plotly-plot canvas')) as HTMLCanvasElement[];
      return {
        types: plot._fullData.map((t) => t.type),
        points: plot._fullData.filter((t) => t.name !== 'centres').reduce((sum, t) => sum + t.x.length, 0),
        canvases: canvases.filter((c) => c.width > 0 && c.height > 0).length,
        stillShown: Array.from(document.querySelectorAll('.ks-static')).filter((e) => (e as HTMLElement).offsetHeight > 0).length,
        note: document.querySelector('.kinsort-view')?.textContent ?? '',
      };
    });
    // Every trace on the WebGL layer (an SVG centres trace would sit under it, hidden), every row drawn.
    expect(state.types).toEqual(['scattergl', 'scattergl', 'scattergl', 'scattergl']);
    expect(state.points).toBe(n);
    expect(state.canvases).toBeGreaterThan(0);
    expect(state.stillShown).toBe(0);
    expect(state.note).toContain('the static picture draws every second row');
    await context.close();
  }, 90_000);
});
