// Escaping: hostile strings as ids, column names, category levels, kept values, segment titles and
// texts go through every view (src/views exports, built by the fluent layer) and the write-up
// (Markdown and HTML). Each page is parsed and run by a real browser DOM (headless Chromium via
// playwright-core) with window.alert watched: no element or attribute may come from the data, no
// inline event handler anywhere, and alert is never called. Data of our own making.
import { mkdtempSync, rmSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type Browser } from 'playwright-core';
import { study, viewsPage, type View } from '../../src';
import { groupedRows } from './data';
import { CHROMIUM_ARGS } from '../notebook/notebook-test-kit';

const HOSTILE = [
  '<script>alert(1)</script>',
  '<img src=x onerror=alert(1)>',
  '"><svg onload=alert(1)>',
  "' onmouseover='alert(1)' x='",
  '</script><script>alert(1)</script>',
  '<!--<a href="javascript:alert(1)">x</a>',
];

function hostileStudy() {
  const rows = groupedRows(45, 3, 3, 8);
  const records = rows.map((r, i) => ({
    [`id ${HOSTILE[1]}`]: `${HOSTILE[i % HOSTILE.length]}#${i}`,
    [HOSTILE[0]]: r[0],
    [HOSTILE[2]]: r[1],
    plain: r[2],
    [HOSTILE[3]]: HOSTILE[i % 3], // a categorical column whose levels are hostile
    [HOSTILE[4]]: HOSTILE[(i + 1) % HOSTILE.length], // kept for profiles
  }));
  const s = study(records, { id: `id ${HOSTILE[1]}`, keep: [HOSTILE[4]] }).prepare();
  const seg = s.kmeans({ k: 3, seed: 2, restarts: 2 });
  HOSTILE.slice(0, 3).forEach((h, g) => seg.name(g + 1, { title: h, text: HOSTILE[(g + 3) % HOSTILE.length] }));
  return { s, seg, tree: s.agglomerate({ method: 'ward' }) };
}

let browser: Browser;
const dir = mkdtempSync(join(tmpdir(), 'kinsort-escape-'));
let views: View[] = [];
let writeUp: { markdown(): string; html(): string };

beforeAll(async () => {
  browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  const { s, seg, tree } = hostileStudy();
  views = [
    seg.cards(),
    seg.projection({ loadings: true, title: HOSTILE[2] }),
    seg.silhouette().view(),
    s.compareK({ from: 2, to: 4, restarts: 2, references: 3 }).view(),
    s.project({ components: 3 }).view(),
    tree.dendrogram({ k: 3, title: HOSTILE[0] }),
    tree.heatmap(),
  ];
  writeUp = seg.writeUp({ title: HOSTILE[4] });
}, 120_000);

afterAll(async () => {
  await browser?.close();
  rmSync(dir, { recursive: true, force: true });
});

interface PageState {
  alerts: number;
  onAttributes: string[];
  imgs: number;
  foreignSvg: string[];
  anchors: string[];
  scriptsWithData: number;
  badJson: number;
  drawn: number;
  text: string;
}

