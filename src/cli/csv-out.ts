// Writing the scored rows as CSV (RFC 4180 quoting).
import type { AssignmentOutcome } from '../segments/assign-rows';

function field(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

export function scoredCsv(idColumn: string, outcome: AssignmentOutcome): string {
  const lines = [[idColumn, 'segment', 'distance', 'far'].map(field).join(',')];
  for (const r of outcome.rows) {
    lines.push(
      [
        field(r.id),
        r.segment === null ? '' : String(r.segment),
        r.distance === null ? '' : String(r.distance),
        r.far === null ? '' : r.far ? '1' : '0',
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}
