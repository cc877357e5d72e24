// npm run demo (scripts/demo.js) in a child process, as a user runs it: it must write the report
// and the definition, the report must hold every view and the write-up and load nothing from the
// network, and two runs must give the same definition byte for byte.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFile } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { promisify } from 'util';
import { loadDefinition } from '../../src/study/definition-handle';

const run = promisify(execFile);
const root = path.join(__dirname, '..', '..');
const script = path.join(root, 'scripts', 'demo.js');
const work = fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-demo-'));
const first = path.join(work, 'first');
const second = path.join(work, 'second');
let outputs: { stdout: string; stderr: string }[] = [];

beforeAll(async () => {
  if (!fs.existsSync(path.join(root, 'dist', 'index.js'))) throw new Error('dist/ is missing: npm run build');
  // Both runs at once: two cores, and the test stays near one run's time.
  outputs = await Promise.all([first, second].map((dir) => run(process.execPath, [script, '--out', dir], { cwd: root, timeout: 110_000 })));
}, 120_000);

afterAll(() => fs.rmSync(work, { recursive: true, force: true }));

/** The page without the inlined plotting bundle (its own JavaScript holds link text it never loads). */
function pageWithoutBundle(page: string): string {
  const start = page.indexOf('<script>window.__kinsortDefine=window.define');
  const endMarker = '<script>if(window.__kinsortDefine!==undefined){window.define=window.__kinsortDefine;}</script>';
  const end = page.indexOf(endMarker);
  expect(start).toBeGreaterThan(0);
  expect(end).toBeGreaterThan(start);
  return page.slice(0, start) + page.slice(end + endMarker.length);
}

describe('npm run demo', () => {
  it('writes the report and the definition and prints where they are', () => {
    for (const [i, dir] of [first, second].entries()) {
      const report = path.join(dir, 'report.html');
      const definition = path.join(dir, 'pass-holder-segments.json');
      expect(fs.statSync(report).size).toBeGreaterThan(100_000);
      expect(fs.statSync(definition).size).toBeGreaterThan(500);
      expect(outputs[i].stdout).toContain(report);
      expect(outputs[i].stdout).toContain(definition);
      expect(outputs[i].stderr).toBe('');
    }
  });

  it('the report holds every view, the named cards, the write-up and the caution', () => {
    const page = fs.readFileSync(path.join(first, 'report.html'), 'utf8');
    for (const kind of ['k-evidence', 'projection', 'silhouette', 'profile-cards', 'dendrogram', 'drift']) {
      expect(page, kind).toContain(`data-view="${kind}"`);
    }
    for (const title of [
      'Weekday peak commuters',
      'Students topping up',
      'Long-distance regulars',
      'Weekend and off-peak riders',
      'Occasional newcomers',
    ]) {
      expect(page).toContain(title);
    }
    expect(page).toContain('class="ks-wu-figures"'); // the write-up's figures table
    expect(page).toContain('class="ks-wu-caution"');
    expect(page).toContain('How many segments');
    // One story: the evidence view's headline, the text and the fitted k agree (issue 16, item 7).
    expect(page).toContain('<h3>k = 5 recommended: every segment stable');
    expect(page).toMatch(/How many segments<\/h2><p>k = 5 recommended[^<]*We fit k = 5, as recommended/);
    expect(page).toContain("Next month's pass holders");
    // The caution once: the write-up's, not the cards' own line as well.
    expect(page.match(/protected attributes/gi)).toHaveLength(1);
    // Station names from demo-data/stations.csv label the dendrogram.
    const station = fs
      .readFileSync(path.join(root, 'demo-data', 'stations.csv'), 'utf8')
      .split('\n')[1]
      .split(',')[0];
    expect(page).toContain(station);
  });

  it('is offline: no src or href to the network outside the inlined bundle, which is there once', () => {
    const page = fs.readFileSync(path.join(first, 'report.html'), 'utf8');
    expect(page.split('window.__kinsortDefine=window.define').length - 1).toBe(1);
    const rest = pageWithoutBundle(page);
    expect(rest).not.toMatch(/src\s*=\s*["']?\s*(https?:)?\/\//i);
    expect(rest).not.toMatch(/href\s*=\s*["']?\s*(https?:)?\/\//i);
    expect(rest).not.toMatch(/<link\b/i);
  });

  it('gives a byte-identical definition on a second run', () => {
    const a = fs.readFileSync(path.join(first, 'pass-holder-segments.json'));
    const b = fs.readFileSync(path.join(second, 'pass-holder-segments.json'));
    expect(a.equals(b)).toBe(true);
  });

  it('the definition loads, has five named segments covering all 2,000 holders, and scores next month', () => {
    const def = loadDefinition(path.join(first, 'pass-holder-segments.json'));
    const segments = def.definition.segments;
    expect(segments).toHaveLength(5);
    expect(new Set(segments.map((s) => s.title)).size).toBe(5);
    expect(segments.reduce((n, s) => n + s.size, 0)).toBe(2000);
    const next = def.assign(fs.readFileSync(path.join(root, 'demo-data', 'pass-holders-next-month.csv'), 'utf8'));
    expect(next.rows).toHaveLength(300);
    // Median fill: no next-month row is refused for a missing value; "youth" is reported as unseen.
    expect(next.report.refused).toEqual([]);
    expect(next.report.unseenLevels.some((u) => u.column === 'fare_type' && u.level === 'youth')).toBe(true);
  });
});
