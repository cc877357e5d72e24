// Drift of newly scored rows against the training rows a definition was fitted on: segment shares,
// the share of rows far from every segment, unseen levels and filled values by column, and each
// feature's population stability index against the training deciles stored in the definition.
// Works on rows scored in memory (assign) and on rows scored by SQL whose segments are handed back.
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import { applyPreparation } from '../prepare';
import type { Preparation } from '../prepare/types';
import { readTable } from '../table';
import type { Table } from '../table/types';
import { assignRows, type AssignmentOutcome } from './assign-rows';
import type { SegmentDefinition } from './definition-types';
import { binShares, stabilityIndex, stabilityReading, STABILITY_READINGS, SHARE_FLOOR } from './training-distributions';

/** One row scored elsewhere (e.g. by the SQL from toSql()): its id, segment and, if known, far flag. */
export interface ScoredRow {
  readonly id: string | number;
  readonly segment: number | null;
  readonly far?: boolean | number | null;
}

export interface DriftOptions {
  /** Segments handed back from scoring elsewhere (SQL), one per new row, matched by id. */
  scored?: readonly ScoredRow[];
  /** Passed to readTable when the rows are not a Table yet. */
  read?: Record<string, unknown>;
}

export interface SegmentDrift {
  /** 1..k */
  readonly segment: number;
  readonly title?: string;
  /** Share of the training rows in this segment. */
  readonly trainingShare: number;
  /** Share of the new rows with a segment that fall in it. */
  readonly newShare: number;
  readonly newRows: number;
}

export interface ColumnDrift {
  readonly column: string;
  /** Levels never seen in training, with how many new rows hold each (most frequent first). */
  readonly unseenLevels: readonly { level: string; rows: number }[];
  /** Missing cells filled with the stored training value. */
  readonly filled: { value: number | string; rows: number } | null;
}

export interface FeatureDrift {
  readonly feature: string;
  /** Population stability index of the new rows against the training deciles. */
  readonly stabilityIndex: number;
  readonly reading: string;
  readonly trainingShares: readonly number[];
  readonly newShares: readonly number[];
}

export interface DriftReport {
  readonly kind: 'drift';
  /** 'memory' when the segments come from assign(); 'scored' when handed back from elsewhere. */
  readonly scoredBy: 'memory' | 'scored';
  readonly inputRows: number;
  /** New rows with a segment (the denominator of every share). */
  readonly scoredRows: number;
  /** New rows the definition could not prepare (no segment), with their reasons in the assignment report. */
  readonly refusedRows: number;
  readonly trainingRows: number;
  readonly segments: readonly SegmentDrift[];
  /** Rows farther from every centre than the training rows were (beyond each segment's farBeyond). */
  readonly far: { readonly trainingShare: number | null; readonly newShare: number; readonly newRows: number };
  readonly columns: readonly ColumnDrift[];
  /** Empty when the definition holds no training distributions (written before they were kept). */
  readonly features: readonly FeatureDrift[];
  /** The reading thresholds of the stability index (common practice). */
  readonly readings: readonly { below: number; reading: string }[];
  readonly notes: readonly string[];
}

function subset(table: Table, names: readonly string[], rows: readonly number[]): Table {
  const columns = names.map((name) => {
    const c = table.columns.find((col) => col.name === name)!;
    return { ...c, values: rows.map((i) => c.values[i]) };
  });
  return { kind: 'table', rowCount: rows.length, columns };
}

interface RowVerdict {
  segment: number | null;
  far: boolean | null;
}

/** Segments handed back from elsewhere, matched to the new rows by id; every row must be there once. */
function fromScored(
  scored: readonly ScoredRow[],
  outcome: AssignmentOutcome,
  k: number,
  noiseAllowed = false,
): { verdicts: RowVerdict[]; farGiven: boolean } {
  if (!Array.isArray(scored)) throw new KinsortError('drift: "scored" must be an array of { id, segment, far } rows.', 'bad-argument');
  const byId = new Map<string, RowVerdict>();
  let farGiven = scored.length > 0;
  scored.forEach((r, i) => {
    if (r === null || typeof r !== 'object' || r.id === undefined || r.id === null) {
      throw new KinsortError(`drift: scored row ${i + 1} has no id.`, 'bad-input');
    }
    const id = String(r.id);
    if (byId.has(id)) throw new KinsortError(`drift: id "${id}" appears twice in the scored rows (row ${i + 1}).`, 'bad-input');
    const s = r.segment === null || r.segment === undefined ? null : Number(r.segment);
    // Density definitions score noise as segment 0 (and far); other rules never give 0.
    const lowest = noiseAllowed ? 0 : 1;
    if (s !== null && !(Number.isInteger(s) && s >= lowest && s <= k)) {
      throw new KinsortError(
        `drift: scored row ${i + 1} (id "${id}") has segment ${JSON.stringify(r.segment)}; expected ${lowest}..${k} or null.`,
        'bad-input',
      );
    }
    if (r.far === undefined || r.far === null) farGiven = false;
    byId.set(id, { segment: s, far: r.far === undefined || r.far === null ? null : Boolean(Number(r.far)) });
  });
  const verdicts = outcome.rows.map((row, i) => {
    const v = byId.get(row.id);
    if (v === undefined) throw new KinsortError(`drift: new row ${i + 1} (id "${row.id}") is not among the scored rows.`, 'bad-input');
    byId.delete(row.id);
    return v;
  });
  if (byId.size > 0) {
    const extra = [...byId.keys()]
      .slice(0, 3)
      .map((id) => `"${id}"`)
      .join(', ');
    throw new KinsortError(`drift: ${byId.size} scored row(s) match no new row (ids ${extra}${byId.size > 3 ? ', …' : ''}).`, 'bad-input');
  }
  return { verdicts, farGiven };
}

