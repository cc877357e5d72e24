// The kinsort command line, run as a child process (node bin/kinsort.js, on the built dist/).
// Results are compared with the functional core called in-process on the same files; data of our
// own making (test/segments/definition-data.ts, fixed seeds).
import { mkdtempSync, readFileSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readCsvFile } from '../../src/table';
import { prepareTable } from '../../src/prepare';
import { kmeans } from '../../src/methods/partition';
import { loadDefinition } from '../../src/study/definition-handle';
import { riders, toCsv } from '../segments/definition-data';
import { REPO_ROOT, buildDistIfMissing, cliIn } from './cli-runner';

const root = REPO_ROOT;
const dir = mkdtempSync(join(tmpdir(), 'kinsort-cli-'));
const train = join(dir, 'train.csv');
const fresh = join(dir, 'new.csv');

const kinsort = cliIn(dir);

const FIT = [
  'fit',
  train,
  '--id',
  'rider',
  '--use',
  'trips,peak,tenure,fare,autopay',
  '--keep',
  'postcode',
  '--log',
  'trips',
  '--method',
  'kmeans',
  '--k',
  '4',
  '--seed',
  '9',
  '--restarts',
  '3',
];

beforeAll(() => {
  // `npm test` builds dist/ first; running this folder alone builds it when absent.
  buildDistIfMissing();
  writeFileSync(train, toCsv(riders(150, 13)));
  const rows = riders(30, 14, 'n').map((r) => ({ ...r, comment: 'extra' }));
  rows[2].trips = null;
  rows[6].fare = 'night-owl';
  writeFileSync(fresh, toCsv(rows));
}, 120_000);

describe('kinsort fit', () => {
  it('writes a byte-identical definition for the same inputs and seed, and prints sizes, withinSS and silhouette', () => {
    const a = kinsort(...FIT, '--out', 'a.json');
    const b = kinsort(...FIT, '--out', 'b.json');
    expect(a.status).toBe(0);
    expect(b.status).toBe(0);
    const textA = readFileSync(join(dir, 'a.json'), 'utf8');
    expect(readFileSync(join(dir, 'b.json'), 'utf8')).toBe(textA);
    expect(a.stdout).toMatch(/segment sizes: 1: \d+, 2: \d+, 3: \d+, 4: \d+/);
    expect(a.stdout).toMatch(/within-segment sum of squares: \d/);
    expect(a.stdout).toMatch(/average silhouette \(euclidean\): 0\.\d+/);
    // The stored centres are those of kmeans() on the same prepared table (functional core, in-process).
    const prepared = prepareTable(readCsvFile(train), {
      id: 'rider',
      use: ['trips', 'peak', 'tenure', 'fare', 'autopay'],
      keep: ['postcode'],
      log: ['trips'],
    });
    const fit = kmeans(prepared.matrix, { k: 4, seed: 9, restarts: 3 });
    const def = loadDefinition(join(dir, 'a.json')).definition;
    expect(def.segments.map((s) => s.center)).toEqual(fit.centers);
    // The package version is read from package.json by the built code in dist/ too.
    expect(def.writtenBy).toBe(`kinsort ${JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version}`);
    expect(a.stdout).toContain(`sizes: ${fit.sizes.map((s, c) => `${c + 1}: ${s}`).join(', ')}`);
    expect(a.stdout).toContain(`within-segment sum of squares: ${Number(fit.withinSS.toPrecision(6))}`);
  });

  it('fits k-medoids and a hierarchy cut', () => {
    const use = ['--id', 'rider', '--use', 'trips,peak,tenure', '--k', '3'];
    const m = kinsort('fit', train, ...use, '--method', 'kmedoids', '--metric', 'manhattan', '--out', 'm.json');
    expect(m.status, m.stderr).toBe(0);
    expect(m.stdout).toMatch(/total distance to the medoids/);
    const md = loadDefinition(join(dir, 'm.json')).definition;
    expect(md.rule).toBe('nearest-medoid');
    expect(md.metric).toBe('manhattan');
    expect(md.segments.every((s) => typeof s.medoidId === 'string')).toBe(true);
    const h = kinsort('fit', train, ...use, '--method', 'hierarchy', '--linkage', 'average', '--out', 'h.json');
    expect(h.status, h.stderr).toBe(0);
    const hd = loadDefinition(join(dir, 'h.json')).definition;
    expect(hd.rule).toBe('nearest-center');
    expect(hd.method.options).toEqual({ k: 3, linkage: 'average', metric: 'euclidean' });
  });
});

