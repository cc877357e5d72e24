// Bounded, seeded fuzzing of the command line's arguments (in-process, through run()): any
// argument list ends with status 0 or 2, and a refusal is exactly one line starting "kinsort:",
// never an internal error or a stack, with no raw control character reaching the terminal.
// Files come from a fixed pool in a temporary folder (data of our own making, seeded riders);
// every --out is redirected into that folder so the fuzzer never writes elsewhere.
import fc from 'fast-check';
import { execFileSync } from 'child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { run } from '../../src/cli/main';
import { riders, toCsv } from '../segments/definition-data';

const TIME_LIMIT_MS = Number(process.env.KINSORT_FUZZ_MS ?? 3000);
const dir = mkdtempSync(join(tmpdir(), 'kinsort-fuzz-cli-'));
const at = (name: string) => join(dir, name);

beforeAll(() => {
  writeFileSync(at('d.csv'), toCsv(riders(24, 3)));
  const evil = riders(24, 4).map((r, i) => ({ ...r, rider: i % 5 === 0 ? `=x${i}\u001b[31m\n@` : r.rider }));
  writeFileSync(at('evil.csv'), toCsv(evil));
  execFileSync('mkfifo', [at('fifo')]);
  const io = {
    out: () => {},
    err: (t: string) => {
      throw new Error(t);
    },
  };
  run(['fit', at('d.csv'), '--id', 'rider', '--use', 'trips,peak', '--method', 'kmeans', '--k', '2', '--out', at('def.json')], io);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const WORDS = [
  'fit',
  'assign',
  'sql',
  'help',
  'constructor',
  'toString',
  '__proto__',
  'hasOwnProperty',
  'valueOf',
  'prototype',
  '--id',
  '--use',
  '--keep',
  '--method',
  '--k',
  '--linkage',
  '--metric',
  '--scale',
  '--missing',
  '--log',
  '--seed',
  '--restarts',
  '--note',
  '--out',
  '--for',
  '--silhouette',
  '--table',
  '--id-column',
  '--help',
  '-h',
  '--',
  '-',
  '--k=2',
  '--__proto__',
  '--constructor',
  '--toString',
  '--out=x',
  '--for=database',
  'rider',
  'trips',
  'peak',
  'trips,peak',
  'trips,,peak',
  'kmeans',
  'kmedoids',
  'hierarchy',
  'ward',
  'euclidean',
  'manhattan',
  'zscore',
  'drop',
  'median',
  'spreadsheet',
  'database',
  'sample',
  'full',
  '2',
  '3',
  '0',
  '-1',
  '1e3',
  '99999',
  'NaN',
  '',
  ' ',
  'x\u001b[2J',
  'a\nb',
  '\r',
  'é名😀',
  '\u202e',
  'x'.repeat(300),
];
const FILES = ['d.csv', 'evil.csv', 'def.json', 'fifo', 'absent.csv', 'folder/'].map((f) => (f === 'folder/' ? dir : at(f)));
const token = fc.oneof(
  fc.constantFrom(...WORDS),
  fc.constantFrom(...FILES),
  fc.constantFrom('/dev/zero', '/proc/nope/x.json'),
  fc.string({ maxLength: 6 }),
);

/** Every --out value goes into the temporary folder. */
function confine(args: string[]): string[] {
  return args.map((a, i) => (a.startsWith('--out=') ? `--out=${at('o.txt')}` : i > 0 && args[i - 1] === '--out' ? at('o.txt') : a));
}

describe('command-line argument fuzz (run() in-process, bounded time, seeded)', () => {
  it('any argument list: status 0 or 2; a refusal is one clean line', () => {
    let runs = 0;
    let refused = 0;
    fc.assert(
      fc.property(fc.array(token, { maxLength: 12 }), (raw) => {
        runs++;
        const args = confine(raw);
        let out = '';
        let err = '';
        const status = run(args, { out: (t) => void (out += t), err: (t) => void (err += t) });
        expect([0, 2]).toContain(status);
        if (status === 2 && err !== '' && !out.startsWith('kinsort —')) {
          refused++;
          expect(err.endsWith('\n')).toBe(true);
          const line = err.slice(0, -1);
          expect(line.includes('\n'), err).toBe(false);
          expect(line).toMatch(/^kinsort: /);
          expect(line).not.toMatch(/internal error|TypeError|RangeError|ReferenceError|\bat \S+ \(/);
          expect(line).not.toMatch(/[\u0000-\u001f\u007f-\u009f\u202a-\u202e]/);
        }
        // Summaries on the terminal carry no raw control characters either (the CSV is data).
        if (status === 0 && !args.includes('assign')) expect(out).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/);
      }),
      { seed: 1414, numRuns: 1_000_000, interruptAfterTimeLimit: TIME_LIMIT_MS },
    );
    expect(runs).toBeGreaterThan(30);
    expect(refused).toBeGreaterThan(0);
  }, 60_000);

  it('commands built around valid ones: only one-line refusals or success', () => {
    let runs = 0;
    const base = ['fit', at('evil.csv'), '--id', 'rider', '--use', 'trips,peak', '--method', 'kmeans', '--k', '2', '--out', at('f.json')];
    fc.assert(
      fc.property(fc.integer({ min: 0, max: base.length }), fc.array(token, { maxLength: 3 }), fc.boolean(), (where, extra, swap) => {
        runs++;
        const args = confine(
          swap ? ['assign', at('def.json'), at('evil.csv'), ...extra] : [...base.slice(0, where), ...extra, ...base.slice(where)],
        );
        let err = '';
        const status = run(args, { out: () => {}, err: (t) => void (err += t) });
        expect([0, 2]).toContain(status);
        if (status === 2) {
          expect(err.split('\n').filter(Boolean)).toHaveLength(1);
          expect(err).not.toMatch(/internal error/);
        }
        expect(err).not.toMatch(/\u001b/);
      }),
      { seed: 2026, numRuns: 1_000_000, interruptAfterTimeLimit: TIME_LIMIT_MS },
    );
    expect(runs).toBeGreaterThan(20);
  }, 60_000);
});
