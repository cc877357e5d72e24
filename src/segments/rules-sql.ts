// The rules as one SQL CASE, in portable SQL that DuckDB, PostgreSQL and SQLite read alike:
// identifiers in double quotes (a quote inside doubled), text in single quotes (doubled inside),
// thresholds as approximate (exponent) literals of their shortest round-trip digits, so every
// engine compares with the same double apply() uses (sql-text.ts). Leaves are disjoint and cover every row, so the CASE has one WHEN per leaf and
// missing values take the branch written "… OR x IS NULL".
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import { doubleLiteral, quoteIdentifier, quoteString } from './sql-text';
import type { RuleCondition } from './rules-text';

export interface RulesSqlOptions {
  /** Table to read (may be schema-qualified as ['schema', 'table']). */
  table: string | readonly string[];
  /** Id column to select beside the segment. */
  id?: string;
  /** Name of the segment column in the result (default "segment"). */
  as?: string;
}

/** Identifiers and text go through the shared quoting; NUL cannot be written in SQL text at all. */
function identifier(name: string): string {
  if (typeof name !== 'string' || name === '' || name.includes('\u0000')) {
    throw new KinsortError(`toSql: ${JSON.stringify(name)} cannot be written as an SQL identifier.`, 'bad-option');
  }
  return quoteIdentifier(name);
}

function text(value: string): string {
  if (value.includes('\u0000')) throw new KinsortError(`toSql: the level ${JSON.stringify(value)} holds a NUL character, which SQL text cannot.`, 'bad-input');
  return quoteString(value);
}

export function conditionSql(c: RuleCondition): string {
  const col = identifier(c.column);
  let test: string;
  switch (c.test) {
    case 'below':
      test = `${col} < ${doubleLiteral(c.value)}`;
      break;
    case 'atLeast':
      test = `${col} >= ${doubleLiteral(c.value)}`;
      break;
    case 'oneOf':
      test = c.levels.length ? `${col} IN (${c.levels.map(text).join(', ')})` : '1 = 0';
      break;
    case 'noneOf':
      return c.levels.length ? `(${col} IS NULL OR ${col} NOT IN (${c.levels.map(text).join(', ')}))` : '1 = 1';
  }
  return c.orMissing ? `(${test} OR ${col} IS NULL)` : test;
}

/** The CASE expression alone: one WHEN per rule. */
export function rulesCase(rules: readonly { segment: number; conditions: readonly RuleCondition[] }[]): string {
  const whens = rules.map((r) => {
    const test = r.conditions.length ? r.conditions.map(conditionSql).join(' AND ') : '1 = 1';
    return `  WHEN ${test} THEN ${r.segment}`;
  });
  return `CASE\n${whens.join('\n')}\nEND`;
}

export function rulesSql(rules: readonly { segment: number; conditions: readonly RuleCondition[] }[], options: RulesSqlOptions): string {
  const opts = checkOptions(options, ['table', 'id', 'as'], 'toSql');
  if (opts.table === undefined) throw new KinsortError('toSql: give the table to read, e.g. { table: "pass_holders" }.', 'bad-option');
  const table = (typeof opts.table === 'string' ? [opts.table] : [...opts.table]).map(identifier).join('.');
  const id = opts.id === undefined ? '' : `${identifier(opts.id)}, `;
  return `SELECT ${id}${rulesCase(rules)} AS ${identifier(opts.as ?? 'segment')}\nFROM ${table}`;
}