describe('kinsort assign and sql', () => {
  beforeAll(() => {
    kinsort(...FIT, '--out', 'def.json');
  });

  it('scores the training rows with the fitted segments', () => {
    const r = kinsort('assign', 'def.json', train, '--out', 'scored.csv');
    expect(r.status, r.stderr).toBe(0);
    const prepared = prepareTable(readCsvFile(train), {
      id: 'rider',
      use: ['trips', 'peak', 'tenure', 'fare', 'autopay'],
      keep: ['postcode'],
      log: ['trips'],
    });
    const fit = kmeans(prepared.matrix, { k: 4, seed: 9, restarts: 3 });
    const lines = readFileSync(join(dir, 'scored.csv'), 'utf8').trim().split('\n');
    expect(lines[0]).toBe('rider,segment,distance,far');
    expect(lines.slice(1).map((l) => l.split(',')[0])).toEqual(prepared.ids);
    expect(lines.slice(1).map((l) => Number(l.split(',')[1]))).toEqual(Array.from(fit.assignment, (s) => s + 1));
  });

  it('keeps every new row, names refused ones by id, reports the unseen level and the extra column once', () => {
    const r = kinsort('assign', 'def.json', fresh);
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines).toHaveLength(31);
    expect(lines[3]).toBe('n0003,,,');
    expect(r.stderr).toMatch(/no segment for n0003: missing value in trips/);
    expect(r.stderr).toMatch(/category level never seen/);
    expect(r.stderr.match(/comment/g)).toHaveLength(1);
    const inProcess = loadDefinition(join(dir, 'def.json')).assign(readCsvFile(fresh));
    expect(lines.slice(1).map((l) => l.split(',')[1])).toEqual(inProcess.rows.map((x) => (x.segment === null ? '' : String(x.segment))));
  });

  it('prints the same SQL as toSql', () => {
    const r = kinsort('sql', 'def.json', '--table', 'riders');
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toBe(loadDefinition(join(dir, 'def.json')).toSql({ table: 'riders' }));
  });
});

describe('kinsort errors and help', () => {
  const oneLineNoStack = (r: { status: number | null; stderr: string }) => {
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^kinsort: /);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  };

  it('refuses an unknown option or command with a did-you-mean', () => {
    const r = kinsort(...FIT, '--out', 'x.json', '--restart', '2');
    oneLineNoStack(r);
    expect(r.stderr).toMatch(/unknown option "--restart"\. Did you mean "--restarts"\?/);
    const c = kinsort('asign', 'def.json', fresh);
    oneLineNoStack(c);
    expect(c.stderr).toMatch(/Did you mean "assign"\?/);
  });

  it('names a missing column, a bad value, a damaged definition and a missing file', () => {
    writeFileSync(join(dir, 'lacking.csv'), 'rider,trips,tenure,fare,autopay\nz1,3,2,standard,yes\n');
    const lacking = kinsort('assign', 'def.json', 'lacking.csv');
    oneLineNoStack(lacking);
    expect(lacking.stderr).toMatch(/lack column "peak"/);
    const k = kinsort('fit', train, '--id', 'rider', '--use', 'trips', '--method', 'kmeans', '--k', 'four', '--out', 'x.json');
    oneLineNoStack(k);
    expect(k.stderr).toMatch(/--k must be a whole number ≥ 1; got "four"/);
    const method = kinsort('fit', train, '--id', 'rider', '--use', 'trips', '--method', 'kmean', '--k', '2', '--out', 'x.json');
    oneLineNoStack(method);
    expect(method.stderr).toMatch(/Did you mean "kmeans"\?/);
    const damaged = readFileSync(join(dir, 'def.json'), 'utf8').replace('"formatVersion": 3', '"formatVersion": 7');
    writeFileSync(join(dir, 'newer.json'), damaged);
    const newer = kinsort('sql', 'newer.json', '--table', 't');
    oneLineNoStack(newer);
    expect(newer.stderr).toMatch(/format 7; this kinsort .* reads formats up to 3 — upgrade/);
    const gone = kinsort('assign', 'nothing.json', fresh);
    oneLineNoStack(gone);
    expect(gone.stderr).toMatch(/cannot read "nothing\.json"/);
    oneLineNoStack(kinsort('sql', 'def.json'));
  });

  it('prints help for each command and exits 0', () => {
    for (const command of ['fit', 'assign', 'sql']) {
      const r = kinsort(command, '--help');
      expect(r.status).toBe(0);
      expect(r.stdout).toContain(`kinsort ${command} `);
    }
    const main = kinsort('--help');
    expect(main.status).toBe(0);
    expect(main.stdout).toMatch(/kinsort fit[\s\S]*kinsort assign[\s\S]*kinsort sql/);
  });
});
