// The three demo notebooks as a user runs them: each imports from 'kinsort' (dist/ through
// node_modules/kinsort), runs top to bottom headless in the tslab kernel under Debian's jupyter
// nbconvert with no error output, is exported to HTML and opened in headless Chromium (Debian
// package, playwright-core) with scripts on (every chart drawn by plotly) and off (the SVG and
// card stand-ins show). Same kernel / nbconvert / Chromium steps as kernel.test.ts beside it.
//
// Set KINSORT_SCREENSHOTS=docs/screenshots to refresh the README's screenshots of the key views.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFile, execFileSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { promisify } from 'util';
import { chromium, Browser } from 'playwright-core';
import { CHROMIUM_ARGS, type NotebookOutput, text } from './notebook-test-kit';

const run = promisify(execFile);
const repo = path.resolve(__dirname, '../..');
const notebooks = path.join(repo, 'notebooks');
const out = fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-demo-notebooks-'));
// The kernel spec goes to a private prefix, so this file and kernel.test.ts can install at the same time.
const jupyterPath = path.join(out, 'share', 'jupyter');
const env = { ...process.env, PATH: `${path.join(repo, 'node_modules/.bin')}:${process.env.PATH}`, JUPYTER_PATH: jupyterPath };
const shots = process.env.KINSORT_SCREENSHOTS ? path.resolve(repo, process.env.KINSORT_SCREENSHOTS) : path.join(out, 'screenshots');

const NAMES = ['01-pass-holder-segments', '02-station-hierarchy', '03-scoring-next-month'] as const;
type Name = (typeof NAMES)[number];
type Output = NotebookOutput;
type Cell = { cell_type: string; source: string | string[]; outputs?: Output[] };

const executed = new Map<Name, Cell[]>();
let aloneCells: Cell[] = [];
let browser: Browser;

async function execute(name: Name): Promise<void> {
  await run('/usr/bin/jupyter', ['nbconvert', '--to', 'notebook', '--execute', '--allow-errors', '--output-dir', out, `${name}.ipynb`], {
    cwd: notebooks,
    env,
    timeout: 240_000,
    maxBuffer: 64 << 20,
  });
  executed.set(name, JSON.parse(fs.readFileSync(path.join(out, `${name}.ipynb`), 'utf8')).cells);
  await run('/usr/bin/jupyter', ['nbconvert', '--to', 'html', path.join(out, `${name}.ipynb`)], {
    env,
    timeout: 120_000,
    maxBuffer: 64 << 20,
  });
}

/** Notebook 03 from a copy of the layout with no notebooks/out/: the fit-in-place path. */
async function executeThreeAlone(): Promise<void> {
  const copy = path.join(out, 'alone');
  fs.mkdirSync(path.join(copy, 'notebooks'), { recursive: true });
  fs.symlinkSync(path.join(repo, 'demo-data'), path.join(copy, 'demo-data'));
  fs.symlinkSync(path.join(repo, 'node_modules'), path.join(copy, 'node_modules'));
  fs.copyFileSync(path.join(notebooks, '03-scoring-next-month.ipynb'), path.join(copy, 'notebooks', 'three.ipynb'));
  await run('/usr/bin/jupyter', ['nbconvert', '--to', 'notebook', '--execute', '--allow-errors', '--output', 'three-run', 'three.ipynb'], {
    cwd: path.join(copy, 'notebooks'),
    env,
    timeout: 240_000,
    maxBuffer: 64 << 20,
  });
  aloneCells = JSON.parse(fs.readFileSync(path.join(copy, 'notebooks', 'three-run.ipynb'), 'utf8')).cells;
}

beforeAll(async () => {
  if (!fs.existsSync(path.join(repo, 'dist/index.js'))) {
    execFileSync('npm', ['run', 'build'], { cwd: repo, env, stdio: 'inherit' });
  }
  execFileSync(path.join(repo, 'node_modules/.bin/tslab'), ['install', '--python=/usr/bin/python3', `--prefix=${out}`], {
    cwd: repo,
    env,
    stdio: 'ignore',
  });
  // 01 and 02 side by side (two cores); 03 after 01, so it scores with the definition 01 saved.
  await Promise.all([
    execute('01-pass-holder-segments').then(() => execute('03-scoring-next-month')),
    execute('02-station-hierarchy').then(executeThreeAlone),
  ]);
}, 480_000);

