// refineInDatabase on DuckDB, SQLite, PostgreSQL 15 and ClickHouse 18.16 (two shards behind a
// Distributed table), against Lloyd's algorithm run in memory by the plain loop below on the same
// rows, prepared by applyPreparation with the same stored preparation, from the same centres and
// with the same stopping and empty-segment rules. Outside check: Lloyd (1982) as stated; the
// engines must give the same partition at every iteration (the same rows moved, the same sizes)
// and the same centres and within-SS to 1e-9 relative (the stated bound for n ≤ 10^6 is far
// below that: n·2⁻⁵³ ≈ 1e-10 at worst for these 3,000 rows).
import { describe, expect, it } from 'vitest';
import type { Matrix } from '../../src/core/matrix';
import { createRandom } from '../../src/random';
import { applyPreparation } from '../../src/prepare';
import type { Preparation } from '../../src/prepare/types';
import type { SegmentDefinition } from '../../src/segments/definition-types';
import { refineInDatabase, type DatabaseRefinement } from '../../src/segments/database/refine';
import { study } from '../../src/study';
import { engineTitle, engineTitles, loadOneClickHouseTable, refusal, type DatabaseEngines } from './database-engines';

const COLUMNS = ['rider', 'trips', 'peak', 'spend', 'zone'];
type Row = (string | null)[];

/** Four groups of riders, some cells padded or in exponent form; `bad` rows carry a cell assign refuses. */
function riders(n: number, seed: number, bad = 0): Row[] {
  const random = createRandom(seed);
  const groups = [
    [3, 0.8, 20],
    [12, 0.2, 60],
    [25, 0.5, 140],
    [7, 0.9, 300],
  ];
  return Array.from({ length: n }, (_, i) => {
    const g = groups[random.int(4)];
    const trips = Math.max(0, g[0] + 7 * random.normal());
    const row: Row = [
      `r-${String(i).padStart(5, '0')}`,
      i % 17 === 0 ? ` ${trips.toFixed(3)} ` : String(trips),
      (g[1] + 0.3 * random.normal()).toExponential(6),
      String(Math.max(0, g[2] * (1 + 0.6 * random.normal()))),
      ['north', 'south', 'east'][random.int(3)],
    ];
    if (i < bad) row[1] = ['oops', '1.', '+3', 'NaN?'][i % 4];
    return row;
  });
}

const records = (rows: readonly Row[]) => rows.map((r) => Object.fromEntries(COLUMNS.map((c, j) => [c, r[j]])));

/** k-means on the first `n` rows in memory: the start every engine refines. */
function sampleDefinition(rows: readonly Row[], n: number, k: number): SegmentDefinition {
  return study(records(rows.slice(0, n)), { id: 'rider', types: { zone: 'categorical' } })
    .prepare({ scale: 'zscore', log: ['spend'] })
    .kmeans({ k, seed: 3, restarts: 4 })
    .definition().definition;
}

/** Lloyd in memory with refineInDatabase's stated rules. */
function lloydInMemory(m: Matrix, start: number[][], tolerance: number, maxIterations: number) {
  const { rows: n, cols: d, data } = m;
  const k = start.length;
  let current = start.map((c) => [...c]);
  let before: Int32Array | null = null;
  const moves: (number | null)[] = [];
  for (let t = 1; ; t++) {
    const own = new Int32Array(n);
    const sizes = new Array<number>(k).fill(0);
    const sums = current.map(() => new Array<number>(d).fill(0));
    let within = 0;
    for (let i = 0; i < n; i++) {
      let best = Infinity;
      for (let c = 0; c < k; c++) {
        let s = 0;
        for (let j = 0; j < d; j++) s += (data[i * d + j] - current[c][j]) ** 2;
        if (s < best) [best, own[i]] = [s, c];
      }
      within += best;
      sizes[own[i]]++;
      for (let j = 0; j < d; j++) sums[own[i]][j] += data[i * d + j];
    }
    const next = current.map((c, s) => (sizes[s] === 0 ? [...c] : sums[s].map((x) => x / sizes[s])));
    const shift = Math.max(...current.map((c, s) => Math.hypot(...c.map((x, j) => next[s][j] - x))));
    const moved = before === null ? null : own.reduce((a, s, i) => a + (s === before![i] ? 0 : 1), 0);
    moves.push(moved);
    if (moved === 0 || shift <= tolerance || t >= maxIterations) return { centers: current, sizes, within, iterations: t, moves };
    before = own;
    current = next;
  }
}

const close = (a: number, b: number, rel = 1e-9) => Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1);

function expectSameAsMemory(result: DatabaseRefinement, reference: ReturnType<typeof lloydInMemory>, where: string): void {
  expect(result.iterations, where).toBe(reference.iterations);
  expect(
    result.history.map((h) => h.moved),
    where,
  ).toEqual(reference.moves);
  expect(result.sizes, where).toEqual(reference.sizes);
  expect(close(result.withinSS, reference.within), `within-SS ${result.withinSS} vs ${reference.within}, ${where}`).toBe(true);
  result.centers.forEach((c, s) =>
    c.forEach((x, j) => expect(close(x, reference.centers[s][j]), `centre ${s + 1}.${j + 1}, ${where}`).toBe(true)),
  );
}

