// The command line under bad input (node bin/kinsort.js on the built dist/): every case prints one
// line starting "kinsort:" to standard error, never a stack trace or an internal error, and exits
// with status 2. Data of our own making (test/segments/definition-data.ts, seeded).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { riders, toCsv } from '../segments/definition-data';
import { buildDistIfMissing, cliIn } from '../cli/cli-runner';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-cli-bad-'));
const at = (name: string) => join(dir, name);

const kinsort = cliIn(dir);

/** Exit 2, one line on stderr starting "kinsort:", no stack, no internal error, mentioning each part. */
function expectOneLineRefusal(r: ReturnType<typeof kinsort>, ...mention: (string | RegExp)[]) {
  expect(r.status, r.stderr).toBe(2);
  const lines = r.stderr.split('\n').filter((l) => l.length > 0);
  expect(lines.length, r.stderr).toBe(1);
  expect(lines[0]).toMatch(/^kinsort: /);
  expect(lines[0]).not.toMatch(/internal error|TypeError|RangeError|\s+at\s+\S+ \(/);
  for (const m of mention) typeof m === 'string' ? expect(lines[0]).toContain(m) : expect(lines[0]).toMatch(m);
}

const FIT = (data: string, ...more: string[]) => [
  'fit',
  at(data),
  '--id',
  'rider',
  '--use',
  'trips,peak,tenure',
  '--method',
  'kmeans',
  '--k',
  '3',
  '--out',
  at('def.json'),
  ...more,
];

beforeAll(() => {
  buildDistIfMissing();
  const good = riders(60, 41);
  writeFileSync(at('good.csv'), toCsv(good));
  const withNaN = good.map((r) => ({ ...r }));
  writeFileSync(at('nan.csv'), toCsv(withNaN).replace(/\nr0005,[^,]*,/, '\nr0005,NaN,'));
  writeFileSync(at('inf.csv'), toCsv(withNaN).replace(/\nr0007,[^,]*,/, '\nr0007,Infinity,'));
  writeFileSync(at('text.csv'), toCsv(withNaN).replace(/\nr0009,[^,]*,/, '\nr0009,lots,'));
  writeFileSync(at('huge.csv'), toCsv(good.map((r, i) => ({ ...r, trips: ((i % 3) - 1) * 1e300 + (i % 3) * 1e299 }))));
  writeFileSync(at('empty.csv'), '');
  writeFileSync(at('header.csv'), 'rider,trips,peak,tenure\n');
  writeFileSync(at('ragged.csv'), 'rider,trips,peak,tenure\nr1,1,2,3\nr2,1,2\n');
  writeFileSync(at('one.csv'), 'rider,trips,peak,tenure\nr1,1,0.2,3\n');
  writeFileSync(at('same.csv'), 'rider,trips,peak,tenure\n' + Array.from({ length: 5 }, (_, i) => `r${i},1,0.2,3`).join('\n') + '\n');
  writeFileSync(at('dup.csv'), toCsv(good).replace('r0002', 'r0001'));
  writeFileSync(at('bom.csv'), '\uFEFF' + toCsv(good).replace(/\n/g, (m, off: number) => (off % 3 === 0 ? '\r\n' : m)));
  writeFileSync(at('unicode.csv'), toCsv(good.map((r, i) => ({ ...r, rider: `名前-${'é'.repeat(2000)}-${i}` }))));
  const fitted = kinsort(...FIT('good.csv'));
  if (fitted.status !== 0) throw new Error(fitted.stderr);
  const def = readFileSync(at('def.json'), 'utf8');
  writeFileSync(at('truncated.json'), def.slice(0, Math.floor(def.length / 2)));
  writeFileSync(at('nokind.json'), def.replace('"kind"', '"kinds"'));
  writeFileSync(at('nan-centre.json'), def.replace(/"center": \[\s*(-?[\d.e+-]+)/, '"center": ["NaN"'));
  writeFileSync(at('not-json.json'), 'segments: 3\n');
}, 180_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('kinsort fit refuses bad data in one line, exit 2', () => {
  it('NaN, Infinity and text in a numeric column name the line / id and the column', () => {
    // NaN is a missing-value marker: refused under the default policy, naming the row id.
    expectOneLineRefusal(kinsort(...FIT('nan.csv')), 'r0005', 'trips');
    expectOneLineRefusal(kinsort(...FIT('inf.csv')), 'r0007', 'trips');
    expectOneLineRefusal(kinsort(...FIT('text.csv')), 'r0009', 'trips', '"lots"');
  });
  it('1e300 values are refused naming the column', () => {
    expectOneLineRefusal(kinsort(...FIT('huge.csv')), '"trips"');
  });
  it('empty file, header only, ragged rows, one row, identical rows, duplicate ids', () => {
    expectOneLineRefusal(kinsort(...FIT('empty.csv')), 'empty');
    expectOneLineRefusal(kinsort(...FIT('header.csv')), 'no rows');
    expectOneLineRefusal(kinsort(...FIT('ragged.csv')), 'line 3');
    expectOneLineRefusal(kinsort(...FIT('one.csv')), /constant|only 1|at most/);
    expectOneLineRefusal(kinsort(...FIT('same.csv')), /constant|distinct/);
    expectOneLineRefusal(kinsort(...FIT('dup.csv')), '"r0001"', 'twice');
  });
  it('k out of range, unknown method, metric, scale and option names with a "did you mean"', () => {
    expectOneLineRefusal(kinsort(...FIT('good.csv').map((a) => (a === '3' ? '999' : a))), /999|at most/);
    expectOneLineRefusal(kinsort(...FIT('good.csv').map((a) => (a === '3' ? 'three' : a))), 'three');
    expectOneLineRefusal(kinsort(...FIT('good.csv').map((a) => (a === 'kmeans' ? 'kmean' : a))), 'Did you mean "kmeans"');
    expectOneLineRefusal(kinsort(...FIT('good.csv', '--scale', 'z-score')), 'Did you mean "zscore"');
    expectOneLineRefusal(kinsort(...FIT('good.csv', '--restart', '3')), 'Did you mean "--restarts"');
    expectOneLineRefusal(kinsort(...FIT('good.csv').map((a) => (a === 'trips,peak,tenure' ? 'trip,peak' : a))), 'Did you mean "trips"');
    expectOneLineRefusal(kinsort('fitt'), 'Did you mean "fit"');
    expectOneLineRefusal(kinsort(...FIT('missing-file.csv')), 'missing-file.csv');
  });
  it('a BOM with mixed line endings and 2,000-character unicode ids fit normally', () => {
    expect(kinsort(...FIT('bom.csv')).status).toBe(0);
    const r = kinsort(...FIT('unicode.csv').map((a) => (a.endsWith('def.json') ? at('u.json') : a)));
    expect(r.status, r.stderr).toBe(0);
  });
});

describe('kinsort assign and sql refuse damaged definition files in one line, exit 2', () => {
  it.each(['truncated.json', 'nokind.json', 'nan-centre.json', 'not-json.json', 'absent.json'])('%s', (file) => {
    expectOneLineRefusal(kinsort('assign', at(file), at('good.csv')));
    expectOneLineRefusal(kinsort('sql', at(file), '--table', 'riders'));
  });
  it('assign on data lacking a used column names it with a suggestion', () => {
    writeFileSync(at('lacking.csv'), 'rider,trip,peak,tenure\nr1,1,0.2,3\n');
    expectOneLineRefusal(kinsort('assign', at('def.json'), at('lacking.csv')), '"trips"');
  });
});
