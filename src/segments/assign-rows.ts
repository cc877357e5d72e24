// Assign new rows with a definition: the stored preparation, then the nearest centre / medoid.
// No row disappears: a row that cannot be prepared (a missing value under 'refuse' or 'drop', text
// in a numeric column, a binary or ordinal level never seen in training) is in the output with
// segment null and is named by id in the report with its reason. A categorical level never seen in
// training follows the preparation's rule (all its indicators 0) and is reported.
import { KinsortError, didYouMean } from '../core/errors';
import { checkOptions } from '../core/options';
import { applyPreparation } from '../prepare';
import { readUnderSchema } from '../prepare/applyPreparation';
import { readIds } from '../prepare/ids';
import type { ImputedColumn, Preparation, PreparedData, UnseenLevel } from '../prepare/types';
import { readTable } from '../table';
import { isTable, type Table, type TableColumn } from '../table/types';
import { nearestCenters } from './assign-nearest';
import { nearestDenseRows } from './dense-rows';
import type { DefinitionMetric, SegmentDefinition } from './definition-types';
import { mixtureFigures, scoreMixture } from './mixture-rule';

export interface AssignOptions {
  /**
   * Reading CSV text: { delimiter }. Types, missing markers and the decimal mark are never taken from
   * here or from the batch: the definition stores them.
   */
  read?: { delimiter?: ',' | ';' | '\t' };
}

export interface AssignedRow {
  readonly id: string;
  /**
   * 1-based segment, or null when the row could not be prepared (see the report). Density
   * definitions (nearest-dense-row) give 0 to a row in no segment (noise), and `far` is then true.
   */
  readonly segment: number | null;
  /** Distance to the segment's centre / medoid under the definition's metric. */
  readonly distance: number | null;
  /** True when the row is farther than every segment's `farBeyond`. */
  readonly far: boolean | null;
  /** Mixture definitions only (rule highest-posterior): the posterior probability of the segment given. */
  readonly probability?: number | null;
}

export interface RefusedRow {
  readonly id: string;
  /** 0-based input row, as in the intake's report of dropped rows. */
  readonly row: number;
  readonly reason: string;
}

export interface AssignmentReport {
  readonly inputRows: number;
  readonly assignedRows: number;
  readonly refused: RefusedRow[];
  readonly unseenLevels: UnseenLevel[];
  readonly imputed: ImputedColumn[];
  /** Input columns the definition does not use (ignored). */
  readonly ignoredColumns: string[];
  readonly notes: string[];
}

export interface AssignmentOutcome {
  readonly rows: AssignedRow[];
  readonly report: AssignmentReport;
}

/** The used columns of row i that are missing and that the stored policy does not fill. */
function unfilledMissing(prep: Preparation, columns: Map<string, TableColumn>, i: number): string[] {
  const missing: string[] = [];
  for (const spec of prep.columns) {
    if (columns.get(spec.name)!.values[i] !== null) continue;
    if (prep.missing !== 'median' || spec.fill === null) missing.push(spec.name);
  }
  return missing;
}

function subsetTable(table: Table, names: readonly string[], rows: readonly number[]): Table {
  const columns = names.map((name) => {
    const c = table.columns.find((col) => col.name === name)!;
    return { ...c, values: rows.map((i) => c.values[i]) };
  });
  return { kind: 'table', rowCount: rows.length, columns };
}

