// One definition, scored by assign and by its SQL on four real engines — DuckDB (embedded,
// @duckdb/node-api), PostgreSQL 15 (a server on loopback, pg), SQLite 3 (better-sqlite3) and
// ClickHouse 18.16 (two server processes as two shards behind a Distributed table) — must give
// every row the same segment and distance. Outside checks: the engines themselves; the text rule
// is kinsort-text-1 (docs/stored-schema.md). Tables hold every cell as text, as loaded from CSV.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { kmeans } from '../../src/methods/partition';
import { prepareTable, type PrepareOptions } from '../../src/prepare';
import { buildDefinition, loadDefinition, type DefinitionHandle } from '../../src/segments/definition-exports';
import { serverAvailable, useServer } from '../servers/servers';
import { clickhouseTestEngine, duckdbTestEngine, postgresTestEngine, sqliteTestEngine, type TestEngine } from './adapters';
import { asRecords, expectSameEverywhere, type TextRows } from './score-everywhere';

const pg = serverAvailable.postgres ? useServer('postgres') : undefined;
const ch = serverAvailable.clickhouse ? useServer('clickhouse') : undefined;
const engines: TestEngine[] = [];

beforeAll(async () => {
  engines.push(await duckdbTestEngine(), await sqliteTestEngine());
  if (pg) engines.push(await postgresTestEngine(pg.server));
  if (ch) engines.push(clickhouseTestEngine(ch.server));
}, 120_000);
afterAll(async () => {
  for (const e of engines) await e.close();
});

function fit(columns: readonly string[], rows: TextRows, options: PrepareOptions, k: number, seed = 3): DefinitionHandle {
  const prepared = prepareTable(asRecords(columns, rows), options);
  const result = kmeans(prepared.matrix, { k, seed, restarts: 2 });
  return loadDefinition(
    buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'kmeans', options: { k, seed } },
      centers: result.centers,
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: result.assignment },
    }),
  );
}

const COLUMNS = ['rider', 'trips', 'spend', 'zone', 'autopay'];
const OPTIONS: PrepareOptions = {
  id: 'rider',
  use: ['trips', 'spend', 'zone', 'autopay'],
  types: { trips: 'numeric', spend: 'numeric', zone: 'categorical', autopay: 'binary' },
  log: ['spend'],
  weights: { zone: 0.7 },
};

/** Training rows: valid under the text rule, with codes, padding, markers and tiny/huge figures. */
function training(n: number): (string | null)[][] {
  const zones = ['01', '1', '02134', 'Zürich', 'a\u00a0b', ' 1'];
  const trips = (i: number) => [`${(i * 7) % 23}`, ` ${(i % 5) + 0.25} `, `${i}e-1`, '1e-17', '5e-324', '-0', `${i * 1000}.5`][i % 7];
  const spend = (i: number) => [`${(i * 13) % 40}.5`, '3e-17', '0', `  ${i}`, '12345.678', '1E2'][i % 6];
  const autopay = (i: number) => ['true', 'FALSE', 'True', 'false'][i % 4];
  return Array.from({ length: n }, (_, i) => [`r-${String(i).padStart(3, '0')}`, trips(i), spend(i), zones[(i * 5) % zones.length], autopay(i)]);
}

/** New rows with every awkward text the rule must treat as assign does. */
const AWKWARD: (string | null)[][] = [
  ['n-tab', '\t3', '1', '01', 'true'], // tab is not trimmed: not a number, refused
  ['n-nbsp', '3\u00a0', '1', '01', 'true'],
  ['n-plus', '+3', '1', '01', 'true'],
  ['n-zero-code', '007', '1', '01', 'true'],
  ['n-dot', '1.', '1', '01', 'true'],
  ['n-lead-dot', '.5', '1', '01', 'true'],
  ['n-inf', 'Infinity', '1', '01', 'true'],
  ['n-overflow', '1e400', '1', '01', 'true'],
  ['n-max', '1.7976931348623157e308', '1', '01', 'true'],
  ['n-beyond-max', '1.7976931348623159e308', '1', '01', 'true'],
  ['n-underflow', '1e-400', '1', '01', 'true'],
  ['n-half-subnormal', '2.4703282292062328e-324', '1', '01', 'true'],
  ['n-huge-exponent', '1e99999', '1', '01', 'true'],
  ['n-zero-huge-exponent', '0.0e99999', '1', '01', 'true'],
  ['n-spaces', '   4.5   ', ' 7 ', '1', 'TRUE'],
  ['n-marker-padded', ' NA ', '1', '1', 'false'],
  ['n-marker-case', 'Na', '1', '1', 'false'], // not a marker: text in a numeric column
  ['n-markers', 'n/a', '#N/A', 'NULL', 'nan'],
  ['n-empty', '', '  ', null, 'true'],
  ['n-null', null, '2', '02134', 'FALSE'],
  ['n-log-negative', '2', '-1', '02134', 'FALSE'],
  ['n-log-tiny', '2', '1e-17', '02134', 'FALSE'],
  ['n-zone-padded', '2', '3', '1 ', 'FALSE'],
  ['n-zone-unseen', '2', '3', '2134', 'fAlSe'],
  ['n-zone-unicode', '2', '3', 'Zu\u0308rich', 'true'],
  ['n-binary-padded', '2', '3', '01', ' true'],
  ['n-binary-other', '2', '3', '01', 'yes'],
  ["n-quote'd\\", '2', '3', "o'brien\\", 'true'],
  ['n-東京-🚇', '2', '3', '01', 'true'],
  ['n-exp', '-1.25E-3', '2e+2', 'a\u00a0b', 'True'],
];

describe(`scoring SQL on ${['DuckDB', 'SQLite', pg && 'PostgreSQL 15', ch && 'ClickHouse 18.16 (two shards)'].filter(Boolean).join(', ')}`, () => {
  it('every awkward cell means what it means to assign, on every engine', async () => {
    const handle = fit(COLUMNS, training(60), OPTIONS, 3);
    await expectSameEverywhere(handle, engines, 'riders_train', COLUMNS, training(60));
    await expectSameEverywhere(handle, engines, 'riders_new', COLUMNS, AWKWARD);
    const refused = handle.assign(asRecords(COLUMNS, AWKWARD)).report.refused.map((r) => r.id);
    expect(refused).toEqual(expect.arrayContaining(['n-tab', 'n-nbsp', 'n-plus', 'n-zero-code', 'n-inf', 'n-overflow', 'n-beyond-max', 'n-huge-exponent', 'n-log-negative', 'n-binary-other']));
  });

  it('median fills and robust scaling; a decimal comma is text unless the definition stores that mark', async () => {
    const handle = fit(COLUMNS, training(40), { ...OPTIONS, missing: 'median', scale: 'robust' }, 4, 9);
    await expectSameEverywhere(handle, engines, 'riders_median', COLUMNS, [...AWKWARD, ['n-comma', '1,5', '1', '01', 'true']]);
  });
});
