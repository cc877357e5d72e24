// profileInDatabase against the in-memory profile of the same rows: a study fitted in memory, its
// definition handed to each engine with the rows stored as text (plus rows the definition refuses),
// and every figure compared — sizes, level counts and shares exactly, means and standardised
// differences to 1e-9 relative, quartiles and medians per the engine's stated definition: exact
// order statistics interpolated by kinsort (SQLite, ClickHouse: equal to the last bit), or by the
// engine (DuckDB quantile_cont, PostgreSQL percentile_cont: 1e-12 relative). Outside checks: the
// engines themselves; the in-memory side is profileSegments (src/segments/profile.ts).
import { beforeAll, describe, expect, it } from 'vitest';
import { createRandom } from '../../src/random';
import { profileInDatabase } from '../../src/segments/database/profile-in-database';
import type { SegmentProfile } from '../../src/segments/profile';
import { study } from '../../src/study/study';
import { profileCardsView } from '../../src/views/cards';
import { serverAvailable } from '../servers/servers';
import { useDatabaseEngines } from '../database/database-engines';

const COLUMNS = ['rider', 'trips', 'spend', 'zone', 'fare', 'plan'];
const ZONES = ['Zürich', ' 1', '01', "O'Hare", 'a\u00a0b'];
const PLANS = ['monthly', 'Monthly', 'pay as you go', 'NA '];

/** Seeded rows as text: used columns complete, kept columns with missing cells (empty, NULL, NA). */
function makeRows(n: number): (string | null)[][] {
  const random = createRandom('profile-in-database');
  return Array.from({ length: n }, (_, i) => {
    const group = i % 3;
    const trips = Math.round((4 + group * 6 + random.normal() * 2) * 100) / 100;
    const spend = 20 + group * 15 + random.normal() * 5;
    const zone = ZONES[(group + random.int(2)) % ZONES.length];
    const fare = i % 11 === 0 ? (i % 2 ? null : '') : String(Math.round((1 + group + random.next()) * 1000) / 1000);
    const plan = i % 13 === 0 ? 'NA' : PLANS[(group + random.int(3)) % PLANS.length];
    return [`r-${String(i).padStart(4, '0')}`, String(trips), String(spend), zone, fare, plan];
  });
}

const ROWS = makeRows(600);
/** Rows assign refuses (a trips cell that is not a number): left out, and counted as unscored. */
const REFUSED: (string | null)[][] = [
  ['x-1', '1.', '20', '01', '1', 'monthly'],
  ['x-2', 'abc', '20', '01', '1', 'monthly'],
];

const records = ROWS.map((r) => Object.fromEntries(COLUMNS.map((c, j) => [c, r[j]])));
const segmentation = study(records, { id: 'rider', use: ['trips', 'spend', 'zone'], keep: ['fare', 'plan'] })
  .prepare({ scale: 'zscore', log: ['spend'] })
  .kmeans({ k: 3, seed: 5, restarts: 4 });
const definition = segmentation.definition().definition;
const expected = segmentation.profiles();

// The in-memory side has something to compare: differences of both kinds, kept columns of both kinds.
describe('the in-memory profile compared with', () => {
  it('has numeric and level differences and both kinds of kept column', () => {
    expect(expected).toHaveLength(3);
    for (const p of expected) {
      expect(p.differences.some((d) => d.level === undefined)).toBe(true);
      expect(p.differences.some((d) => d.level !== undefined)).toBe(true);
      expect(p.kept.map((c) => c.kind)).toEqual(['numeric', 'categorical']);
      expect(p.kept.every((c) => c.missing > 0)).toBe(true);
    }
  });
});

const close = (a: number, b: number, rel: number) => a === b || Math.abs(a - b) <= rel * Math.max(Math.abs(b), 1e-300);

