// The numbers behind the profile cards: size and share, the variables that set each segment
// apart (standardised difference from the whole), a typical member, profile-only columns
// summarised, stability where computed. Views only draw these; no numerics live in views/.
import { quantileSorted } from '../core/quantile';
import { compactLabels } from '../core/assignment';
import { KinsortError } from '../core/errors';
import { Matrix, toMatrix, RowsInput } from '../core/matrix';
import { checkInteger, checkOptions } from '../core/options';

export type ProfileValue = number | string | boolean | null | undefined;
export type ProfileColumns = Readonly<Record<string, readonly ProfileValue[]>>;

export interface ProfileInput {
  /** Segment of every row (any integers; compacted to 0..k-1 in increasing order). */
  assignment: ArrayLike<number>;
  /** The prepared feature rows the segments were fitted on (for the typical member). */
  features: RowsInput;
  /** Row ids, used to name the typical member. */
  ids?: readonly string[];
  /** Raw values of the columns the segmentation used; numbers compared by mean, text by level shares. */
  used?: ProfileColumns;
  /** Columns kept for describing only (not fitted on): summarised per segment. */
  keep?: ProfileColumns;
  /** Row index of each segment's medoid when the method chose them (k-medoids). */
  medoids?: readonly number[];
  /** Per-segment stability (bootstrap Jaccard) and its reading. */
  stability?: { jaccard: readonly number[]; reading: readonly string[] };
  /** Analyst's names and write-ups, by segment number 1..k. */
  names?: Readonly<Record<number, { title?: string; text?: string }>>;
  /** How many variables to list as standing out (default 6). */
  top?: number;
}

export interface VariableDifference {
  /** Column name. */
  readonly variable: string;
  /** For a text column, the level whose share is compared. */
  readonly level?: string;
  /** Mean in the segment (share for a level). */
  readonly segmentMean: number;
  /** Mean over all rows with a value (share for a level). */
  readonly overallMean: number;
  /** Sample standard deviation (n − 1) over all rows with a value. */
  readonly overallSd: number;
  /** (segmentMean − overallMean) / overallSd. */
  readonly difference: number;
  /** How to print the two means in the column's own units (see `shownAs`). */
  readonly shownAs: ShownAs;
}

/**
 * How a compared value reads in its own units: 'percent' for a level's share and for a numeric
 * column whose values all lie in 0..1 (a share, or a 0/1 flag); 'number' otherwise.
 * `decimals` keeps two significant digits of the spread (in the printed unit), so segment and
 * all-rows values of one column are rounded alike and no closer than the spread justifies.
 */
export interface ShownAs {
  readonly unit: 'percent' | 'number';
  readonly decimals: number;
}

/** Decimals that keep two significant digits of `spread` (0..4). */
export function decimalsFor(spread: number): number {
  if (!(spread > 0) || !Number.isFinite(spread)) return 0;
  return Math.min(4, Math.max(0, 1 - Math.floor(Math.log10(spread))));
}

/** A compared mean in its own units: "11.1", "62 %". */
export function formatShown(value: number, shown: ShownAs): string {
  if (!Number.isFinite(value)) return '—';
  const v = shown.unit === 'percent' ? value * 100 : value;
  const text = v.toLocaleString('en-US', { minimumFractionDigits: shown.decimals, maximumFractionDigits: shown.decimals });
  return shown.unit === 'percent' ? `${text}\u00a0%` : text; // no break inside "62 %"
}

export type KeptSummary =
  | {
      readonly name: string;
      readonly kind: 'numeric';
      readonly median: number;
      readonly q1: number;
      readonly q3: number;
      readonly missing: number;
    }
  | {
      readonly name: string;
      readonly kind: 'categorical';
      readonly shares: readonly { level: string; count: number; share: number }[];
      readonly missing: number;
    };

export interface TypicalMember {
  /** 0-based row index. */
  readonly row: number;
  readonly id?: string;
  /** 'given': the method's medoid; 'exact': least total distance to the other members; 'nearest-centroid' for large segments. */
  readonly how: 'given' | 'exact' | 'nearest-centroid';
  /** Its raw values on the compared (used) columns, when those were given. */
  readonly values?: Readonly<Record<string, ProfileValue>>;
}

export interface SegmentProfile {
  /** People-facing number, 1..k. */
  readonly segment: number;
  /** Core number, 0..k-1. */
  readonly index: number;
  readonly size: number;
  /** size / all rows. */
  readonly share: number;
  readonly title?: string;
  readonly text?: string;
  /** Every compared variable, largest |difference| first. */
  readonly differences: readonly VariableDifference[];
  /** The first `top` of `differences`. */
  readonly standout: readonly VariableDifference[];
  readonly typical: TypicalMember;
  readonly kept: readonly KeptSummary[];
  readonly stability?: { readonly jaccard: number; readonly reading: string };
  /**
   * How many of this segment's members the definition's rule (nearest centre / medoid) keeps in it,
   * when that is known (the fluent layer sets it): fewer than `size` means new rows like those
   * members would be scored into another segment.
   */
  readonly rule?: { readonly name: string; readonly reproduced: number; readonly size: number };
}

