// The rules as one SQL CASE. Only quoting and literals differ between engines, so they come from
// the dialect layer (src/engines): identifiers and text quoted as the engine reads them, and
// thresholds as double literals that read back to exactly the double apply() compares with.
// Leaves are disjoint and cover every row, so the CASE has one WHEN per leaf and missing values
// take the branch written "… OR x IS NULL".
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import { dialectNamed } from '../engines/dialects';
import type { DialectName, SqlDialect } from '../engines/dialect';
import type { RuleCondition } from './rules-text';

export interface RulesSqlOptions {
  /** Table to read (may be schema-qualified as ['schema', 'table']). */
  table: string | readonly string[];
  /** Id column to select beside the segment. */
  id?: string;
  /** Name of the segment column in the result (default "segment"). */
  as?: string;
  /** The engine the SQL is for (default 'duckdb'): duckdb, postgres, sqlite or clickhouse. */
  dialect?: DialectName;
}

const DEFAULT_DIALECT = dialectNamed('duckdb');

/** Identifiers and text go through the shared quoting; NUL cannot be written in SQL text at all. */
function identifier(name: string, d: SqlDialect): string {
  if (typeof name !== 'string' || name === '' || name.includes('\u0000')) {
    throw new KinsortError(`toSql: ${JSON.stringify(name)} cannot be written as an SQL identifier.`, 'bad-option');
  }
  return d.quoteIdentifier(name);
}

function text(value: string, d: SqlDialect): string {
  if (value.includes('\u0000'))
    throw new KinsortError(`toSql: the level ${JSON.stringify(value)} holds a NUL character, which SQL text cannot.`, 'bad-input');
  return d.quoteString(value);
}

export function conditionSql(c: RuleCondition, d: SqlDialect = DEFAULT_DIALECT): string {
  const col = identifier(c.column, d);
  const level = (v: string) => text(v, d);
  let test: string;
  switch (c.test) {
    case 'below':
      test = `${col} < ${d.doubleLiteral(c.value)}`;
      break;
    case 'atLeast':
      test = `${col} >= ${d.doubleLiteral(c.value)}`;
      break;
    case 'oneOf':
      test = c.levels.length ? `${col} IN (${c.levels.map(level).join(', ')})` : '1 = 0';
      break;
    case 'noneOf':
      return c.levels.length ? `(${col} IS NULL OR ${col} NOT IN (${c.levels.map(level).join(', ')}))` : '1 = 1';
  }
  return c.orMissing ? `(${test} OR ${col} IS NULL)` : test;
}

/** The CASE expression alone: one WHEN per rule. */
export function rulesCase(
  rules: readonly { segment: number; conditions: readonly RuleCondition[] }[],
  d: SqlDialect = DEFAULT_DIALECT,
): string {
  const whens = rules.map((r) => {
    const test = r.conditions.length ? r.conditions.map((c) => conditionSql(c, d)).join(' AND ') : '1 = 1';
    return `  WHEN ${test} THEN ${r.segment}`;
  });
  return `CASE\n${whens.join('\n')}\nEND`;
}

export function rulesSql(rules: readonly { segment: number; conditions: readonly RuleCondition[] }[], options: RulesSqlOptions): string {
  const opts = checkOptions(options, ['table', 'id', 'as', 'dialect'], 'toSql');
  const d = opts.dialect === undefined ? DEFAULT_DIALECT : dialectNamed(opts.dialect);
  if (opts.table === undefined) throw new KinsortError('toSql: give the table to read, e.g. { table: "pass_holders" }.', 'bad-option');
  const table = (typeof opts.table === 'string' ? [opts.table] : [...opts.table]).map((part) => identifier(part, d)).join('.');
  const id = opts.id === undefined ? '' : `${identifier(opts.id, d)}, `;
  return `SELECT ${id}${rulesCase(rules, d)} AS ${identifier(opts.as ?? 'segment', d)}\nFROM ${table}`;
}
