// CI smoke test for the bench harness: run it in quick mode (tiny sizes) so the script cannot rot.
// It checks the output parses and every case produced a finite time; speed targets are NOT
// checked here (the full bench, `node --expose-gc bench/run.js`, reports those).
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { describe, expect, it } from 'vitest';

const ROOT = path.join(__dirname, '..', '..');
const PYTHON = '/usr/bin/python3';
const hasPythonPeer = spawnSync(PYTHON, ['-c', 'import numpy, scipy, sklearn']).status === 0;
const hasDist = fs.existsSync(path.join(ROOT, 'dist', 'index.js'));

// The functions each bench case calls; a case whose function is not built yet is reported as
// PENDING by the harness rather than timed.
const CASE_FUNCTIONS: Record<string, string> = {
  dissimilarity: 'dissimilarity',
  kmeans: 'kmeans',
  'kmeans-overlap': 'kmeans',
  silhouette: 'silhouette',
  ward: 'agglomerate',
  average: 'agglomerate',
  pca: 'project',
  'k-sweep': 'compareK',
  'ward-small': 'agglomerate',
  'average-small': 'agglomerate',
  'ward-memory': 'agglomerate',
  'database-refine': 'refineInDatabase',
  mixture: 'gaussianMixture',
};

interface Line {
  type: string;
  [key: string]: any;
}

function runQuickBench(): { lines: Line[]; stdout: string } {
  const out = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-bench-smoke-')), 'bench.jsonl');
  const args = ['--expose-gc', path.join(ROOT, 'bench', 'run.js'), '--quick', '--json', out];
  if (!hasPythonPeer) {
    console.warn(`bench smoke: ${PYTHON} with numpy/scipy/sklearn not found; running without the python peer`);
    args.push('--no-python');
  }
  const run = spawnSync(process.execPath, args, { cwd: ROOT, encoding: 'utf8', timeout: 150_000 });
  expect(run.status, `bench exited with ${run.status}: ${run.stderr}`).toBe(0);
  const lines = fs
    .readFileSync(out, 'utf8')
    .trim()
    .split('\n')
    .map((l) => JSON.parse(l) as Line);
  return { lines, stdout: run.stdout };
}

describe.skipIf(!hasDist)('bench harness, quick mode', () => {
  const kinsort = hasDist ? require(path.join(ROOT, 'dist')) : {};
  let result: { lines: Line[]; stdout: string };
  const lines = () => (result ??= runQuickBench()).lines;

  it('writes a machine line first, with the versions the run used', () => {
    const machine = lines()[0];
    expect(machine.type).toBe('machine');
    expect(machine.cpus).toBeGreaterThan(0);
    expect(machine.npmPeers['ml-kmeans']).toMatch(/^\d+\.\d+\.\d+$/);
    if (hasPythonPeer) expect(machine.python.scipy).toMatch(/^\d+\.\d+/);
  }, 180_000);

  it('has a row for every case, and every built kinsort function produced a finite time', () => {
    const rows = lines().filter((l) => l.type === 'case');
    expect(new Set(rows.map((r) => r.case))).toEqual(new Set(Object.keys(CASE_FUNCTIONS)));
    for (const row of rows) {
      const built = typeof kinsort[CASE_FUNCTIONS[row.case]] === 'function';
      if (built) {
        expect(Number.isFinite(row.kinsortMs) && row.kinsortMs > 0, `${row.case} / ${row.tool}: ${row.note}`).toBe(true);
        expect(['PASS', 'MISS', 'info', 'SKIP']).toContain(row.status);
      } else {
        expect(row.status).toBe('PENDING');
        expect(row.kinsortMs).toBeNull();
      }
    }
  }, 180_000);

  it('every peer produced a finite time (python peers only when /usr/bin/python3 has scipy)', () => {
    for (const row of lines().filter((l) => l.type === 'case' && l.tool !== '(limits only)')) {
      const isPython = /SciPy|scikit-learn/.test(row.tool);
      if (isPython && !hasPythonPeer) continue;
      if (row.status === 'SKIP' && /^ml-hclust/.test(row.tool)) {
        // Above its size limit ml-hclust is skipped, and the note must say why and how long it would take.
        expect(row.note).toMatch(/ml-hclust skipped above n = \d+: it is cubic in n \(it took \d+ ms at n = \d+/);
        continue;
      }
      expect(Number.isFinite(row.peerMs) && row.peerMs > 0, `${row.case} / ${row.tool}: ${row.note}`).toBe(true);
      if (Number.isFinite(row.kinsortMs)) expect(row.ratio).toBeCloseTo(row.kinsortMs / row.peerMs, 9);
    }
  }, 180_000);

  it('takes the ml-hclust skip path in quick mode too (the main hierarchy cases are above its quick limit)', () => {
    const skipped = lines().filter((l) => l.type === 'case' && /^ml-hclust/.test(l.tool) && l.status === 'SKIP');
    expect(skipped.map((r) => r.case).sort()).toEqual(['average', 'ward']);
  }, 180_000);

  it('reports the memory case with a peak resident size, and growth per doubling for scaling', () => {
    const memory = lines().find((l) => l.case === 'ward-memory' && l.tool === '(limits only)')!;
    if (typeof kinsort.agglomerate === 'function') expect(memory.peakMB).toBeGreaterThan(10);
    const scaling = lines().filter((l) => l.type === 'scaling');
    expect(scaling.length).toBeGreaterThanOrEqual(6);
    for (const s of scaling) {
      expect(s.sizes).toEqual([s.sizes[0], 2 * s.sizes[0], 4 * s.sizes[0]]);
      if (s.ms.every((x: number | null) => x !== null)) expect(s.growthPerDoubling).toBeCloseTo(Math.sqrt(s.ms[2] / s.ms[0]), 9);
    }
  }, 180_000);

  it('turns into the Markdown tables of BENCH.md, one table row per case row and scaling row', () => {
    const { toMarkdown } = require(path.join(ROOT, 'bench', 'markdown.js'));
    const md: string = toMarkdown(lines());
    const tableRows = md.split('\n').filter((l) => l.startsWith('| ') && !l.startsWith('| case'));
    expect(tableRows.length).toBe(lines().filter((l) => l.type !== 'machine').length);
  }, 180_000);

  it('prints the table for people as well', () => {
    lines();
    expect(result.stdout).toMatch(/kinsort ÷ peer/);
    expect(result.stdout).toMatch(/growth per doubling/);
  }, 180_000);
});