/** Segments larger than this get the member nearest the centroid instead of the exact medoid. */
export const EXACT_MEDOID_LIMIT = 3000;

const OPTIONS = ['assignment', 'features', 'ids', 'used', 'keep', 'medoids', 'stability', 'names', 'top'];

const isMissing = (v: ProfileValue): boolean => v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v)) || v === '';

/**
 * One profile per segment. Differences are computed on the raw `used` columns: numeric columns
 * by mean, text columns as one 0/1 indicator per level (so the difference is in shares). Rows
 * missing a value are left out of that column's figures. The typical member is the given
 * medoid; else the member with the least summed Euclidean distance to the others in the
 * prepared space (exact up to EXACT_MEDOID_LIMIT members), else the member nearest the centroid.
 */
export function profileSegments(input: ProfileInput): SegmentProfile[] {
  checkOptions(input, OPTIONS, 'profileSegments');
  const features = toMatrix(input.features, { what: 'profileSegments features' });
  const n = features.rows;
  const { labels, k, sizes } = compactLabels(input.assignment, n, 'profileSegments', 'the feature rows');
  const top = input.top === undefined ? 6 : checkInteger(input.top, 'profileSegments top', 1);
  if (input.ids !== undefined && input.ids.length !== n) {
    throw new KinsortError(`profileSegments: ${input.ids.length} ids for ${n} rows.`, 'bad-input');
  }
  checkColumns(input.used, n, 'used');
  checkColumns(input.keep, n, 'keep');
  if (input.medoids !== undefined) checkMedoids(input.medoids, labels, k);
  if (input.stability !== undefined && input.stability.jaccard.length !== k) {
    throw new KinsortError(`profileSegments: stability has ${input.stability.jaccard.length} scores for ${k} segments.`, 'bad-input');
  }

  const indicators = toIndicators(input.used ?? {}, n);
  const perSegment = indicators.map((col) => compareColumn(col, labels, k));

  const profiles: SegmentProfile[] = [];
  for (let s = 0; s < k; s++) {
    const differences = perSegment
      .map((c) => c[s])
      .filter((d): d is VariableDifference => d !== undefined)
      .sort((a, b) => Math.abs(b.difference) - Math.abs(a.difference));
    const row = input.medoids ? input.medoids[s] : typicalRow(features, labels, s, sizes[s]);
    const how: TypicalMember['how'] = input.medoids ? 'given' : sizes[s] <= EXACT_MEDOID_LIMIT ? 'exact' : 'nearest-centroid';
    const named = input.names?.[s + 1];
    profiles.push({
      segment: s + 1,
      index: s,
      size: sizes[s],
      share: sizes[s] / n,
      title: named?.title,
      text: named?.text,
      differences,
      standout: differences.slice(0, top),
      typical: {
        row,
        id: input.ids?.[row],
        how,
        values: input.used ? Object.fromEntries(Object.entries(input.used).map(([name, v]) => [name, v[row]])) : undefined,
      },
      kept: Object.entries(input.keep ?? {}).map(([name, values]) => summariseKept(name, values, labels, s)),
      stability: input.stability ? { jaccard: input.stability.jaccard[s], reading: input.stability.reading[s] } : undefined,
    });
  }
  return profiles;
}

function checkColumns(columns: ProfileColumns | undefined, n: number, what: string): void {
  if (columns === undefined) return;
  for (const [name, values] of Object.entries(columns)) {
    if (!Array.isArray(values) || values.length !== n) {
      throw new KinsortError(
        `profileSegments: ${what} column "${name}" has ${Array.isArray(values) ? values.length : 'no'} values for ${n} rows.`,
        'bad-input',
      );
    }
  }
}

function checkMedoids(medoids: readonly number[], labels: Int32Array, k: number): void {
  if (medoids.length !== k) {
    throw new KinsortError(`profileSegments: ${medoids.length} medoids for ${k} segments.`, 'bad-input');
  }
  medoids.forEach((m, s) => {
    if (!Number.isInteger(m) || m < 0 || m >= labels.length || labels[m] !== s) {
      throw new KinsortError(
        `profileSegments: medoid of segment ${s + 1} is row ${m + 1}, which is not a member of that segment.`,
        'bad-input',
      );
    }
  });
}

interface Indicator {
  variable: string;
  level?: string;
  /** A level, or a numeric column whose values all lie in 0..1 (a share or a 0/1 flag): printed as a percentage. */
  share: boolean;
  /** NaN where missing. */
  values: Float64Array;
}

/**
 * Numeric columns as they are; text columns as one 0/1 column per level (levels sorted). A
 * two-level column gives only its second level: the first is its mirror image (same size of
 * difference, opposite sign) and would take a second place in the list for nothing.
 */
