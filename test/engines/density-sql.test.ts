// Density definitions (rule nearest-dense-row) scored by assign and by their SQL on DuckDB, SQLite,
// PostgreSQL 15 and ClickHouse 18.16 (two shards behind a Distributed table): every row gets the same
// segment (0 for noise), distance to 1e-9 relative and far flag. Outside checks: the engines.
// The stored-row guard of toSql is checked too.
import { describe, expect, it } from 'vitest';
import { prepareTable, type PrepareOptions } from '../../src/prepare';
import { densitySegments } from '../../src/methods/density';
import { buildDensityDefinition } from '../../src/segments/definition-dense-build';
import { loadDefinition, type DefinitionHandle } from '../../src/study/definition-handle';
import { takeRows } from '../../src/core/matrix';
import { segmentMeans } from '../../src/study/centres';
import { createRandom } from '../../src/random';
import { engineTitles, useDatabaseEngines } from '../database/database-engines';
import { asRecords, expectSameEverywhere, type TextRows } from './score-everywhere';

// The four engines (servers started once for the file; see test/database/database-engines.ts).
const engines = useDatabaseEngines().all;

const COLUMNS = ['stop', 'boardings', 'spend', 'zone'];
const OPTIONS: PrepareOptions = {
  id: 'stop',
  use: ['boardings', 'spend', 'zone'],
  types: { boardings: 'numeric', spend: 'numeric', zone: 'categorical' },
  log: ['spend'],
};

/** Three dense groups and a few scattered rows, as text cells. */
function rowsOf(prefix: string, seed: number, groups: number, scattered: number): (string | null)[][] {
  const r = createRandom(seed);
  const out: (string | null)[][] = [];
  for (let g = 0; g < 3; g++)
    for (let i = 0; i < groups; i++)
      out.push([`${prefix}${g}-${i}`, String(10 + 20 * g + r.normal()), String(5 + 40 * g + Math.abs(2 * r.normal())), ['a', 'b', 'c'][g]]);
  for (let i = 0; i < scattered; i++) out.push([`${prefix}x-${i}`, String(120 * r.next()), String(300 * r.next()), ['a', 'b', 'c'][i % 3]]);
  return out;
}

function fitDensity(rows: TextRows, metric: 'euclidean' | 'manhattan' | 'sqeuclidean'): DefinitionHandle {
  const prepared = prepareTable(asRecords(COLUMNS, rows), { ...OPTIONS, scale: 'zscore' });
  const fit = densitySegments(prepared.matrix, { minSize: 8, minSamples: 5, metric });
  const kept = [...fit.assignment.keys()].filter((i) => fit.assignment[i] >= 0);
  const means = segmentMeans(
    takeRows(prepared.matrix, kept),
    Int32Array.from(kept, (i) => fit.assignment[i]),
    fit.segmentCount,
  );
  const built = buildDensityDefinition({
    preparation: prepared.preparation,
    options: { minSize: 8, minSamples: 5, metric },
    metric,
    training: { ids: prepared.ids, matrix: prepared.matrix, assignment: fit.assignment, coreDistances: fit.coreDistances },
    centers: means.centers,
    segments: [],
    featureNames: prepared.featureNames,
  });
  return loadDefinition(JSON.stringify(built));
}

describe(`density SQL on ${engineTitles}`, () => {
  for (const metric of ['euclidean', 'manhattan', 'sqeuclidean'] as const) {
    it(`nearest-dense-row, ${metric}: segment, noise, distance and far as assign gives them`, async () => {
      const handle = fitDensity(rowsOf('t', 7, 25, 8), metric);
      expect(handle.definition.rule).toBe('nearest-dense-row');
      const fresh = [...rowsOf('t', 7, 25, 8), ...rowsOf('n', 99, 6, 12), ['n-missing', null, '3', 'a'], ['n-text', 'many', '3', 'b']];
      const outcome = handle.assign(asRecords(COLUMNS, fresh));
      // The new rows hold both members and noise, so both branches of the SQL are exercised.
      expect(outcome.rows.some((r) => r.segment === 0)).toBe(true);
      expect(outcome.rows.some((r) => r.segment !== null && r.segment > 0)).toBe(true);
      await expectSameEverywhere(handle, engines, `density_${metric}`, COLUMNS, fresh);
    }, 120_000);
  }

  it('refuses to write SQL for more stored rows than one statement holds', () => {
    const handle = fitDensity(rowsOf('t', 3, 400, 0), 'euclidean');
    expect(handle.definition.denseRows!.values.length).toBeGreaterThan(1000);
    expect(() => handle.toSql({ table: 't', dialect: 'duckdb' })).toThrow(/at most 1000 stored rows/);
  });
});