export function assignRows(definition: SegmentDefinition, input: unknown, options?: AssignOptions): AssignmentOutcome {
  const opts = checkOptions(options, ['read'], 'assign');
  const prep = definition.preparation as unknown as Preparation;
  const read = checkOptions(opts.read, ['delimiter'], 'assign read');
  const table =
    read.delimiter === undefined || isTable(input)
      ? readUnderSchema(prep, input, 'assign')
      : readTable(input, { delimiter: read.delimiter, missingMarkers: prep.missingMarkers, decimalMark: prep.decimalMark });
  const names = table.columns.map((c) => c.name);
  const needed = [...(prep.idColumn === null ? [] : [prep.idColumn]), ...prep.columns.map((c) => c.name)];
  const absent = needed.filter((n) => !names.includes(n));
  if (absent.length > 0) {
    const hint = absent.length === 1 ? didYouMean(absent[0], names) : '';
    throw new KinsortError(
      `assign: the rows lack column${absent.length > 1 ? 's' : ''} ${absent.map((n) => `"${n}"`).join(', ')}, which the definition uses.${hint} ` +
        `Columns given: ${names.join(', ')}.`,
      'unknown-column',
    );
  }
  const known = new Set([...needed, ...prep.keep]);
  const ignoredColumns = names.filter((n) => !known.has(n));
  const ids = readIds(table, prep.idColumn, 'assign');
  const byName = new Map(table.columns.map((c) => [c.name, c]));

  const refused: RefusedRow[] = [];
  let good: number[] = [];
  for (let i = 0; i < table.rowCount; i++) {
    const missing = unfilledMissing(prep, byName, i);
    if (missing.length === 0) good.push(i);
    else {
      const why =
        prep.missing === 'median'
          ? 'the training rows had no missing value there, so no median was stored: fill the value or refit with this column missing in training'
          : `the definition's missing-value policy is '${prep.missing}': fill the value before assigning`;
      refused.push({ id: ids[i], row: i, reason: `missing value in ${missing.join(', ')} (${why})` });
    }
  }

  // One pass over the rows that can be prepared; if a cell is refused (text in a numeric column,
  // a binary or ordinal level never seen in training), find the rows that fail one at a time.
  let prepared: PreparedData | undefined;
  if (good.length > 0) {
    try {
      prepared = applyPreparation(prep, subsetTable(table, needed, good));
    } catch (e) {
      if (!(e instanceof KinsortError)) throw e;
      const stillGood: number[] = [];
      for (const i of good) {
        try {
          applyPreparation(prep, subsetTable(table, needed, [i]));
          stillGood.push(i);
        } catch (one) {
          if (!(one instanceof KinsortError)) throw one;
          // The message names the row inside the one-row table; name the input row instead.
          refused.push({ id: ids[i], row: i, reason: one.message.replace(/\brow 1\b/, `row ${i + 1}`) });
        }
      }
      refused.sort((a, b) => a.row - b.row);
      good = stillGood;
      prepared = good.length > 0 ? applyPreparation(prep, subsetTable(table, needed, good)) : undefined;
    }
  }

  const mixture = definition.rule === 'highest-posterior';
  const rows: AssignedRow[] = ids.map((id) =>
    mixture ? { id, segment: null, distance: null, far: null, probability: null } : { id, segment: null, distance: null, far: null },
  );
  let unseenLevels: UnseenLevel[] = [];
  let imputed: ImputedColumn[] = [];
  if (prepared !== undefined) {
    const m = prepared.matrix;
    if (m.cols !== definition.features.length || m.rows !== good.length) {
      throw new KinsortError(
        `assign: the preparation gave ${m.rows} × ${m.cols} values for ${good.length} rows × ${definition.features.length} features.`,
        'bad-definition',
      );
    }
    const scored = scoreRows(definition, m.data, m.rows, m.cols);
    for (let r = 0; r < good.length; r++) {
      const i = good[r];
      const row = { id: ids[i], segment: scored.segment[r], distance: scored.distance[r], far: scored.far[r] === 1 };
      if (!scored.probability) rows[i] = row;
      else rows[i] = { ...row, probability: Number.isNaN(scored.probability[r]) ? null : scored.probability[r] };
    }
    // Map the subset's rows back to input rows (ids made of row numbers would be renumbered).
    unseenLevels = prepared.report.unseenLevels.map((u) => ({ ...u, id: ids[good[u.row]], row: good[u.row] }));
    imputed = prepared.report.imputed.map((c) =>
      prep.idColumn === null ? { ...c, ids: c.ids.map((sub) => ids[good[Number(sub) - 1]]) } : c,
    );
  }
  const notes: string[] = [];
  if (ignoredColumns.length > 0)
    notes.push(`Ignored column${ignoredColumns.length > 1 ? 's' : ''} the definition does not use: ${ignoredColumns.join(', ')}.`);
  if (refused.length > 0) notes.push(`${refused.length} row(s) could not be prepared and have no segment; see "refused".`);
  if (unseenLevels.length > 0) {
    const shown = unseenLevels.slice(0, 5).map((u) => `${u.id}: ${u.column} = ${JSON.stringify(u.level)}`);
    const more = unseenLevels.length > shown.length ? `, and ${unseenLevels.length - shown.length} more (see "unseenLevels")` : '';
    notes.push(
      `${unseenLevels.length} cell(s) hold a category level never seen in training (${shown.join('; ')}${more}); ` +
        'those rows sit at the baseline of that column (all its indicators 0).',
    );
  }
  return {
    rows,
    report: { inputRows: table.rowCount, assignedRows: good.length, refused, unseenLevels, imputed, ignoredColumns, notes },
  };
}

/**
 * The stored rule on prepared rows: 1-based segments (0 = noise for nearest-dense-row), distances,
 * far flags, and for a mixture the posterior probability of the segment given.
 */
function scoreRows(
  definition: SegmentDefinition,
  data: Float64Array,
  rows: number,
  dims: number,
): { segment: Int32Array; distance: Float64Array; far: Uint8Array; probability?: Float64Array } {
  if (definition.rule === 'nearest-dense-row') {
    if (!definition.denseRows) throw new KinsortError('assign: the nearest-dense-row definition stores no rows.', 'bad-definition');
    const dense = nearestDenseRows(data, rows, dims, definition.denseRows, definition.metric as DefinitionMetric);
    return { segment: dense.segment, distance: dense.distance, far: dense.noise };
  }
  const k = definition.segments.length;
  const farBeyond = definition.segments.map((s) => s.farBeyond);
  if (definition.rule === 'highest-posterior') {
    const scores = scoreMixture(data, rows, mixtureFigures(definition.segments, dims), farBeyond);
    return {
      segment: Int32Array.from(scores.segment, (c) => c + 1),
      distance: scores.distance,
      far: scores.far,
      probability: scores.probability,
    };
  }
  const centers = Float64Array.from(definition.segments.flatMap((s) => s.center));
  const nearest = nearestCenters(data, rows, centers, k, dims, definition.metric as DefinitionMetric, farBeyond);
  return { segment: Int32Array.from(nearest.segment, (c) => c + 1), distance: nearest.distance, far: nearest.far };
}