/** The cases, registered on engines started once for the database tests (database.test.ts). */
export function refineCases(engines: DatabaseEngines): void {
  describe(`refineInDatabase on ${engineTitles}`, () => {
    const rows = riders(3000, 21, 8);
    const definition = sampleDefinition(rows.slice(8), 300, 5);
    const prepared = applyPreparation(definition.preparation as unknown as Preparation, records(rows.slice(8)));
    const start = definition.segments.map((s) => s.center);

    it('runs Lloyd to a fixed point and matches Lloyd in memory iteration by iteration', async () => {
      const reference = lloydInMemory(prepared.matrix, start, 0, 100);
      expect(reference.iterations).toBeGreaterThan(5); // the sample's centres are far from a fixed point
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, rows);
        const seen: string[] = [];
        const result = await refineInDatabase(engine, definition, {
          table: 'riders',
          tolerance: 0,
          maxIterations: 100,
          onProgress: (e) => seen.push(e.detail ?? ''),
        });
        expectSameAsMemory(result, reference, engine.dialect);
        expect(result.stoppedBy).toBe('no-row-moved');
        expect(result.unscored, engine.dialect).toBe(8);
        expect(result.rows).toBe(2992);
        expect(result.queries).toBe(result.iterations);
        expect(result.rowsSeen).toBe(2992 * result.iterations);
        expect(seen).toHaveLength(result.iterations);
        expect(seen[1]).toMatch(/query 2, 2,992 rows seen, \d+ moved/);
      }
    });

    it('stops at the tolerance or at maxIterations as Lloyd in memory does', async () => {
      for (const [tolerance, maxIterations] of [
        [0.05, 100],
        [0, 2],
      ]) {
        const reference = lloydInMemory(prepared.matrix, start, tolerance, maxIterations);
        for (const engine of engines.all) {
          await engine.loadText('riders', COLUMNS, rows);
          const result = await refineInDatabase(engine, definition, { table: 'riders', tolerance, maxIterations });
          expectSameAsMemory(result, reference, `${engine.dialect}, tolerance ${tolerance}`);
          expect(result.stoppedBy).toBe(maxIterations === 2 ? 'max-iterations' : 'tolerance');
          expect(result.converged).toBe(maxIterations !== 2);
        }
      }
    });

    it('refines the rows of a query of the user as it refines a table', async () => {
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, rows);
        const fromTable = await refineInDatabase(engine, definition, { table: 'riders', tolerance: 0.05 });
        const fromQuery = await refineInDatabase(engine, definition, {
          query: 'SELECT * FROM riders WHERE trips IS NOT NULL',
          tolerance: 0.05,
        });
        expect(fromQuery.sizes, engine.dialect).toEqual(fromTable.sizes);
        expect(fromQuery.iterations).toBe(fromTable.iterations);
      }
    });

    it('an empty segment keeps its centre and is reported', async () => {
      const far = {
        ...definition,
        segments: [...definition.segments, { ...definition.segments[0], number: start.length + 1, center: start[0].map(() => 40) }],
      };
      const reference = lloydInMemory(prepared.matrix, [...start, start[0].map(() => 40)], 0, 100);
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, rows);
        const result = await refineInDatabase(engine, far, { table: 'riders', tolerance: 0 });
        expectSameAsMemory(result, reference, engine.dialect);
        expect(result.emptySegments).toEqual([start.length + 1]);
        expect(result.centers[start.length]).toEqual(start[0].map(() => 40));
      }
    });

    it('ClickHouse: two shards behind a Distributed table refine as the same rows in one table', async () => {
      const server = engines.clickhouse();
      const engine = engines.all.find((e) => e.dialect === 'clickhouse');
      if (!server || !engine) return; // no ClickHouse here (and not required): the other engines ran
      await engine.loadText('riders_spread', COLUMNS, rows);
      await loadOneClickHouseTable(server, 'riders_whole', COLUMNS, [...rows].reverse());
      const spread = await refineInDatabase(engine, definition, { table: 'riders_spread', tolerance: 0 });
      const whole = await refineInDatabase(engine, definition, { table: 'riders_whole', tolerance: 0 });
      expect(spread.iterations).toBe(whole.iterations);
      expect(spread.sizes).toEqual(whole.sizes);
      expect(close(spread.withinSS, whole.withinSS, 1e-12)).toBe(true);
    });
  });

  describe(`refineInDatabase refuses clearly, naming the engine, on ${engineTitles}`, () => {
    const rows = riders(200, 5);
    const definition = sampleDefinition(rows, 200, 3);

    it('a missing table or column', async () => {
      for (const engine of engines.all) {
        await engine.loadText(
          'riders_short',
          COLUMNS.filter((c) => c !== 'peak'),
          rows.map((r) => r.filter((_, j) => j !== 2)),
        );
        const noTable = await refusal(() => refineInDatabase(engine, definition, { table: 'no_riders' }));
        expect(noTable.message).toContain(`refineInDatabase on ${engineTitle(engine)}: table "no_riders" cannot be read`);
        const noColumn = await refusal(() => refineInDatabase(engine, definition, { table: 'riders_short' }));
        expect(noColumn.message).toContain(`refineInDatabase on ${engineTitle(engine)}: table "riders_short" has no column "peak"`);
      }
    });

    it('anything but k-means', async () => {
      const medoids = { ...definition, method: { name: 'kmedoids' as const, options: {} }, rule: 'nearest-medoid' as const };
      const error = await refusal(() => refineInDatabase(engines.all[0], medoids, { table: 'riders' }));
      expect(error.message).toContain('only k-means segments can be refined');
    });
  });
}