function expectSameProfiles(actual: readonly SegmentProfile[], quantileTolerance: number, where: string): void {
  expect(
    actual.map((p) => p.size),
    where,
  ).toEqual(expected.map((p) => p.size));
  expect(
    actual.map((p) => p.share),
    where,
  ).toEqual(expected.map((p) => p.share));
  for (const [s, want] of expected.entries()) {
    const got = actual[s];
    const key = (d: { variable: string; level?: string }) => `${d.variable}\u0000${d.level ?? ''}`;
    expect(got.differences.map(key).sort(), `${where}, segment ${s + 1}`).toEqual(want.differences.map(key).sort());
    for (const w of want.differences) {
      const g = got.differences.find((d) => key(d) === key(w))!;
      const at = `${where}, segment ${s + 1}, ${key(w)}`;
      for (const field of ['segmentMean', 'overallMean', 'overallSd', 'difference'] as const) {
        expect(close(g[field], w[field], 1e-9), `${at} ${field}: ${g[field]} vs ${w[field]}`).toBe(true);
      }
      expect(g.shownAs, at).toEqual(w.shownAs);
    }
    expect(
      got.kept.map((c) => c.name),
      where,
    ).toEqual(want.kept.map((c) => c.name));
    for (const [j, w] of want.kept.entries()) {
      const g = got.kept[j];
      const at = `${where}, segment ${s + 1}, kept ${w.name}`;
      expect(g.kind, at).toBe(w.kind);
      expect(g.missing, at).toBe(w.missing);
      if (w.kind === 'numeric' && g.kind === 'numeric') {
        for (const field of ['q1', 'median', 'q3'] as const) {
          expect(close(g[field], w[field], quantileTolerance), `${at} ${field}: ${g[field]} vs ${w[field]}`).toBe(true);
        }
      } else expect(g, at).toEqual(w); // level text, counts and shares exactly
    }
  }
}

/** The quartiles of the used numeric columns, recomputed from the rows in memory (type 7). */
function quartilesInMemory(column: number, segment: number | null): number[] {
  const assignment = segmentation.assignment;
  const values = ROWS.filter((_, i) => segment === null || assignment[i] === segment - 1)
    .map((r) => Number(r[column]))
    .sort((a, b) => a - b);
  return [0.25, 0.5, 0.75].map((p) => {
    const h = (values.length - 1) * p;
    const lo = Math.floor(h);
    return values[lo] + (h - lo) * (values[Math.min(lo + 1, values.length - 1)] - values[lo]);
  });
}

// The four engines (servers started once for the file; see test/database/database-engines.ts).
const engines = useDatabaseEngines().all;
beforeAll(async () => {
  for (const engine of engines) await engine.loadText('riders', COLUMNS, [...ROWS, ...REFUSED]);
}, 120_000);

