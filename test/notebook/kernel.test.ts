// The notebook as a user runs it: notebooks/views-check.ipynb imports from 'kinsort' (dist/),
// runs headless in the tslab kernel under Debian's jupyter nbconvert, is exported to HTML and
// opened in headless Chromium with scripts on and off.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { chromium, Browser } from 'playwright-core';
import { CHROMIUM_ARGS as ARGS } from './notebook-test-kit';

const repo = path.resolve(__dirname, '../..');
const env = { ...process.env, PATH: `${path.join(repo, 'node_modules/.bin')}:${process.env.PATH}` };
const out = fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-notebook-'));
// Set KINSORT_SCREENSHOTS=folder to keep a PNG of every view (scripts on and off).
const shots = process.env.KINSORT_SCREENSHOTS;

type Output = { output_type: string; data?: Record<string, string | string[]>; text?: string | string[]; ename?: string; evalue?: string };
let outputs: Output[] = [];
let browser: Browser;

beforeAll(() => {
  if (!fs.existsSync(path.join(repo, 'dist/index.js'))) {
    execFileSync('npm', ['run', 'build'], { cwd: repo, env, stdio: 'inherit' });
  }
  execFileSync('npx', ['tslab', 'install', '--python=/usr/bin/python3'], { cwd: repo, env, stdio: 'ignore' });
  execFileSync(
    '/usr/bin/jupyter',
    ['nbconvert', '--to', 'notebook', '--execute', '--allow-errors', '--output-dir', out, 'views-check.ipynb'],
    {
      cwd: path.join(repo, 'notebooks'),
      env,
      stdio: 'ignore',
      timeout: 240_000,
    },
  );
  const nb = JSON.parse(fs.readFileSync(path.join(out, 'views-check.ipynb'), 'utf8'));
  outputs = nb.cells.flatMap((c: { outputs?: Output[] }) => c.outputs ?? []);
  execFileSync('/usr/bin/jupyter', ['nbconvert', '--to', 'html', path.join(out, 'views-check.ipynb')], { env, stdio: 'ignore' });
}, 300_000);

afterAll(async () => {
  await browser?.close();
  fs.rmSync(out, { recursive: true, force: true });
});

const html = (o: Output): string => {
  const v = o.data?.['text/html'];
  return Array.isArray(v) ? v.join('') : (v ?? '');
};

describe('notebooks/views-check.ipynb in the tslab kernel', () => {
  it('runs top to bottom with no error output', () => {
    const errors = outputs.filter((o) => o.output_type === 'error' || (o.output_type === 'stream' && /Error/.test(String(o.text))));
    expect(errors.map((e) => `${e.ename}: ${e.evalue}`)).toEqual([]);
  });

  it('draws every view inline and sends the plotting bundle once', () => {
    const views = outputs.filter((o) => html(o).includes('class="kinsort-view"'));
    expect(views.length).toBe(7);
    const bundles = outputs.map((o) => html(o).split('window.__kinsortDefine=window.define').length - 1);
    expect(bundles.reduce((a, b) => a + b, 0)).toBe(1);
    // The progress display was overwritten in place and ends finished.
    const progress = outputs.filter((o) => html(o).includes('kinsort-progress'));
    expect(progress.length).toBe(1);
    expect(html(progress[0])).toContain('· done');
  });

  it('exported to HTML: plotly draws with scripts on, the stand-ins show with scripts off', async () => {
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ARGS });
    const file = 'file://' + path.join(out, 'views-check.html');
    for (const js of [true, false]) {
      const context = await browser.newContext({ javaScriptEnabled: js, viewport: { width: 1200, height: 900 } });
      const page = await context.newPage();
      await page.goto(file);
      if (js) {
        // Projection, scree, evidence for k and heatmap are live; dendrogram, silhouettes and cards are SVG / HTML only.
        await page.waitForFunction(() => document.querySelectorAll('[data-drawn="plotly"]').length === 4, null, { timeout: 60_000 });
        expect(await page.locator('.js-plotly-plot').count()).toBe(4);
      } else {
        const visibleSvgs = await page.evaluate(
          () => Array.from(document.querySelectorAll('.ks-static > svg')).filter((e) => e.getBoundingClientRect().height > 100).length,
        );
        expect(visibleSvgs).toBe(6);
        expect(await page.locator('.ks-static .ks-card').count()).toBe(3);
        expect(await page.locator('[data-drawn="plotly"]').count()).toBe(0);
      }
      if (shots) {
        fs.mkdirSync(shots, { recursive: true });
        const figures = page.locator('figure.kinsort-view');
        for (let i = 0; i < (await figures.count()); i++) {
          const kind = await figures.nth(i).getAttribute('data-view');
          await figures.nth(i).screenshot({ path: path.join(shots, `${kind}-${js ? 'live' : 'still'}.png`) });
        }
      }
      await context.close();
    }
  }, 120_000);
});
