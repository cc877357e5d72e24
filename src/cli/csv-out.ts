// Writing the scored rows as CSV (RFC 4180 quoting), for a spreadsheet or for a database.
//
// A spreadsheet reads a cell that starts with = + - @ (or a tab or carriage return before one of
// them) as a formula, so an id such as `=HYPERLINK(…)` would run when the file is opened. For a
// spreadsheet (the default) such cells get a leading apostrophe, which spreadsheets show as text;
// for a database the ids are written exactly as given, so they join back to the source table.
import type { AssignmentOutcome } from '../segments/assign-rows';

export const CSV_TARGETS = ['spreadsheet', 'database'] as const;
export type CsvTarget = (typeof CSV_TARGETS)[number];

const FORMULA_START = /^[=+\-@\t\r]/;
/** A plain number is not a formula (so "-12.5" and "+3" stay as they are). */
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** True when a spreadsheet would read the cell as a formula. */
export function readsAsFormula(value: string): boolean {
  return FORMULA_START.test(value) && !PLAIN_NUMBER.test(value);
}

/** The cell as a spreadsheet shows it as text: a leading apostrophe when it would be a formula. */
export function guardFormula(value: string): string {
  return readsAsFormula(value) ? `'${value}` : value;
}

function field(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

export function scoredCsv(idColumn: string, outcome: AssignmentOutcome, target: CsvTarget = 'spreadsheet'): string {
  const text = target === 'spreadsheet' ? guardFormula : (v: string) => v;
  // Mixture definitions also give each row the posterior probability of its segment.
  const withProbability = outcome.rows.some((r) => r.probability !== undefined);
  const lines = [[text(idColumn), 'segment', 'distance', 'far', ...(withProbability ? ['probability'] : [])].map(field).join(',')];
  for (const r of outcome.rows) {
    lines.push(
      [
        field(text(r.id)),
        r.segment === null ? '' : String(r.segment),
        r.distance === null ? '' : String(r.distance),
        r.far === null ? '' : r.far ? '1' : '0',
        ...(withProbability ? [r.probability === null || r.probability === undefined ? '' : String(r.probability)] : []),
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}