describe.each(['duckdb', 'sqlite', 'postgres', 'clickhouse'] as const)('profileInDatabase on %s', (dialect) => {
  const skip = (dialect === 'postgres' && !serverAvailable.postgres) || (dialect === 'clickhouse' && !serverAvailable.clickhouse);
  const engine = () => engines.find((e) => e.dialect === dialect)!;
  // Interpolated by the engine (a few units in the last place) or by kinsort from exact order statistics.
  const quantileTolerance = dialect === 'duckdb' || dialect === 'postgres' ? 1e-12 : 0;

  it.skipIf(skip)('gives the in-memory profiles of the same rows, refused rows counted apart', async () => {
    const events: number[] = [];
    const result = await profileInDatabase(engine(), definition, { table: 'riders', onProgress: (e) => events.push(e.done) });
    expect(result.unscored).toBe(REFUSED.length);
    expectSameProfiles(result.profiles, quantileTolerance, dialect);
    expect(events).toEqual(Array.from({ length: result.queries }, (_, i) => i + 1));
    // Statements: one typing the kept columns, one per text column, and the moments with the
    // quartiles in one statement on DuckDB, in two on PostgreSQL.
    const texts = result.allRows.columns.filter((c) => c.kind === 'categorical').length;
    if (dialect === 'duckdb') expect(result.queries).toBe(1 + texts + 1);
    if (dialect === 'postgres') expect(result.queries).toBe(1 + texts + 2);
    // Kept columns are typed as the intake reads them: fare numeric, plan text ('NA' missing, 'NA ' too).
    expect(result.allRows.columns.map((c) => `${c.name}:${c.role}:${c.kind}`)).toEqual([
      'trips:used:numeric',
      'spend:used:numeric',
      'zone:used:categorical',
      'fare:kept:numeric',
      'plan:kept:categorical',
    ]);
  });

  it.skipIf(skip)('gives every used column quartiles and the typical member at the least distance', async () => {
    const result = await profileInDatabase(engine(), definition, { table: 'riders' });
    for (const [s, group] of [...result.segments, result.allRows].entries()) {
      const segment = group.segment;
      expect(segment).toBe(s < result.segments.length ? s + 1 : null);
      for (const [column, name] of [
        [1, 'trips'],
        [2, 'spend'],
      ] as const) {
        const c = group.columns.find((x) => x.name === name)!;
        if (c.kind !== 'numeric') throw new Error('numeric expected');
        const want = quartilesInMemory(column, segment);
        [c.q1, c.median, c.q3].forEach((v, i) => expect(close(v, want[i], quantileTolerance), `${name} ${v} vs ${want[i]}`).toBe(true));
      }
    }
    const assign = segmentation.definition().assign(records);
    for (const [s, t] of result.typical.entries()) {
      const row = assign.rows.find((r) => r.id === t.id)!;
      expect(row.segment, `typical of segment ${s + 1}`).toBe(s + 1);
      const least = Math.min(...assign.rows.filter((r) => r.segment === s + 1).map((r) => r.distance!));
      expect(close(row.distance!, least, 1e-9)).toBe(true);
      expect(close(t.distance, least, 1e-9)).toBe(true);
    }
    // The cards draw them; level text stays exact (escaped in HTML).
    const html = profileCardsView(result.profiles).html();
    expect(html).toContain('O&#39;Hare');
  });
});

describe('profileInDatabase with quantiles: approximate', () => {
  /** The share of the values at or below v: for the quantile p it should be p, give or take a step. */
  function rankShare(column: number, segment: number | null, v: number): number {
    const values = ROWS.filter((_, i) => segment === null || segmentation.assignment[i] === segment - 1).map((r) => Number(r[column]));
    return values.filter((x) => x <= v).length / values.length;
  }

  it('gives DuckDB approx_quantile figures within 1 % of the values in rank (the stated bound), the rest exact', async () => {
    const duckdb = engines.find((e) => e.dialect === 'duckdb')!;
    const result = await profileInDatabase(duckdb, definition, { table: 'riders', quantiles: 'approximate' });
    expect(result.quantiles).toMatch(/^approximate: DuckDB approx_quantile/);
    const exact = await profileInDatabase(duckdb, definition, { table: 'riders' });
    for (const [g, group] of [...result.segments, result.allRows].entries()) {
      const other = [...exact.segments, exact.allRows][g];
      for (const [column, name] of [
        [1, 'trips'],
        [2, 'spend'],
      ] as const) {
        const c = group.columns.find((x) => x.name === name)!;
        if (c.kind !== 'numeric') throw new Error('numeric expected');
        [c.q1, c.median, c.q3].forEach((v, i) => {
          const p = [0.25, 0.5, 0.75][i];
          const share = rankShare(column, group.segment, v);
          expect(Math.abs(share - p), `${name}, segment ${group.segment}, p = ${p}: ${v} holds ${share} of the values`).toBeLessThanOrEqual(
            0.01 + 1e-12,
          );
        });
        // Everything else is the exact profile's.
        expect({ ...c, q1: 0, median: 0, q3: 0 }).toEqual({ ...other.columns.find((x) => x.name === name)!, q1: 0, median: 0, q3: 0 });
      }
    }
  });

  it('is refused when misspelt', async () => {
    const duckdb = engines.find((e) => e.dialect === 'duckdb')!;
    await expect(profileInDatabase(duckdb, definition, { table: 'riders', quantiles: 'approx' as never })).rejects.toThrow(
      /exact.*approximate/,
    );
  });
});
