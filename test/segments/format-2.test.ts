// The hand-off promise across the `centre` → `center` rename: a definition file written in format 2
// (its preparation spells each column's subtracted value `centre`) by the kinsort of commit b2a85b7
// still loads, scores the same batch to the same segment and distance, and writes SQL that scores
// the batch as its own SQL does.
// Fixture: test/segments/fixtures/format-2-definitions.json, made by make-format-2.js beside it.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DuckDBInstance } from '@duckdb/node-api';
import { describe, expect, it } from 'vitest';
import { applyPreparation, DEFINITION_FORMAT_VERSION, loadDefinition, type Preparation } from '../../src';
import { refusal } from '../reliability/helpers';

interface Stored {
  text: string;
  assigned: { id: string; segment: number | null; distance: number | null; far: boolean }[];
  sql: string;
}
const fixture = JSON.parse(readFileSync(join(__dirname, 'fixtures', 'format-2-definitions.json'), 'utf8')) as {
  batch: Record<string, unknown>[];
  definitions: Record<string, Stored>;
};

describe('definition files of format 2 (key "centre")', () => {
  for (const [method, stored] of Object.entries(fixture.definitions)) {
    it(`${method}: loads, assigns every new row exactly as the kinsort that wrote it, and writes the same SQL (header aside)`, () => {
      expect(JSON.parse(stored.text).formatVersion).toBe(2);
      expect(stored.text).toContain('"centre"');
      const handle = loadDefinition(stored.text);
      const scored = handle.assign(fixture.batch);
      expect(scored.rows.map((r) => ({ id: r.id, segment: r.segment, distance: r.distance, far: r.far }))).toEqual(stored.assigned);
      expect(stored.sql).toContain('(format 2)');
    });

    // The SQL text has since changed (DuckDB reads a cell stored as a number directly), so the
    // promise is checked by what it does: on the batch, the SQL the old kinsort wrote and today's
    // give every row the same segment, distance and far flag.
    it(`${method}: writes SQL that scores the batch as the SQL of the kinsort that wrote it`, async () => {
      const handle = loadDefinition(stored.text);
      const connection = await (await DuckDBInstance.create(':memory:')).connect();
      try {
        const columns = Object.keys(fixture.batch[0]);
        const cell = (v: unknown) => (v === null || v === undefined ? 'NULL' : `'${String(v).replace(/'/g, "''")}'`);
        await connection.run(`CREATE TABLE riders (${columns.map((c) => `"${c}" VARCHAR`).join(', ')})`);
        await connection.run(
          `INSERT INTO riders VALUES ${fixture.batch.map((r) => `(${columns.map((c) => cell(r[c])).join(', ')})`).join(', ')}`,
        );
        const rows = async (sql: string) => (await connection.runAndReadAll(`SELECT * FROM (${sql}) ORDER BY 1`)).getRowObjectsJS();
        const then = await rows(stored.sql);
        expect(then).toHaveLength(fixture.batch.length);
        expect(await rows(handle.toSql({ table: 'riders', dialect: 'duckdb' }))).toEqual(then);
      } finally {
        connection.closeSync();
      }
    });

    it(`${method}: is held and written back as format ${DEFINITION_FORMAT_VERSION}, with "center" and no "centre"`, () => {
      const again = loadDefinition(stored.text).toJSON();
      const json = JSON.parse(again);
      expect(json.formatVersion).toBe(DEFINITION_FORMAT_VERSION);
      expect(json.preparation.version).toBe(3);
      expect(again).not.toContain('"centre"');
      const old = JSON.parse(stored.text);
      // Only the key's spelling changed: every column's number is the one stored under "centre".
      expect(json.preparation.columns.map((c: { center: number }) => c.center)).toEqual(
        old.preparation.columns.map((c: { centre: number }) => c.centre),
      );
      // The rewritten file scores the same as the original.
      expect(
        loadDefinition(again)
          .assign(fixture.batch)
          .rows.map((r) => r.segment),
      ).toEqual(stored.assigned.map((r) => r.segment));
    });
  }

  const text = fixture.definitions.kmeans.text;
  const edited = (edit: (d: { formatVersion: number; preparation: { version: number; columns: Record<string, unknown>[] } }) => void) => {
    const d = JSON.parse(text);
    edit(d);
    return JSON.stringify(d);
  };

  it('a format-3 file must say "center": "centre" there is an unknown key, named', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.formatVersion = 3;
            d.preparation.version = 3;
          }),
        ),
      'centre',
      'center',
    );
  });

  it('a format-2 file must hold preparation version 2, and may not spell the key both ways', () => {
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.version = 3;
          }),
        ),
      'format-2 definition holds preparation version 2',
    );
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.preparation.columns[0].center = d.preparation.columns[0].centre;
          }),
        ),
      'centre',
    );
  });

  it('applyPreparation reads a version-2 preparation (key "centre") as the same numbers', () => {
    const v2 = JSON.parse(text).preparation as Preparation;
    const v3 = JSON.parse(loadDefinition(text).toJSON()).preparation as Preparation;
    const a = applyPreparation(v2, fixture.batch);
    const b = applyPreparation(v3, fixture.batch);
    expect(Array.from(a.matrix.data)).toEqual(Array.from(b.matrix.data));
    expect(a.preparation.version).toBe(3);
    expect(a.preparation.columns[0].center).toBe((v2.columns[0] as unknown as { centre: number }).centre);
  });
});
