// The whole path a notebook takes, on DuckDB, SQLite, PostgreSQL 15 and the two-shard ClickHouse
// table: sampleFromDatabase → study → kmeans on the sample → seg.refineInDatabase. The refined
// segmentation's figures must describe the whole table: its sizes are what the definition's own
// scoring SQL gives every row of the table, its within-SS is the functional refinement's, its
// cards are the table's profiles, and its definition reproduces every sample row.
import { describe, expect, it } from 'vitest';
import { KinsortError } from '../../src/core/errors';
import { sampleFromDatabase } from '../../src/engines/sample';
import { refineInDatabase } from '../../src/segments/database/refine';
import { createRandom } from '../../src/random';
import { study } from '../../src/study';
import { engineTitles, type DatabaseEngines } from './database-engines';

const COLUMNS = ['holder', 'trips', 'weekend', 'fare'];

function holders(n: number): (string | null)[][] {
  const random = createRandom(8);
  return Array.from({ length: n }, (_, i) => {
    const g = random.int(3);
    return [
      `h${i}`,
      String(Math.max(0, [4, 14, 30][g] + 5 * random.normal())),
      String(Math.min(1, Math.max(0, [0.7, 0.2, 0.4][g] + 0.2 * random.normal()))),
      i === 5 ? 'n/a' : ['adult', 'youth', 'senior'][random.int(3)],
    ];
  });
}

/** The cases, registered on engines started once for the database tests (database.test.ts). */
export function refineFluentCases(engines: DatabaseEngines): void {
  describe(`seg.refineInDatabase on ${engineTitles}`, () => {
    const rows = holders(2500);

    it('gives a segmentation whose sizes, within-SS and cards describe every row of the table', async () => {
      for (const engine of engines.all) {
        await engine.loadText('holders', COLUMNS, rows);
        const sample = await sampleFromDatabase(engine, { table: 'holders', id: 'holder', rows: 400, seed: 1 });
        const seg = study(sample, { id: 'holder', types: { fare: 'categorical' } })
          .prepare({ scale: 'zscore', missing: 'median' })
          .kmeans({ k: 3, seed: 2, restarts: 3 })
          .name(1, { title: 'First' });
        const progress: string[] = [];
        const refined = await seg.refineInDatabase(engine, { table: 'holders', tolerance: 0, onProgress: (e) => progress.push(e.task) });
        const where = engine.dialect;
        const p = refined.population!;
        expect(p.rows + p.unscored, where).toBe(2500);
        expect(refined.sizes).toEqual(p.sizes);
        expect(refined.objective.value).toBe(p.withinSS);
        // The same as the functional twin from the same start.
        const twin = await refineInDatabase(engine, seg.definition().definition, { table: 'holders', tolerance: 0 });
        expect(twin.sizes, where).toEqual(p.sizes);
        // Two runs may sum in another order (ClickHouse merges the shards' partial sums as they come).
        twin.centers.forEach((c, s) =>
          c.forEach((x, j) => expect(Math.abs(x - refined.centers[s][j]), where).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(x)))),
        );
        // Scoring the table with the refined definition's own SQL gives exactly those sizes.
        const handle = refined.definition();
        const scored = await engine.query(handle.toSql({ table: 'holders', engine }));
        const counts = new Array<number>(3).fill(0);
        for (const r of scored) if (r.segment !== null) counts[Number(r.segment) - 1]++;
        expect(counts, where).toEqual(p.sizes);
        // The definition reproduces every sample row; its training sizes are the sample's.
        expect(handle.definition.training.reproducedRows).toBe(400);
        expect(handle.definition.segments.reduce((a, s) => a + s.size, 0)).toBe(400);
        // Cards and profiles are the table's, names kept.
        const profiles = refined.profiles();
        expect(
          profiles.map((q) => q.size),
          where,
        ).toEqual(p.sizes);
        expect(profiles[0].title).toBe('First');
        expect(refined.describeMethod()).toContain(`Refined over the ${p.rows.toLocaleString('en-US')} rows of table "holders"`);
        expect(refined.notes.join(' ')).toMatch(/Lloyd iteration\(s\) in SQL, stopped when no row moved/);
        expect(progress).toContain('refining in the database');
        expect(progress).toContain('profile queries');
      }
    });

    it('refuses anything but k-means, naming the way forward', async () => {
      const engine = engines.all[0];
      await engine.loadText('holders', COLUMNS, rows);
      const sample = await sampleFromDatabase(engine, { table: 'holders', id: 'holder', rows: 100 });
      const tree = study(sample, { id: 'holder' }).prepare({ missing: 'median' }).agglomerate({ method: 'ward' });
      const error = await tree
        .cut({ k: 3 })
        .refineInDatabase(engine, { table: 'holders' })
        .then(
          () => undefined,
          (e: unknown) => e,
        );
      expect(error).toBeInstanceOf(KinsortError);
      expect((error as Error).message).toContain('only a k-means segmentation can be refined');
    });
  });
}
