// `kinsort sql --dialect`: the command writes the same text as toSql for each dialect, refuses an
// unknown dialect and a hostile table name in one line (node bin/kinsort.js, on the built dist/).
import { mkdtempSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadDefinition } from '../../src/study/definition-handle';
import { riders, toCsv } from '../segments/definition-data';
import { buildDistIfMissing, cliIn } from './cli-runner';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-cli-sql-'));

const kinsort = cliIn(dir);

beforeAll(() => {
  buildDistIfMissing();
  writeFileSync(join(dir, 'train.csv'), toCsv(riders(80, 21)));
  const fit = kinsort(
    'fit',
    'train.csv',
    '--id',
    'rider',
    '--use',
    'trips,peak,fare',
    '--method',
    'kmeans',
    '--k',
    '3',
    '--seed',
    '2',
    '--out',
    'def.json',
  );
  expect(fit.status, fit.stderr).toBe(0);
}, 60_000);

describe('kinsort sql --dialect', () => {
  it('prints toSql for each dialect; duckdb when none is named', () => {
    const handle = loadDefinition(join(dir, 'def.json'));
    for (const dialect of ['duckdb', 'postgres', 'sqlite', 'clickhouse'] as const) {
      const r = kinsort('sql', 'def.json', '--table', 'sales.riders', '--dialect', dialect);
      expect(r.status, r.stderr).toBe(0);
      expect(r.stdout).toBe(handle.toSql({ table: 'sales.riders', dialect }));
    }
    expect(kinsort('sql', 'def.json', '--table', 't').stdout).toBe(handle.toSql({ table: 't', dialect: 'duckdb' }));
    const ch = kinsort('sql', 'def.json', '--table', 't', '--dialect', 'clickhouse').stdout;
    expect(ch).not.toMatch(/^WITH /m);
    expect(ch).toContain('FROM `t`');
  });
  it('refuses an unknown dialect and a table name with quotes, in one line, exit 2', () => {
    const unknown = kinsort('sql', 'def.json', '--table', 't', '--dialect', 'oracle');
    expect(unknown.status).toBe(2);
    expect(unknown.stderr.trim().split('\n')).toHaveLength(1);
    expect(unknown.stderr).toMatch(/--dialect.*duckdb, postgres, sqlite, clickhouse/);
    const hostile = kinsort('sql', 'def.json', '--table', 'x"; DROP TABLE riders; --');
    expect(hostile.status).toBe(2);
    expect(hostile.stderr).toMatch(/quotes or control characters/);
    expect(hostile.stdout).toBe('');
  });
});
