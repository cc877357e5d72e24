// Pass holders of our own making for the rules tests: the demo table (seeded script) with one
// zone renamed to text that needs quoting everywhere, and new rows with the awkward cases (missing
// numbers and levels, a zone never seen, quotes and non-ASCII text).
import { readFileSync } from 'fs';
import { join } from 'path';
import { readTable } from '../../src/table';
import type { Cell } from '../../src/table/types';
import { fitRules, type SegmentRules } from '../../src/segments';
import { specFromCells } from '../../src/segments/rules-columns';

export const AWKWARD_ZONE = `Harbour's "Quay" — Süd`;

export type Row = Record<string, Cell>;

export function trainingRows(): Row[] {
  const table = readTable(readFileSync(join(__dirname, '../../demo-data/pass-holders.csv'), 'utf8'));
  const rows: Row[] = [];
  for (let i = 0; i < table.rowCount; i++) {
    const row: Row = {};
    for (const c of table.columns) row[c.name] = c.values[i];
    if (row.home_zone === 'Eastfield') row.home_zone = AWKWARD_ZONE;
    rows.push(row);
  }
  return rows;
}

export function newRows(training: Row[]): Row[] {
  return training.slice(0, 240).map((r, i) => {
    const row: Row = { ...r, holder_id: `NEW-${i}` };
    if (i % 7 === 0) row.trips_per_week = null;
    if (i % 11 === 0) row.peak_share = null;
    if (i % 5 === 0) row.home_zone = i % 10 === 0 ? 'Moonbase' : null;
    if (i % 13 === 0) row.fare_type = null;
    if (i % 17 === 0) row.age_band = 'unknown band';
    if (i % 9 === 0) row.weekend_share = null;
    return row;
  });
}

export const NUMERIC = [
  'trips_per_week',
  'peak_share',
  'weekend_share',
  'avg_trip_km',
  'topups_per_month',
  'tenure_months',
  'monthly_spend',
];
export const TEXT = ['holder_id', 'fare_type', 'autopay', 'home_zone', 'age_band'];

/** Rules that must split on the zone whose name needs quoting (segments made from the zone and trips). */
export function zoneRulesFor(training: Row[]): SegmentRules {
  const truth = Int32Array.from(
    training.map((r) => (r.home_zone === AWKWARD_ZONE || r.home_zone === 'Outer Vale' ? 0 : (r.trips_per_week as number) > 10 ? 2 : 1)),
  );
  const specs = [
    specFromCells(
      'home_zone',
      training.map((r) => r.home_zone),
    ),
    specFromCells(
      'trips_per_week',
      training.map((r) => r.trips_per_week),
    ),
  ];
  return fitRules({ specs, cells: specs.map((s) => training.map((r) => r[s.name])), assignment: truth, k: 3 }, { depth: 3, minLeaf: 5 });
}
