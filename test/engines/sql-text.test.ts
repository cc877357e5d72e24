// The SQL text itself: table names as quoted parts, strings and comments that cannot break out,
// text that cannot be carried refused, and the size linear in k with a stated bound. (Running the
// hostile cases on the four engines: engines.test.ts.)
import { describe, expect, it } from 'vitest';
import { kmeans } from '../../src/methods/partition';
import { prepareTable } from '../../src/prepare';
import { buildDefinition } from '../../src/segments/definition-exports';
import { loadDefinition } from '../../src/study/definition-handle';
import type { SegmentDefinition } from '../../src/segments/definition-types';
import { definitionToSql, SQL_MAX_SEGMENTS } from '../../src/segments/sql';
import { dialectNamed } from '../../src/engines/dialects';
import { DIALECT_NAMES } from '../../src/engines/dialect';
import { riders } from '../segments/definition-data';

function definitionOf(k: number, n = Math.max(60, 2 * k)): SegmentDefinition {
  const prepared = prepareTable(riders(n, 5), { id: 'rider', use: ['trips', 'peak', 'fare'] });
  // Centres: k training rows themselves; every row assigned to its nearest (k-means from those).
  const result = kmeans(prepared.matrix, { k, seed: 1, maxIterations: 1 });
  return buildDefinition({
    preparation: prepared.preparation,
    method: { name: 'kmeans', options: { k } },
    centers: result.centers,
    training: { ids: prepared.ids, matrix: prepared.matrix, assignment: result.assignment },
  });
}

describe('table names', () => {
  const def = definitionOf(2);
  const from = (table: string | string[], dialect = 'duckdb' as const) => {
    const sql = definitionToSql(def, { table, dialect });
    return /FROM ("[^\n]*"|`[^\n]*`)\n/.exec(sql)![1];
  };
  it('quotes each part of a qualified name, or takes the parts as an array', () => {
    expect(from('riders')).toBe('"riders"');
    expect(from('sales.riders')).toBe('"sales"."riders"');
    expect(from('lake.sales.riders')).toBe('"lake"."sales"."riders"');
    expect(from(['my.schema', 'odd "name"'])).toBe('"my.schema"."odd ""name"""');
    expect(definitionToSql(def, { table: 'sales.riders', dialect: 'clickhouse' })).toContain('FROM `sales`.`riders`');
  });
  it('never writes the hostile name of issue 14 as SQL: each part stays one quoted identifier', () => {
    const sql = definitionToSql(def, { table: 'main.riders) SELECT 1; DROP TABLE riders; --', dialect: 'duckdb' });
    expect(sql).toContain('FROM "main"."riders) SELECT 1; DROP TABLE riders; --"\n');
  });
  it('refuses quotes, control characters, empty parts and more than three parts, naming the fix', () => {
    for (const bad of ['"riders"', 'a..b', '', ' ', 'a.b.c.d', 'rid\ners', '`x`', 'a.']) {
      expect(() => definitionToSql(def, { table: bad })).toThrow(/toSql: the table/);
    }
    expect(() => definitionToSql(def, { table: ['a', 'b\u0000'] })).toThrow(/control characters/);
    expect(() => definitionToSql(def, { table: 42 as never })).toThrow(/not a name/);
  });
});

