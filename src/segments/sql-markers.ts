// The stored text rule the SQL follows: missing markers, decimal mark and how levels match, read
// from the definition. A definition written before the schema was stored (preparation version 1)
// gets the text rule's defaults, kinsort-text-1.
import type { DecimalMark } from '../engines/dialect';
import type { PreparedColumn, Preparation } from '../prepare/types';

export const TEXT_RULE_MARKERS: readonly string[] = ['NA', 'N/A', 'n/a', '#N/A', 'NaN', 'nan', 'null', 'NULL'];

export interface StoredTextRule {
  readonly missingMarkers: readonly string[];
  readonly decimalMark: DecimalMark;
}

export function storedTextRule(prep: Preparation): StoredTextRule {
  const p = prep as unknown as { missingMarkers?: unknown; decimalMark?: unknown };
  const markers =
    Array.isArray(p.missingMarkers) && p.missingMarkers.every((m) => typeof m === 'string') ? p.missingMarkers : TEXT_RULE_MARKERS;
  return { missingMarkers: markers, decimalMark: p.decimalMark === ',' ? ',' : '.' };
}

/** 'ascii-case': a binary true/false column, whose cells match its levels in any ASCII letter case. */
export function levelMatchOf(col: PreparedColumn): 'exact' | 'ascii-case' {
  return (col as unknown as { levelMatch?: unknown }).levelMatch === 'ascii-case' ? 'ascii-case' : 'exact';
}