function toIndicators(columns: ProfileColumns, n: number): Indicator[] {
  const out: Indicator[] = [];
  for (const [variable, raw] of Object.entries(columns)) {
    const numeric = raw.every((v) => isMissing(v) || typeof v === 'number');
    if (numeric) {
      const values = new Float64Array(n);
      let unit = true;
      for (let i = 0; i < n; i++) {
        const v = isMissing(raw[i]) ? NaN : (raw[i] as number);
        values[i] = v;
        if (v < 0 || v > 1) unit = false;
      }
      out.push({ variable, values, share: unit });
      continue;
    }
    const levels = Array.from(new Set(raw.filter((v) => !isMissing(v)).map(String))).sort();
    for (const level of levels.length === 2 ? levels.slice(1) : levels) {
      const values = new Float64Array(n);
      for (let i = 0; i < n; i++) values[i] = isMissing(raw[i]) ? NaN : String(raw[i]) === level ? 1 : 0;
      out.push({ variable, level, values, share: true });
    }
  }
  return out;
}

/** Per segment, the standardised difference of one column (undefined when it cannot be formed). */
function compareColumn(col: Indicator, labels: Int32Array, k: number): (VariableDifference | undefined)[] {
  const sums = new Float64Array(k);
  const counts = new Float64Array(k);
  let total = 0;
  let count = 0;
  for (let i = 0; i < labels.length; i++) {
    const v = col.values[i];
    if (Number.isNaN(v)) continue;
    sums[labels[i]] += v;
    counts[labels[i]] += 1;
    total += v;
    count += 1;
  }
  const mean = total / count;
  let ss = 0;
  for (let i = 0; i < labels.length; i++) {
    const v = col.values[i];
    if (!Number.isNaN(v)) ss += (v - mean) * (v - mean);
  }
  const sd = count > 1 ? Math.sqrt(ss / (count - 1)) : NaN;
  const out: (VariableDifference | undefined)[] = [];
  for (let s = 0; s < k; s++) {
    // A constant column, or a segment with no values in it, sets nothing apart.
    if (!(sd > 0) || counts[s] === 0) {
      out.push(undefined);
      continue;
    }
    const segmentMean = sums[s] / counts[s];
    out.push({
      variable: col.variable,
      level: col.level,
      segmentMean,
      overallMean: mean,
      overallSd: sd,
      difference: (segmentMean - mean) / sd,
      shownAs: { unit: col.share ? 'percent' : 'number', decimals: decimalsFor(col.share ? sd * 100 : sd) },
    });
  }
  return out;
}

/** Exact medoid (least summed distance) for segments up to the limit, else nearest the centroid. */
function typicalRow(m: Matrix, labels: Int32Array, s: number, size: number): number {
  const members: number[] = [];
  for (let i = 0; i < labels.length; i++) if (labels[i] === s) members.push(i);
  const d = m.cols;
  const x = m.data;
  if (size <= EXACT_MEDOID_LIMIT) {
    const totals = new Float64Array(members.length);
    for (let a = 0; a < members.length; a++) {
      const ia = members[a] * d;
      for (let b = a + 1; b < members.length; b++) {
        const ib = members[b] * d;
        let ss = 0;
        for (let j = 0; j < d; j++) {
          const t = x[ia + j] - x[ib + j];
          ss += t * t;
        }
        const dist = Math.sqrt(ss);
        totals[a] += dist;
        totals[b] += dist;
      }
    }
    let best = 0;
    for (let a = 1; a < members.length; a++) if (totals[a] < totals[best]) best = a;
    return members[best];
  }
  const centre = new Float64Array(d);
  for (const i of members) for (let j = 0; j < d; j++) centre[j] += x[i * d + j] / members.length;
  let best = members[0];
  let bestDistance = Infinity;
  for (const i of members) {
    let ss = 0;
    for (let j = 0; j < d; j++) ss += (x[i * d + j] - centre[j]) ** 2;
    if (ss < bestDistance) {
      bestDistance = ss;
      best = i;
    }
  }
  return best;
}

function summariseKept(name: string, raw: readonly ProfileValue[], labels: Int32Array, s: number): KeptSummary {
  const values: ProfileValue[] = [];
  let missing = 0;
  for (let i = 0; i < labels.length; i++) {
    if (labels[i] !== s) continue;
    if (isMissing(raw[i])) missing++;
    else values.push(raw[i]);
  }
  const numeric = raw.every((v) => isMissing(v) || typeof v === 'number');
  if (numeric) {
    const sorted = Float64Array.from(values as number[]).sort();
    return {
      name,
      kind: 'numeric',
      median: quantileSorted(sorted, 0.5),
      q1: quantileSorted(sorted, 0.25),
      q3: quantileSorted(sorted, 0.75),
      missing,
    };
  }
  const counts = new Map<string, number>();
  for (const v of values) counts.set(String(v), (counts.get(String(v)) ?? 0) + 1);
  const shares = Array.from(counts, ([level, count]) => ({ level, count, share: count / values.length })).sort(
    (a, b) => b.count - a.count || (a.level < b.level ? -1 : 1),
  );
  return { name, kind: 'categorical', shares, missing };
}