afterAll(async () => {
  await browser?.close();
  fs.rmSync(out, { recursive: true, force: true });
});

const outputsOf = (name: Name): Output[] => executed.get(name)!.flatMap((c) => c.outputs ?? []);
const html = (o: Output): string => text(o.data?.['text/html']);
const streams = (name: Name): string =>
  outputsOf(name)
    .filter((o) => o.output_type === 'stream')
    .map((o) => text(o.text))
    .join('');

describe('the demo notebooks in the tslab kernel', () => {
  it.each(NAMES)('%s: imports kinsort as a user would, is committed with outputs cleared', (name) => {
    const committed: Cell[] = JSON.parse(fs.readFileSync(path.join(notebooks, `${name}.ipynb`), 'utf8')).cells;
    const code = committed.filter((c) => c.cell_type === 'code');
    expect(code.every((c) => (c.outputs ?? []).length === 0)).toBe(true);
    expect(text(code[0].source)).toMatch(/import \{[^}]*\bstudy\b[^}]*\} from 'kinsort';/);
    // No path into the repo's sources or build: the notebook reads as it would anywhere else.
    expect(code.map((c) => text(c.source)).join('\n')).not.toMatch(/['"](\.\.\/)+(src|dist)\b/);
  });

  it.each(NAMES)('%s: runs top to bottom with no error output', (name) => {
    const bad = outputsOf(name).filter(
      (o) =>
        o.output_type === 'error' ||
        (o.output_type === 'stream' && (o.name === 'stderr' || /\bError\b|unexpected error/.test(text(o.text)))),
    );
    expect(bad.map((o) => `${o.ename ?? o.name}: ${o.evalue ?? text(o.text).slice(0, 300)}`)).toEqual([]);
  });

  it('01: shows the variable tree, the k evidence, projection, silhouette, cards and rules inline, the bundle once, and saves the definition', () => {
    const kinds = outputsOf('01-pass-holder-segments').flatMap((o) => [...html(o).matchAll(/data-view="([^"]+)"/g)].map((m) => m[1]));
    expect(kinds).toEqual([
      'dendrogram',
      'variable-groups',
      'k-evidence',
      'projection',
      'silhouette',
      'profile-cards',
      'profile-cards',
      'segment-rules',
      'projection',
      'projection',
      'mixture-evidence',
    ]);
    const bundles = outputsOf('01-pass-holder-segments').map((o) => html(o).split('window.__kinsortDefine=window.define').length - 1);
    expect(bundles.reduce((a, b) => a + b, 0)).toBe(1);
    const s = streams('01-pass-holder-segments');
    expect(s).toContain('reloaded and reassigned 2000 holders: all in the same segment');
    expect(s).toMatch(/weekend_share: \d+ missing, filled with/);
    // The section beyond round segments: noise counted, uncertain holders counted, the BIC choice named.
    expect(s).toMatch(/The mixture is uncertain of \d+ of the \d+ noise holders/);
    expect(s).toMatch(/Lowest BIC: k = \d+, (full|diagonal|spherical|tied) covariance\./);
    // The named cards carry the analyst's names.
    const named = outputsOf('01-pass-holder-segments')
      .map(html)
      .filter((h) => h.includes('data-view="profile-cards"'))[1];
    for (const title of [
      'Weekday peak commuters',
      'Students topping up',
      'Long-distance regulars',
      'Weekend and off-peak riders',
      'Occasional newcomers',
    ]) {
      expect(named).toContain(title);
    }
  });

  it('02: compares linkages, draws the dendrogram with station names, compares the cut with k-means', () => {
    const s = streams('02-station-hierarchy');
    for (const linkage of ['single', 'complete', 'average', 'weighted', 'ward']) expect(s).toContain(`'${linkage}'`);
    expect(s).toMatch(/Adjusted Rand index [01]\.\d{3}/);
    const dendrogram = outputsOf('02-station-hierarchy')
      .map(html)
      .find((h) => h.includes('data-view="dendrogram"'));
    const station = fs.readFileSync(path.join(repo, 'demo-data/stations.csv'), 'utf8').split('\n')[1].split(',')[0];
    expect(dendrogram).toContain(station);
  });

  it('03: loads the saved definition, reports "youth" and the filled values, and SQL agrees with assign', () => {
    const s = streams('03-scoring-next-month');
    expect(s).toContain('Loaded out/pass-holder-segments.json.');
    expect(s).toMatch(/unseen level: PH-\d+ has fare_type = "youth"/);
    expect(s).toMatch(/missing avg_trip_km: \d+ filled with the training median/);
    expect(s).toContain('Same segment for 300 of 300 holders');
    expect(s).toContain('SQLite: same segment for 300 of 300 holders.');
    const kinds = outputsOf('03-scoring-next-month').flatMap((o) => [...html(o).matchAll(/data-view="([^"]+)"/g)].map((m) => m[1]));
    expect(kinds.filter((k) => k === 'drift').length).toBe(2);
    expect(kinds.length).toBeGreaterThanOrEqual(3);
  });

  it('03 run on its own (no saved definition): fits the same recipe in place, and SQL still agrees', () => {
    const outputs = aloneCells.flatMap((c) => c.outputs ?? []);
    expect(outputs.filter((o) => o.output_type === 'error' || o.name === 'stderr')).toEqual([]);
    const s = outputs
      .filter((o) => o.output_type === 'stream')
      .map((o) => text(o.text))
      .join('');
    expect(s).toContain('No saved definition found: fitted the notebook 1 recipe in place');
    expect(s).toContain('Same segment for 300 of 300 holders');
    // The same segments as the saved definition: same training sizes in the same order (the first table).
    const sizes = (t: string) => [...t.matchAll(/│ \d+\s+│ (\d+)\s+│ '[^']*'\s+│ (\d+)\s+│/g)].map((m) => `${m[1]}:${m[2]}`).slice(0, 5);
    expect(sizes(s)).toHaveLength(5);
    expect(sizes(s)).toEqual(sizes(streams('03-scoring-next-month')));
  });

  it('exported to HTML: charts drawn with scripts on, stand-ins with scripts off; screenshots of the key views', async () => {
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
    fs.mkdirSync(shots, { recursive: true });
    const wanted: Record<string, string> = {
      'k-evidence': 'k-evidence',
      projection: 'projection',
      'profile-cards': 'profile-cards',
      dendrogram: 'dendrogram',
    };
    const taken: string[] = [];
    for (const name of ['01-pass-holder-segments', '02-station-hierarchy'] as const) {
      const file = 'file://' + path.join(out, `${name}.html`);
      for (const js of [true, false]) {
        const context = await browser.newContext({ javaScriptEnabled: js, viewport: { width: 1100, height: 900 } });
        const page = await context.newPage();
        await page.goto(file);
        const charts = await page.locator('figure.kinsort-view .ks-live').count();
        // Live charts: evidence for k and projection in notebook 1, the heatmap in notebook 2 (the
        // silhouettes, dendrogram and cards are SVG / HTML only).
        expect(charts).toBeGreaterThanOrEqual(name === '01-pass-holder-segments' ? 2 : 1);
        if (js) {
          await page.waitForFunction((n) => document.querySelectorAll('[data-drawn="plotly"]').length === n, charts, { timeout: 60_000 });
          expect(await page.locator('figure.kinsort-view .js-plotly-plot').count()).toBe(charts);
        } else {
          const stills = await page.evaluate(
            () => Array.from(document.querySelectorAll('.ks-static > svg')).filter((e) => e.getBoundingClientRect().height > 100).length,
          );
          expect(stills).toBeGreaterThanOrEqual(charts);
          expect(await page.locator('[data-drawn="plotly"]').count()).toBe(0);
          expect(await page.locator('.ks-static .ks-card').count()).toBeGreaterThanOrEqual(5);
        }
        const figures = page.locator('figure.kinsort-view');
        // Last first: notebook 1 shows the cards twice, and the second time they carry the names.
        for (let i = (await figures.count()) - 1; i >= 0; i--) {
          const kind = (await figures.nth(i).getAttribute('data-view')) ?? '';
          const base = wanted[kind];
          const file = `demo-${base}-${js ? 'live' : 'still'}.png`;
          if (!base || taken.includes(file)) continue;
          await figures.nth(i).screenshot({ path: path.join(shots, file) });
          taken.push(file);
        }
        await context.close();
      }
    }
    expect(taken.sort()).toEqual(
      Object.values(wanted)
        .flatMap((b) => [`demo-${b}-live.png`, `demo-${b}-still.png`])
        .sort(),
    );
  }, 180_000);
});