async function inspect(html: string, name: string, charts: number): Promise<PageState> {
  const file = join(dir, `${name}.html`);
  writeFileSync(file, html);
  const context = await browser.newContext({ javaScriptEnabled: true });
  const page = await context.newPage();
  await page.addInitScript(() => {
    const w = window as unknown as { __alerts: number; alert: () => void; confirm: () => boolean; prompt: () => null };
    w.__alerts = 0;
    w.alert = () => void w.__alerts++;
    w.confirm = () => (w.__alerts++, false);
    w.prompt = () => (w.__alerts++, null);
  });
  await page.goto('file://' + file);
  if (charts > 0) {
    await page.waitForFunction((n) => document.querySelectorAll('[data-drawn="plotly"]').length >= n, charts, { timeout: 45_000 });
  }
  // Hover over every plotted point so hover labels are drawn too.
  await page.mouse.move(300, 300);
  const state = await page.evaluate(() => {
    const all = Array.from(document.querySelectorAll('*'));
    const scripts = Array.from(document.querySelectorAll('script'));
    const json = scripts.filter((s) => s.type === 'application/json');
    let badJson = 0;
    for (const s of json) {
      try {
        JSON.parse(s.textContent ?? '');
      } catch {
        badJson++;
      }
    }
    return {
      alerts: (window as unknown as { __alerts: number }).__alerts,
      onAttributes: all.flatMap((e) =>
        Array.from(e.attributes)
          .filter((a) => /^on/i.test(a.name))
          .map((a) => `${e.tagName}[${a.name}]`),
      ),
      imgs: document.querySelectorAll('img, iframe, object, embed').length,
      // An <svg> whose parent is not one of ours would mean data opened an element.
      // (plotly's own hidden text-measuring svg, #js-plotly-tester, is the one expected outsider).
      foreignSvg: Array.from(document.querySelectorAll('svg'))
        .filter((e) => e.closest('.ks-static, .ks-live, .js-plotly-plot') === null && e.id !== 'js-plotly-tester')
        .map((e) => e.outerHTML.slice(0, 120)),
      anchors: Array.from(document.querySelectorAll('a'))
        .map((a) => a.getAttribute('href') ?? '')
        .filter((h) => /javascript:/i.test(h)),
      scriptsWithData: scripts.filter((s) => s.type !== 'application/json' && /alert\(1\)/.test(s.textContent ?? '')).length,
      badJson,
      drawn: document.querySelectorAll('[data-drawn="plotly"]').length,
      text: document.body.innerText,
    };
  });
  await context.close();
  return state;
}

function expectInert(state: PageState): void {
  const { text: _text, ...facts } = state;
  if (state.alerts || state.imgs || state.foreignSvg.length || state.scriptsWithData || state.badJson) console.error(JSON.stringify(facts));
  expect(state.alerts).toBe(0);
  expect(state.onAttributes).toEqual([]);
  expect(state.imgs).toBe(0);
  expect(state.foreignSvg).toEqual([]);
  expect(state.anchors).toEqual([]);
  expect(state.scriptsWithData).toBe(0);
  expect(state.badJson).toBe(0);
}

describe('hostile strings never become markup (real browser DOM, scripts on)', () => {
  it('one page with every view: nothing injected, every chart drawn, the strings shown as text', async () => {
    const html = viewsPage(`All views ${HOSTILE[0]}`, views, `Intro ${HOSTILE[1]}`);
    // Cards, silhouettes and the dendrogram are SVG / HTML only; every other view has a live chart.
    const live = views.filter((v) => v.fragment().includes('class="ks-live"')).length;
    expect(live).toBe(views.length - 3);
    const state = await inspect(html, 'all-views', live);
    expectInert(state);
    expect(state.drawn).toBe(live);
    // Escaped, not dropped: the hostile text is readable on the page.
    expect(state.text).toContain(HOSTILE[1]);
    expect(state.text).toContain(HOSTILE[0]);
  }, 90_000);

  it.each([0, 5])(
    'view %i alone as its own offline page (the single-view wrapper; every view is on the page above)',
    async (i) => {
      const v = views[i];
      const state = await inspect(v.html(), `view-${i}`, v.fragment().includes('class="ks-live"') ? 1 : 0);
      expectInert(state);
    },
    90_000,
  );

  it('the HTML write-up', async () => {
    const state = await inspect(writeUp.html(), 'write-up', 0);
    expectInert(state);
    expect(state.text).toContain(HOSTILE[2]);
  }, 60_000);

  it('the Markdown write-up holds no markup from data: placed as HTML, only text results', async () => {
    const md = writeUp.markdown();
    for (const h of HOSTILE.filter((x) => x.includes('<'))) expect(md).not.toContain(h);
    const context = await browser.newContext({ javaScriptEnabled: true });
    const page = await context.newPage();
    await page.setContent('<!doctype html><body></body>');
    // Markdown renderers pass raw HTML through: if any data made a tag, innerHTML would build it.
    const elements = await page.evaluate((text) => {
      const box = document.createElement('div');
      box.innerHTML = text;
      return Array.from(box.querySelectorAll('*')).map((e) => e.tagName);
    }, md);
    expect(elements).toEqual([]);
    await context.close();
  }, 60_000);
});