/**
 * Drift of `input` (new rows) against the definition's training rows. `outcome` is the in-memory
 * assignment of the same rows when the caller has it already.
 */
export function driftOf(
  definition: SegmentDefinition,
  input: unknown,
  options: DriftOptions = {},
  outcome?: AssignmentOutcome,
): DriftReport {
  const opts = checkOptions(options, ['scored', 'read'], 'drift');
  const table = readTable(input, opts.read as never);
  const assigned = outcome ?? assignRows(definition, table);
  const k = definition.segments.length;
  const notes: string[] = [];
  let verdicts: RowVerdict[] = assigned.rows.map((r) => ({ segment: r.segment, far: r.far }));
  if (opts.scored !== undefined) {
    const handed = fromScored(opts.scored, assigned, k, definition.rule === 'nearest-dense-row');
    if (!handed.farGiven) {
      notes.push('The scored rows carry no "far" flag for every row: far rows are counted from the in-memory assignment.');
      handed.verdicts.forEach((v, i) => (v.far = v.segment === null ? null : assigned.rows[i].far));
    }
    const differ = handed.verdicts.filter((v, i) => v.segment !== assigned.rows[i].segment).length;
    if (differ > 0) notes.push(`${differ} row(s) got a different segment when scored elsewhere than in memory.`);
    verdicts = handed.verdicts;
  }

  const counts = new Array<number>(k).fill(0);
  let scoredRows = 0;
  let farRows = 0;
  for (const v of verdicts) {
    if (v.segment === null) continue;
    scoredRows++;
    // Noise (segment 0, density definitions) is in no segment's share; it counts as far.
    if (v.segment >= 1) counts[v.segment - 1]++;
    if (v.far) farRows++;
  }
  const segments: SegmentDrift[] = definition.segments.map((s, c) => ({
    segment: s.number,
    title: s.title,
    trainingShare: s.size / definition.training.rows,
    newShare: scoredRows === 0 ? 0 : counts[c] / scoredRows,
    newRows: counts[c],
  }));

  const columns = new Map<string, { unseen: Map<string, number>; filled: ColumnDrift['filled'] }>();
  const entry = (column: string) => {
    if (!columns.has(column)) columns.set(column, { unseen: new Map(), filled: null });
    return columns.get(column)!;
  };
  for (const u of assigned.report.unseenLevels) {
    const e = entry(u.column);
    e.unseen.set(u.level, (e.unseen.get(u.level) ?? 0) + 1);
  }
  for (const f of assigned.report.imputed) entry(f.column).filled = { value: f.value, rows: f.count };
  const columnDrift: ColumnDrift[] = [...columns].map(([column, e]) => ({
    column,
    unseenLevels: [...e.unseen].map(([level, rows]) => ({ level, rows })).sort((a, b) => b.rows - a.rows || (a.level < b.level ? -1 : 1)),
    filled: e.filled,
  }));

  const features: FeatureDrift[] = [];
  const stored = definition.trainingDistributions;
  if (stored === undefined) {
    notes.push(
      'This definition keeps no training distributions (written by an older kinsort): rebuild it to measure the shift of each feature.',
    );
  } else {
    const prepared = assigned.rows.map((r, i) => (r.segment === null ? -1 : i)).filter((i) => i >= 0);
    if (prepared.length > 0) {
      const prep = definition.preparation as unknown as Preparation;
      const needed = [...(prep.idColumn === null ? [] : [prep.idColumn]), ...prep.columns.map((c) => c.name)];
      const m = applyPreparation(prep, subset(table, needed, prepared)).matrix;
      const column = new Float64Array(m.rows);
      definition.features.forEach((name, j) => {
        for (let i = 0; i < m.rows; i++) column[i] = m.data[i * m.cols + j];
        const { cuts, shares } = stored.features[j];
        const fresh = binShares(cuts, column);
        const index = stabilityIndex(shares, fresh);
        features.push({ feature: name, stabilityIndex: index, reading: stabilityReading(index), trainingShares: shares, newShares: fresh });
      });
    }
    notes.push(
      `Stability index per feature over the training deciles; empty bins count as a share of ${SHARE_FLOOR}. ` +
        'Readings below 0.1, 0.1–0.25 and above 0.25 are common practice, not a test.',
    );
  }
  return {
    kind: 'drift',
    scoredBy: opts.scored === undefined ? 'memory' : 'scored',
    inputRows: assigned.report.inputRows,
    scoredRows,
    refusedRows: assigned.rows.length - assigned.report.assignedRows,
    trainingRows: definition.training.rows,
    segments,
    far: { trainingShare: stored?.farShare ?? null, newShare: scoredRows === 0 ? 0 : farRows / scoredRows, newRows: farRows },
    columns: columnDrift,
    features,
    readings: STABILITY_READINGS.map((r) => ({ ...r })),
    notes,
  };
}
