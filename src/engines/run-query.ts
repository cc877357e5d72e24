// Every statement a database pass sends goes through here, so a failure always says which engine,
// which call and what is wrong: a table that cannot be read or a column that is not there is found
// by small probes (each `… LIMIT 0`, reading no rows) after the failure; anything else carries the
// driver's own message. The driver's text is shown with control characters escaped.
import { KinsortError } from '../core/errors';
import { forTerminal } from '../core/terminal-text';
import { dialectNamed } from './dialects';
import type { SqlEngine } from './engine';
import type { RowSource } from './source';

export interface QueryContext {
  /** The call, for messages: "sampleFromDatabase", "refineInDatabase". */
  readonly where: string;
  /** The rows the statement reads, probed when it fails. */
  readonly source?: RowSource;
  /** The columns it reads by name, probed one by one when it fails. */
  readonly columns?: readonly string[];
}

/** The driver's message, on one line and at most 400 characters. */
export function driverMessage(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  const line = forTerminal(text.trim());
  return line.length > 400 ? `${line.slice(0, 397)}...` : line;
}

async function fails(engine: SqlEngine, sql: string): Promise<unknown> {
  try {
    await engine.query(sql);
    return undefined;
  } catch (error) {
    return error ?? new Error('failed');
  }
}

/** Run one statement; a failure becomes a KinsortError naming the engine, the call and the cause. */
export async function runQuery(engine: SqlEngine, sql: string, context: QueryContext): Promise<Record<string, unknown>[]> {
  let rows: Record<string, unknown>[];
  try {
    rows = await engine.query(sql);
  } catch (error) {
    throw await diagnose(engine, error, context);
  }
  if (!Array.isArray(rows)) {
    throw new KinsortError(
      `${context.where} on ${dialectNamed(engine.dialect).title}: the engine's query() gave ${typeof rows}, not an array of row objects.`,
      'query-failed',
    );
  }
  return rows;
}

async function diagnose(engine: SqlEngine, error: unknown, context: QueryContext): Promise<KinsortError> {
  const d = dialectNamed(engine.dialect);
  const on = `${context.where} on ${d.title}`;
  const said = `The engine said: ${driverMessage(error)}`;
  const source = context.source;
  if (source !== undefined) {
    const unreadable = await fails(engine, `SELECT 1 AS ${d.quoteIdentifier('kinsort_probe')} FROM ${source.from} LIMIT 0`);
    if (unreadable !== undefined) {
      return new KinsortError(
        `${on}: ${source.shown} cannot be read (check its name, its schema and that this connection may read it). The engine said: ${driverMessage(unreadable)}`,
        'query-failed',
      );
    }
    for (const column of context.columns ?? []) {
      const missing = await fails(engine, `SELECT ${d.quoteIdentifier(column)} FROM ${source.from} LIMIT 0`);
      if (missing !== undefined) {
        return new KinsortError(
          `${on}: ${source.shown} has no column ${JSON.stringify(column)} (names are matched exactly as the definition stores them). The engine said: ${driverMessage(missing)}`,
          'query-failed',
        );
      }
    }
  }
  return new KinsortError(`${on}: the query failed. ${said}`, 'query-failed');
}
