// The command line under hostile input (issue 14), run as a child process on the built dist/:
// names that plain objects inherit, outputs that would overwrite inputs, repeated flags, ids that
// carry line breaks or terminal escapes, formula-looking ids in the scored CSV, special files, and
// the summary silhouette on many rows. Data of our own making (seeded riders, hand-made tables).
import { execFileSync } from 'child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readTable } from '../../src';
import { readsAsFormula, scoredCsv } from '../../src/cli/csv-out';
import type { AssignmentOutcome } from '../../src/segments/assign-rows';
import { riders, toCsv } from '../segments/definition-data';
import { buildDistIfMissing, cliIn } from '../cli/cli-runner';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-cli-hostile-'));
const at = (name: string) => join(dir, name);

// A generous timeout: any case here that hangs is a failure, not a wait.
const kinsort = cliIn(dir, { timeout: 120_000 });

function expectOneLineRefusal(r: ReturnType<typeof kinsort>, ...mention: (string | RegExp)[]) {
  expect(r.status, r.stderr).toBe(2);
  const lines = r.stderr.split('\n').filter((l) => l.length > 0);
  expect(lines.length, r.stderr).toBe(1);
  expect(lines[0]).toMatch(/^kinsort: /);
  expect(lines[0]).not.toMatch(/internal error|TypeError|RangeError|function|\s+at\s+\S+ \(/);
  for (const m of mention) typeof m === 'string' ? expect(lines[0]).toContain(m) : expect(lines[0]).toMatch(m);
}

const USE = ['--id', 'rider', '--use', 'trips,peak,tenure', '--method', 'kmeans', '--k', '3'];

beforeAll(() => {
  buildDistIfMissing();
  writeFileSync(at('good.csv'), toCsv(riders(60, 41)));
  const fit = kinsort('fit', at('good.csv'), ...USE, '--out', at('def.json'));
  if (fit.status !== 0) throw new Error(fit.stderr);
}, 180_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('command names that every plain object inherits are unknown commands', () => {
  it.each(['constructor', 'toString', '__proto__', 'hasOwnProperty', 'valueOf'])('kinsort %s', (name) => {
    expectOneLineRefusal(kinsort(name), `unknown command "${name}"`, 'Commands: fit, assign, sql');
  });
  it('an inherited name as a --metric value is an unknown metric', () => {
    expectOneLineRefusal(
      kinsort(
        'fit',
        at('good.csv'),
        ...USE.map((a) => (a === 'kmeans' ? 'kmedoids' : a)),
        '--metric',
        'constructor',
        '--out',
        at('x.json'),
      ),
      'Unknown metric "constructor"',
    );
  });
});

describe('--out never overwrites an input', () => {
  it('assign --out DEF.json and --out DATA.csv are refused and leave the files as they were', () => {
    const def = readFileSync(at('def.json'), 'utf8');
    const data = readFileSync(at('good.csv'), 'utf8');
    expectOneLineRefusal(kinsort('assign', at('def.json'), at('good.csv'), '--out', at('def.json')), 'definition file');
    expectOneLineRefusal(kinsort('assign', at('def.json'), at('good.csv'), '--out', 'good.csv'), 'data file');
    expect(readFileSync(at('def.json'), 'utf8')).toBe(def);
    expect(readFileSync(at('good.csv'), 'utf8')).toBe(data);
  });
  it('fit --out DATA.csv is refused, also through a symbolic link', () => {
    const data = readFileSync(at('good.csv'), 'utf8');
    expectOneLineRefusal(kinsort('fit', at('good.csv'), ...USE, '--out', at('good.csv')), 'data file');
    symlinkSync(at('good.csv'), at('link.csv'));
    expectOneLineRefusal(kinsort('fit', at('link.csv'), ...USE, '--out', at('good.csv')), 'data file');
    expect(readFileSync(at('good.csv'), 'utf8')).toBe(data);
  });
  it('an --out folder that does not exist is made; an impossible one is refused naming it, without hanging', () => {
    expect(kinsort('fit', at('good.csv'), ...USE, '--out', at('new/folder/def.json')).status).toBe(0);
    expect(existsSync(at('new/folder/def.json'))).toBe(true);
    expectOneLineRefusal(kinsort('fit', at('good.csv'), ...USE, '--out', '/proc/nope/def.json'), '"/proc/nope/def.json"');
  });
});

describe('a repeated flag is refused, not silently the last one', () => {
  it('--k twice, --out twice, --for twice', () => {
    expectOneLineRefusal(kinsort('fit', at('good.csv'), ...USE, '--k', '4', '--out', at('r.json')), '--k is given more than once');
    expectOneLineRefusal(
      kinsort('assign', at('def.json'), at('good.csv'), '--for', 'database', '--for', 'spreadsheet'),
      '--for is given more than once',
    );
    expect(existsSync(at('r.json'))).toBe(false);
  });
});

describe('ids with line breaks and terminal escapes are escaped when echoed', () => {
  const evil = 'x\u001b[2J\nkinsort fit: forged line';
  it('a dropped row named in the fit summary, a refused row in the assign summary, an id in an error', () => {
    const rows = riders(40, 5).map((r, i) => ({ ...r, rider: i === 3 ? evil : r.rider, trips: i === 3 ? null : r.trips }));
    writeFileSync(at('evil.csv'), toCsv(rows));
    const fit = kinsort('fit', at('evil.csv'), ...USE, '--missing', 'drop', '--out', at('evil.json'));
    expect(fit.status, fit.stderr).toBe(0);
    expect(fit.stdout).not.toContain('\u001b');
    expect(fit.stdout.split('\n').some((l) => l.startsWith('kinsort fit: forged'))).toBe(false);
    expect(fit.stdout).toContain('x\\e[2J\\nkinsort fit: forged line');
    const assign = kinsort('assign', at('def.json'), at('evil.csv'), '--out', at('evil-scored.csv'));
    expect(assign.status, assign.stderr).toBe(0);
    expect(assign.stdout).not.toContain('\u001b');
    expect(assign.stdout).toContain('no segment for x\\e[2J\\nkinsort fit: forged line');
    const dup = riders(10, 5).map((r, i) => ({ ...r, rider: i < 2 ? evil : r.rider }));
    writeFileSync(at('evil-dup.csv'), toCsv(dup));
    // Escaped either by the terminal escaper (\e) or inside the message's quoted id (\u001b): never raw.
    expectOneLineRefusal(kinsort('fit', at('evil-dup.csv'), ...USE, '--out', at('d.json')), /x\\(e|u001b)\[2J/);
  });
});

describe('scored CSV: formula-looking ids guarded for a spreadsheet, exact for a database', () => {
  // Leading tabs and carriage returns are trimmed by the CSV reader, so they are checked on
  // scoredCsv itself below.
  const ids = ['=1+2', '+cmd', '-x', '@SUM(A1)', '-1+2', '-12.5', '+3', '1e5', 'plain', "'quoted"];
  const rows = riders(ids.length, 8).map((r, i) => ({ ...r, rider: ids[i] }));
  const scoredIds = (csv: string) => readTable(csv, { types: { rider: 'categorical' } }).columns[0].values;

  it('default (spreadsheet): an apostrophe before each formula-looking id; numbers and plain text as given', () => {
    writeFileSync(at('formula.csv'), toCsv(rows));
    const r = kinsort('assign', at('def.json'), at('formula.csv'));
    expect(r.status, r.stderr).toBe(0);
    expect(scoredIds(r.stdout)).toEqual(["'=1+2", "'+cmd", "'-x", "'@SUM(A1)", "'-1+2", '-12.5', '+3', '1e5', 'plain', "'quoted"]);
    for (const line of r.stdout.split('\n').slice(1)) expect(line).not.toMatch(/^[=@]|^[-+](?![\d.]+,)/);
  });

  it('--for database: every id exactly as given, so the scores join back to the source table', () => {
    const r = kinsort('assign', at('def.json'), at('formula.csv'), '--for', 'database');
    expect(r.status, r.stderr).toBe(0);
    expect(scoredIds(r.stdout)).toEqual(ids);
    expectOneLineRefusal(kinsort('assign', at('def.json'), at('formula.csv'), '--for', 'excel'), '--for', 'spreadsheet, database');
  });

  it('scoredCsv: a leading tab or carriage return is guarded too; database mode writes them as given', () => {
    const outcome = {
      rows: ['\t=1', '\r=1', '\t7'].map((id) => ({ id, segment: 1, distance: 0.5, far: false })),
    } as unknown as AssignmentOutcome;
    expect(scoredCsv('rider', outcome).split('\n').slice(1, 4)).toEqual(["'\t=1,1,0.5,0", '"\'\r=1",1,0.5,0', "'\t7,1,0.5,0"]);
    expect(scoredCsv('rider', outcome, 'database').split('\n').slice(1, 4)).toEqual(['\t=1,1,0.5,0', '"\r=1",1,0.5,0', '\t7,1,0.5,0']);
    expect(['=a', '+a', '-a', '@a', '\ta', '\ra'].every(readsAsFormula)).toBe(true);
    expect(['-1', '+2.5', '-.5e-3', 'a=b', '', ' =x'].some(readsAsFormula)).toBe(false);
  });

  it('--help states the default', () => {
    expect(kinsort('assign', '--help').stdout).toMatch(/--for T\s+spreadsheet \(default\)/);
  });
});

describe('special files and long names', () => {
  it('/dev/zero and a FIFO as data or definition are refused at once', () => {
    execFileSync('mkfifo', [at('fifo.csv')]);
    expectOneLineRefusal(kinsort('fit', '/dev/zero', ...USE, '--out', at('z.json')), 'character device');
    expectOneLineRefusal(kinsort('fit', at('fifo.csv'), ...USE, '--out', at('z.json')), 'named pipe');
    expectOneLineRefusal(kinsort('assign', '/dev/zero', at('good.csv')), 'character device');
    expectOneLineRefusal(kinsort('assign', at('def.json'), at('fifo.csv')), 'named pipe');
  });
  it('a 60,000-character column name is refused without a quadratic suggestion', () => {
    expectOneLineRefusal(
      kinsort('fit', at('good.csv'), ...USE.map((a) => (a === 'trips,peak,tenure' ? 'q'.repeat(60_000) : a)), '--out', at('z.json')),
    );
  });
});

describe('kinsort fit: the summary silhouette on many rows', () => {
  it('above 10,000 rows it is measured on a seeded sample and says so; --silhouette full measures all', () => {
    writeFileSync(at('many.csv'), toCsv(riders(12_000, 77)));
    const sampled = kinsort('fit', at('many.csv'), ...USE, '--seed', '1', '--restarts', '1', '--out', at('many.json'));
    expect(sampled.status, sampled.stderr).toBe(0);
    expect(sampled.stdout).toMatch(
      /average silhouette \(euclidean, on a seeded sample of 10,000 of 12,000 rows; --silhouette full for all\): 0\.\d+/,
    );
    const full = kinsort(
      'fit',
      at('many.csv'),
      ...USE,
      '--seed',
      '1',
      '--restarts',
      '1',
      '--silhouette',
      'full',
      '--out',
      at('many-full.json'),
    );
    expect(full.status, full.stderr).toBe(0);
    expect(full.stdout).toMatch(/average silhouette \(euclidean\): 0\.\d+/);
    const value = (s: string) => Number(/silhouette[^:]*: (0\.\d+)/.exec(s)![1]);
    // The sample is 5/6 of the rows: the two averages agree closely.
    expect(Math.abs(value(sampled.stdout) - value(full.stdout))).toBeLessThan(0.02);
  }, 120_000);

  it('a Ward hierarchy above 10,000 rows states its work up front on standard error, then its progress', () => {
    const r = kinsort('fit', at('many.csv'), ...USE.map((a) => (a === 'kmeans' ? 'hierarchy' : a)), '--out', at('many-tree.json'));
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stderr.trim().split('\n');
    expect(lines[0]).toBe(
      'kinsort fit: ward linkage on 12,000 rows: about 1.4e8 distance evaluations (4.3e8 multiply-adds); the work grows with the square of the rows',
    );
    expect(lines.slice(1)).toEqual(Array.from({ length: 10 }, (_, i) => `kinsort fit: agglomerating, ${(i + 1) * 10}% of merges done`));
  }, 120_000);
});
