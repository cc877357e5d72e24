// Where rows are read from, as SQL: a table (or view) name, quoted part by part, or the user's own
// SELECT wrapped as a subquery. Both the scoring SQL and the database passes (sampling, refining)
// read their rows through this one reference.
import { KinsortError } from '../core/errors';
import type { SqlDialect } from './dialect';
import { checkSqlText } from './sql-safety';

/** A table name: "table", "schema.table", or the parts as an array when a part holds a dot. */
export type TableName = string | readonly string[];

/** The table as quoted parts; anything that is not a plain (qualified) name is refused. `where` names the call. */
export function tableReference(table: TableName, dialect: SqlDialect, where = 'toSql'): string {
  const parts = typeof table === 'string' ? table.split('.') : Array.isArray(table) ? [...table] : null;
  const shown = JSON.stringify(table).slice(0, 120);
  if (parts === null || parts.length < 1 || parts.length > 3 || parts.some((p) => typeof p !== 'string' || p.trim() === '')) {
    throw new KinsortError(
      `${where}: the table ${shown} is not a name: give "table", "schema.table" or "catalog.schema.table", or the parts as an array when a part holds a dot.`,
      'bad-argument',
    );
  }
  for (const p of parts) {
    if (/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/.test(p) || (typeof table === 'string' && /["`]/.test(p))) {
      throw new KinsortError(
        `${where}: the table ${shown} holds quotes or control characters; give the parts of a qualified name unquoted, e.g. { table: ['sales', 'riders'] }, and kinsort quotes each one.`,
        'bad-argument',
      );
    }
  }
  return parts.map((p) => dialect.quoteIdentifier(p)).join('.');
}

/** The rows a database pass reads: a table, or a query of the user's (one SELECT, run as a subquery). */
export interface RowSource {
  /** SQL for the FROM clause: a quoted table name, or `(query) AS "kinsort_source"`. */
  readonly from: string;
  /** For messages: `table "riders"` or `the query`. */
  readonly shown: string;
}

/** Exactly one of `table` and `query`, as a FROM clause. */
export function rowSource(table: TableName | undefined, query: string | undefined, dialect: SqlDialect, where: string): RowSource {
  if ((table === undefined) === (query === undefined)) {
    throw new KinsortError(`${where}: give either table (a name) or query (a SELECT), one of the two.`, 'bad-argument');
  }
  if (table !== undefined) {
    return {
      from: tableReference(table, dialect, where),
      shown: `table ${JSON.stringify(typeof table === 'string' ? table : table.join('.'))}`,
    };
  }
  if (typeof query !== 'string' || query.trim() === '') {
    throw new KinsortError(`${where}: query must be the text of one SELECT.`, 'bad-argument');
  }
  // One statement only: a trailing semicolon is dropped, any other would end the subquery.
  const body = checkSqlText(query, 'the query').trim().replace(/;\s*$/, '');
  return { from: `(\n${body}\n) AS ${dialect.quoteIdentifier('kinsort_source')}`, shown: 'the query' };
}
