// The summaries profileInDatabase computes, and the one step that turns them into the
// SegmentProfile[] the cards draw (the same figures profileSegments gives for the same rows):
// used columns become standardised differences (numbers by mean, levels by share), kept columns
// the median and middle half (numbers) or level shares (text).
import { decimalsFor, type KeptSummary, type SegmentProfile, type VariableDifference } from '../profile';

export interface NumericSummary {
  readonly name: string;
  readonly role: 'used' | 'kept';
  readonly kind: 'numeric';
  /** Rows with a value. */
  readonly count: number;
  /** Rows without one (NULL, empty, or a stored missing marker). */
  readonly missing: number;
  readonly mean: number;
  /** Sample variance (n − 1); NaN below two values. */
  readonly variance: number;
  readonly min: number;
  readonly max: number;
  /** Quartiles and median by linear interpolation between order statistics (Hyndman & Fan type 7). */
  readonly q1: number;
  readonly median: number;
  readonly q3: number;
}

export interface LevelSummary {
  readonly name: string;
  readonly role: 'used' | 'kept';
  readonly kind: 'categorical';
  readonly count: number;
  readonly missing: number;
  /** Every level present, exactly as stored, largest count first (ties by level text). */
  readonly levels: readonly { readonly level: string; readonly count: number; readonly share: number }[];
}

export type ColumnSummary = NumericSummary | LevelSummary;

export interface GroupSummary {
  /** People-facing segment number 1..k, or null for all scored rows. */
  readonly segment: number | null;
  readonly size: number;
  readonly columns: readonly ColumnSummary[];
}

export interface CardInput {
  readonly segments: readonly GroupSummary[];
  readonly allRows: GroupSummary;
  /** Per segment: the id of a member at the least distance from its centre, and that distance. */
  readonly typical: readonly { id?: string; distance: number }[];
  readonly names: readonly { title?: string; text?: string }[];
  readonly top: number;
}

/** A used column's comparison of one segment with all rows (undefined when it sets nothing apart). */
function numericDifference(seg: NumericSummary, all: NumericSummary): VariableDifference | undefined {
  const sd = all.count > 1 ? Math.sqrt(all.variance) : NaN;
  if (!(sd > 0) || seg.count === 0) return undefined;
  const unit = all.min >= 0 && all.max <= 1;
  return {
    variable: seg.name,
    segmentMean: seg.mean,
    overallMean: all.mean,
    overallSd: sd,
    difference: (seg.mean - all.mean) / sd,
    shownAs: { unit: unit ? 'percent' : 'number', decimals: decimalsFor(unit ? sd * 100 : sd) },
  };
}

/** Each level as a 0/1 indicator (sorted; a two-level column gives only its second level). */
function levelDifferences(seg: LevelSummary, all: LevelSummary): VariableDifference[] {
  const levels = all.levels.map((l) => l.level).sort();
  const out: VariableDifference[] = [];
  for (const level of levels.length === 2 ? levels.slice(1) : levels) {
    const c = all.levels.find((l) => l.level === level)!.count;
    const n = all.count;
    const mean = c / n;
    const ss = c * (1 - mean) * (1 - mean) + (n - c) * mean * mean;
    const sd = n > 1 ? Math.sqrt(ss / (n - 1)) : NaN;
    if (!(sd > 0) || seg.count === 0) continue;
    const segmentMean = (seg.levels.find((l) => l.level === level)?.count ?? 0) / seg.count;
    out.push({
      variable: seg.name,
      level,
      segmentMean,
      overallMean: mean,
      overallSd: sd,
      difference: (segmentMean - mean) / sd,
      shownAs: { unit: 'percent', decimals: decimalsFor(sd * 100) },
    });
  }
  return out;
}

function keptSummary(c: ColumnSummary): KeptSummary {
  if (c.kind === 'numeric') return { name: c.name, kind: 'numeric', median: c.median, q1: c.q1, q3: c.q3, missing: c.missing };
  return { name: c.name, kind: 'categorical', shares: c.levels.map((l) => ({ ...l })), missing: c.missing };
}

/**
 * The cards' profiles. The typical member is one at the least distance from the segment's centre
 * (its row number in a database table has no meaning: `row` is -1, the id names it).
 */
export function summariesAsProfiles(input: CardInput): SegmentProfile[] {
  const total = input.segments.reduce((s, g) => s + g.size, 0);
  return input.segments.map((g, s) => {
    const differences: VariableDifference[] = [];
    g.columns.forEach((c, j) => {
      if (c.role !== 'used') return;
      const all = input.allRows.columns[j];
      if (c.kind === 'numeric') {
        const d = numericDifference(c, all as NumericSummary);
        if (d) differences.push(d);
      } else differences.push(...levelDifferences(c, all as LevelSummary));
    });
    differences.sort((a, b) => Math.abs(b.difference) - Math.abs(a.difference));
    return {
      segment: s + 1,
      index: s,
      size: g.size,
      share: total > 0 ? g.size / total : NaN,
      title: input.names[s]?.title,
      text: input.names[s]?.text,
      differences,
      standout: differences.slice(0, input.top),
      typical: { row: -1, id: input.typical[s]?.id, how: 'nearest-centroid' },
      kept: g.columns.filter((c) => c.role === 'kept').map(keptSummary),
    };
  });
}