describe('strings and comments', () => {
  it('a writtenBy with a newline and SQL stays inside its one-line comment, in every dialect', () => {
    const def = { ...definitionOf(2), writtenBy: 'kinsort 0.1.0\nCREATE TABLE pwned AS SELECT 42 AS x; --\r\u2028\u0085' };
    for (const dialect of DIALECT_NAMES) {
      const sql = definitionToSql(def, { table: 'riders', dialect });
      const comments = sql.split('\n').filter((l) => l !== '' && !/^(WITH|SELECT|FROM|\)|\(| {2}|"|`|OFFSET)/.test(l));
      for (const line of comments) expect(line.startsWith('-- '), `${dialect}: ${JSON.stringify(line)}`).toBe(true);
      expect(sql).not.toMatch(/[\r\u2028\u0085]/);
      expect(sql).toContain('"kinsort 0.1.0\\nCREATE TABLE pwned AS SELECT 42 AS x; --\\r\\u2028\\u0085"');
    }
  });
  it('quotes by dialect: doubled quotes; backslashes escaped where the engine reads escapes', () => {
    const hostile = "a'b\\'; DROP TABLE x; --";
    expect(dialectNamed('duckdb').quoteString(hostile)).toBe("'a''b\\''; DROP TABLE x; --'");
    expect(dialectNamed('sqlite').quoteString(hostile)).toBe("'a''b\\''; DROP TABLE x; --'");
    // E'' so the meaning does not depend on standard_conforming_strings.
    expect(dialectNamed('postgres').quoteString(hostile)).toBe("E'a''b\\\\''; DROP TABLE x; --'");
    expect(dialectNamed('clickhouse').quoteString(hostile)).toBe("'a\\'b\\\\\\'; DROP TABLE x; --'");
    expect(dialectNamed('clickhouse').quoteIdentifier('a`b\\')).toBe('`a\\`b\\\\`');
    expect(dialectNamed('postgres').quoteIdentifier('a"b')).toBe('"a""b"');
  });
  it('refuses text SQL cannot carry exactly: U+0000 and unpaired surrogates, naming them', () => {
    for (const dialect of DIALECT_NAMES) {
      expect(() => dialectNamed(dialect).quoteString('a\u0000b')).toThrow(/U\+0000/);
      expect(() => dialectNamed(dialect).quoteIdentifier('x\ud800')).toThrow(/unpaired surrogate/);
    }
    expect(() => definitionToSql(definitionOf(2), { table: 'riders', idColumn: 'id\u0000' })).toThrow(/U\+0000/);
  });
  it('refuses an id column that clashes in any letter case with a name the SQL writes', () => {
    for (const idColumn of ['Segment', 'DISTANCE', 'far', 'Kinsort_v_1']) {
      expect(() => definitionToSql(definitionOf(2), { table: 't', idColumn })).toThrow(/clashes/);
    }
  });
  it('refuses an unknown dialect, and a dialect that contradicts the engine', () => {
    expect(() => definitionToSql(definitionOf(2), { table: 't', dialect: 'oracle' as never })).toThrow(
      /unknown dialect "oracle".*duckdb, postgres, sqlite, clickhouse/,
    );
    expect(() => definitionToSql(definitionOf(2), { table: 't', dialect: 'sqlite', engine: { dialect: 'postgres' } })).toThrow(/differ/);
  });
});

describe('size', () => {
  it('grows linearly with k (issue 14: k = 2,000 gave 216 MB, growing with k²)', () => {
    const sizes = [100, 200, 400].map((k) => definitionToSql(definitionOf(k, 1200), { table: 't', dialect: 'postgres' }).length);
    // Doubling k doubles the figures written; the quadratic CASE would have quadrupled it.
    expect(sizes[1] / sizes[0]).toBeLessThan(2.2);
    expect(sizes[2] / sizes[1]).toBeLessThan(2.2);
    const perSegment = (sizes[2] - sizes[1]) / 200;
    expect(perSegment).toBeLessThan(3000); // 6 features: a few hundred characters per segment
  });
  it(`refuses more than ${SQL_MAX_SEGMENTS} segments at generation, saying the bound`, () => {
    const def = definitionOf(3);
    const many = { ...def, segments: Array.from({ length: SQL_MAX_SEGMENTS + 1 }, (_, i) => ({ ...def.segments[0], number: i + 1 })) };
    expect(() => definitionToSql(many, { table: 't' })).toThrow(/1001 segments.*at most 1000 segments/);
  });
  it('SQLite: more features than its expression depth allows in one distance are refused, naming the limit', () => {
    const def = definitionOf(2);
    const wide = { ...def, features: Array.from({ length: 901 }, (_, i) => `f${i}`) };
    expect(() => definitionToSql(wide, { table: 't', dialect: 'sqlite' })).toThrow(/901 features .*depth limit \(1000\).*at most 900/);
  });
  it('ClickHouse: SQL beyond max_query_size (262,144 bytes by default) is refused unless a raised cap is given', () => {
    const def = definitionOf(1000, 3000);
    expect(() => definitionToSql(def, { table: 't', dialect: 'clickhouse' })).toThrow(
      /bytes, beyond ClickHouse's cap on a statement \(262,144 bytes, max_query_size\)/,
    );
    expect(definitionToSql(def, { table: 't', dialect: 'clickhouse', maxQueryBytes: 10_000_000 }).length).toBeGreaterThan(262_144);
  });
  it('a loaded definition writes the same SQL for the same dialect (deterministic)', () => {
    const handle = loadDefinition(definitionOf(3));
    for (const dialect of DIALECT_NAMES) expect(handle.toSql({ table: 't', dialect })).toBe(handle.toSql({ table: 't', dialect }));
  });
});
