// A mixture definition (the highest-posterior rule), scored by assign and by its SQL on DuckDB,
// SQLite, PostgreSQL 15 and ClickHouse 18.16 (two shards): every row gets the same segment, the
// same Mahalanobis distance and posterior probability (1e-9 relative) and the same far flag, for
// all four covariance shapes, on training rows and on awkward new rows. Outside checks: the
// engines themselves.
import { describe, expect, it } from 'vitest';
import { gaussianMixture, type CovarianceShape } from '../../src/methods/mixture';
import { prepareTable, type PrepareOptions } from '../../src/prepare';
import { buildDefinition } from '../../src/segments/definition-exports';
import { loadDefinition, type DefinitionHandle } from '../../src/study/definition-handle';
import { createRandom } from '../../src/random';
import { engineTitles, useDatabaseEngines } from '../database/database-engines';
import { asRecords, closeEnough, type TextRows } from './score-everywhere';

// The four engines (servers started once for the file; see test/database/database-engines.ts).
const engines = useDatabaseEngines().all;

const COLUMNS = ['holder', 'visits', 'spend', 'tenure', 'zone'];
const OPTIONS: PrepareOptions = {
  id: 'holder',
  use: ['visits', 'spend', 'tenure', 'zone'],
  types: { visits: 'numeric', spend: 'numeric', tenure: 'numeric', zone: 'categorical' },
  log: ['spend'],
  weights: { zone: 0.5 },
  missing: 'median',
};

/** Three loose, differently shaped groups of invented holders (seeded). */
function holders(n: number, seed: number): (string | null)[][] {
  const random = createRandom(seed);
  const zones = ['north', 'south', '01'];
  return Array.from({ length: n }, (_, i) => {
    const g = i % 3;
    const visits = [4, 12, 7][g] + random.normal() * [1, 3, 0.5][g];
    const spend = Math.exp([2, 4, 3][g] + random.normal() * 0.4);
    const tenure = [1, 5, 9][g] + random.normal() * [0.5, 1, 2][g] + 0.3 * visits;
    return [`h-${i}`, visits.toFixed(3), spend.toFixed(2), ` ${tenure.toFixed(4)} `, zones[(i + (random.next() < 0.3 ? 1 : 0)) % 3]];
  });
}

const AWKWARD: TextRows = [
  ['a-missing', 'NA', '12', '3', 'north'], // refused: training had no missing visits, so no median is stored
  ['a-text', 'many', '12', '3', 'north'], // refused
  ['a-unseen', '5', '12', '3', 'east'], // all zone indicators 0
  ['a-far', '400', '1e6', '-50', 'south'],
  ['a-between', '8', '20', '5', 'south'],
  ['a-huge', '1e200', '3', '3', 'south'],
  ['a-tiny', '1e-300', '3e-17', '5e-324', '01'],
  ['a-negative-log', '5', '-3', '3', 'north'], // refused under log1p
];

function fit(shape: CovarianceShape, rows: TextRows, k: number): DefinitionHandle {
  const prepared = prepareTable(asRecords(COLUMNS, rows), OPTIONS);
  const result = gaussianMixture(prepared.matrix, { k, covariance: shape, seed: 4, restarts: 2 });
  return loadDefinition(
    buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'mixture', options: { k, covariance: shape } },
      centers: result.means,
      mixture: { weights: result.weights, covariances: result.covariances },
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: result.assignment },
    }),
  );
}

async function expectSameEverywhere(handle: DefinitionHandle, table: string, rows: TextRows): Promise<void> {
  const outcome = handle.assign(asRecords(COLUMNS, rows));
  for (const engine of engines) {
    await engine.loadText(table, COLUMNS, rows);
    const sqlRows = await engine.query(handle.toSql({ table, engine }));
    expect(sqlRows, engine.dialect).toHaveLength(rows.length);
    const byId = new Map(sqlRows.map((r) => [String(r.holder), r]));
    for (const row of outcome.rows) {
      const s = byId.get(row.id)!;
      const where = `${engine.dialect}, row ${JSON.stringify(row.id)}`;
      expect(s, where).toBeDefined();
      const segment = s.segment === null ? null : Number(s.segment);
      // The PostgreSQL dialect's stated caveat: a prepared feature beyond 1e150 gives NULL there.
      if (engine.dialect === 'postgres' && row.id === 'a-huge' && segment === null) continue;
      expect(segment, `segment, ${where}`).toBe(row.segment);
      if (row.segment === null) {
        expect(s.probability, where).toBeNull();
        continue;
      }
      const distance = Number(s.distance);
      expect(closeEnough(distance, row.distance!), `distance ${distance} vs ${row.distance}, ${where}`).toBe(true);
      if (row.probability === null) expect(s.probability, where).toBeNull();
      else {
        const probability = Number(s.probability);
        expect(closeEnough(probability, row.probability!), `probability ${probability} vs ${row.probability}, ${where}`).toBe(true);
      }
      const atThreshold = handle.definition.segments.some((seg) => closeEnough(row.distance!, seg.farBeyond));
      if (!atThreshold) expect(Number(s.far) === 1, `far, ${where}`).toBe(row.far);
    }
  }
}

describe(`mixture scoring SQL on ${engineTitles}`, () => {
  it.each(['full', 'diagonal', 'spherical', 'tied'] as const)(
    '%s covariance: training rows and awkward rows agree with assign',
    async (shape) => {
      const train = holders(150, 11);
      const handle = fit(shape, train, 3);
      expect(handle.definition.training.reproducedRows).toBe(150);
      await expectSameEverywhere(handle, `mix_train_${shape}`, train);
      await expectSameEverywhere(handle, `mix_new_${shape}`, [...AWKWARD, ...holders(40, 12).map((r) => [`n${r[0]}`, ...r.slice(1)])]);
      const refused = handle.assign(asRecords(COLUMNS, AWKWARD)).report.refused.map((r) => r.id);
      expect(refused).toEqual(['a-missing', 'a-text', 'a-negative-log']);
    },
    120_000,
  );
});
