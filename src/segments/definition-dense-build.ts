// Build a definition for density segments: the nearest-dense-row rule (dense-rows.ts) with every
// training row in a segment stored beside its core distance and segment. Noise training rows are
// counted (training.noiseRows), not stored. The file grows with the rows stored: see DENSE_ROW_LIMIT.
import { KinsortError, checkChoice } from '../core/errors';
import type { Matrix } from '../core/matrix';
import { JsonValue, sortedKeys, writeDefinitionJson } from './definition-json';
import {
  DEFINITION_FORMAT_VERSION,
  DEFINITION_KIND,
  DEFINITION_METRICS,
  FAR_PERCENTILE,
  type DefinitionSegment,
  type SegmentDefinition,
} from './definition-types';
import { readDefinition } from './definition-validate';
import { fingerprintRows } from './fingerprint';
import { percentile, pointToCenter } from './assign-nearest';
import { trainingDistributions } from './training-distributions';
import { kinsortVersion } from './definition-version';
import { DenseRows, checkDenseRowCount, nearestDenseRows } from './dense-rows';

export interface BuildDensityDefinitionInput {
  preparation: object;
  /** The options that reproduce the fit (minSize, minSamples, metric). */
  options: Record<string, unknown>;
  /** The metric of the fit (euclidean, sqeuclidean or manhattan for a definition). */
  metric: string;
  /** Prepared training rows, their ids, segments 0..k-1 or -1 (noise), and core distances. */
  training: { ids: readonly string[]; matrix: Matrix; assignment: Int32Array; coreDistances: Float64Array };
  /** Segment means in the prepared space (segment order). */
  centers: readonly (readonly number[])[];
  segments: { title?: string; text?: string }[];
  featureNames: readonly string[];
  evidence?: Record<string, unknown>;
  note?: string;
}

export function buildDensityDefinition(input: BuildDensityDefinitionInput, where = 'definition'): SegmentDefinition {
  if (!(DEFINITION_METRICS as readonly string[]).includes(input.metric)) {
    throw new KinsortError(
      `${where}: the density segments were found with the "${input.metric}" metric, but a definition assigns new rows (and writes SQL) ` +
        `with ${DEFINITION_METRICS.join(', ')} only. Refit with one of those to hand the segments on.`,
      'not-supported',
    );
  }
  const metric = checkChoice(input.metric, DEFINITION_METRICS, 'assignment metric');
  const { matrix, assignment, coreDistances, ids } = input.training;
  const dims = matrix.cols;
  const k = input.centers.length;
  const kept: number[] = [];
  for (let i = 0; i < matrix.rows; i++) if (assignment[i] >= 0) kept.push(i);
  checkDenseRowCount(kept.length, where);
  const dense: DenseRows = {
    values: kept.map((i) => Array.from(matrix.data.subarray(i * dims, (i + 1) * dims))),
    // Core distances are computed under the fit's metric: sqeuclidean ones are squared distances already.
    reach: kept.map((i) => coreDistances[i]),
    segment: kept.map((i) => assignment[i] + 1),
  };
  const flatCenters = Float64Array.from(input.centers.flat());
  const own: number[][] = Array.from({ length: k }, () => []);
  for (const i of kept) own[assignment[i]].push(pointToCenter(matrix.data, i, flatCenters, assignment[i], dims, metric));
  const segments: DefinitionSegment[] = input.centers.map((center, c) => ({
    number: c + 1,
    title: input.segments[c]?.title,
    text: input.segments[c]?.text,
    size: own[c].length,
    center: [...center],
    farBeyond: percentile(Float64Array.from(own[c]), FAR_PERCENTILE),
  }));
  // The stored rule on the training rows: members find themselves; noise rows may fall within a
  // stored row's reach, and then the rule gives them a segment (counted, not hidden).
  const rule0 = nearestDenseRows(matrix.data, matrix.rows, dims, dense, metric);
  let reproducedRows = 0;
  for (let i = 0; i < matrix.rows; i++) if (rule0.segment[i] === assignment[i] + 1) reproducedRows++;
  const built: SegmentDefinition = {
    kind: DEFINITION_KIND,
    formatVersion: DEFINITION_FORMAT_VERSION,
    writtenBy: `kinsort ${kinsortVersion()}`,
    note: input.note,
    method: { name: 'density', options: sortedKeys(input.options) as { [key: string]: JsonValue } },
    rule: 'nearest-dense-row',
    metric,
    preparation: sortedKeys(input.preparation) as { [key: string]: JsonValue },
    features: [...input.featureNames],
    segments,
    training: {
      rows: matrix.rows,
      fingerprint: fingerprintRows(ids.map(String), matrix),
      reproducedRows,
      labels: 'fit',
      noiseRows: matrix.rows - kept.length,
    },
    denseRows: dense,
    // Rows the rule calls noise count as far for drift: beyond every stored row's reach.
    trainingDistributions: trainingDistributions(matrix.data, matrix.rows, dims, rule0.noise),
    evidence: input.evidence === undefined ? undefined : (sortedKeys(input.evidence) as { [key: string]: JsonValue }),
  };
  return readDefinition(JSON.parse(writeDefinitionJson(built)), where);
}
