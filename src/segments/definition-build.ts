// Build a segment definition from a fitted segmentation (the fluent layer and the command line
// call this). Everything is validated and copied into the fixed key order of the file format.
import { KinsortError, checkChoice } from '../core/errors';
import { checkOptions } from '../core/options';
import { Matrix, toMatrix } from '../core/matrix';
import { compactLabels } from '../core/assignment';
import { JsonValue, sortedKeys, writeDefinitionJson } from './definition-json';
import {
  ASSIGNMENT_RULES,
  AssignmentRule,
  DEFINITION_FORMAT_VERSION,
  DEFINITION_KIND,
  DEFINITION_METHODS,
  DEFINITION_METRICS,
  DefinitionMethodName,
  DefinitionMetric,
  DefinitionSegment,
  FAR_PERCENTILE,
  MIXTURE_METRIC,
  SegmentDefinition,
  StoredMetric,
  TRAINING_LABELS,
  TrainingLabels,
} from './definition-types';
import { readDefinition } from './definition-validate';
import { fingerprintRows } from './fingerprint';
import { nearestCenters, percentile, pointToCenter } from './assign-nearest';
import { trainingDistributions } from './training-distributions';
import { kinsortVersion } from './definition-version';
import { storedComponents, type MixtureInput, type StoredComponent } from './definition-mixture';
import { mixtureFigures, ruleSquare, scoreMixture } from './mixture-rule';

export interface DefinitionSegmentInput {
  /** 1-based segment number. */
  number: number;
  title?: string;
  text?: string;
  /** When given, must equal the count in the training assignment. */
  size?: number;
}

export interface BuildDefinitionInput {
  /** The intake's Preparation (plain JSON). */
  preparation: object;
  method: { name: DefinitionMethodName; options?: Record<string, unknown> };
  /** One vector per segment in the prepared space, segment order. Omit for k-medoids when `medoids` is given. */
  centers?: readonly (readonly number[])[];
  /** k-medoids: training row index (0-based) of each segment's medoid, segment order. */
  medoids?: readonly number[];
  rule?: AssignmentRule;
  /** Distance used to assign (default euclidean; the highest-posterior rule always measures Mahalanobis distances). */
  metric?: DefinitionMetric;
  /** Mixtures (rule highest-posterior): weights and full covariances, one per segment; `centers` are the means. */
  mixture?: MixtureInput;
  segments?: readonly DefinitionSegmentInput[];
  /** The prepared training rows, their ids and their 0-based segments. */
  training: { ids: readonly string[]; matrix: Matrix | readonly (readonly number[])[]; assignment: ArrayLike<number> };
  evidence?: object;
  note?: string;
  /** Defaults to this package's version. */
  packageVersion?: string;
  /**
   * 'fit' (default): the training assignment is the method's. 'rule': the caller relabelled the
   * segmentation by this definition's own rule; then every training row must be reproduced.
   */
  labels?: TrainingLabels;
}

const INPUT_KEYS = [
  'preparation',
  'method',
  'centers',
  'medoids',
  'rule',
  'metric',
  'mixture',
  'segments',
  'training',
  'evidence',
  'note',
  'packageVersion',
  'labels',
];

function featureNamesOf(preparation: object, matrix: Matrix): string[] {
  const fromPrep = (preparation as { featureNames?: unknown }).featureNames;
  if (Array.isArray(fromPrep)) return fromPrep.map(String);
  if (matrix.colNames) return [...matrix.colNames];
  return Array.from({ length: matrix.cols }, (_, j) => `feature ${j + 1}`);
}

/** Evidence may hold NaN (e.g. an undefined index); the file stores such values as null. */
function finiteOrNull(value: unknown): unknown {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (ArrayBuffer.isView(value)) value = Array.from(value as unknown as ArrayLike<number>);
  if (Array.isArray(value)) return value.map(finiteOrNull);
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, finiteOrNull(v)]));
  }
  return value;
}

/** `where` names the caller in error messages (the fluent `definition()` passes its own name). */
export function buildDefinition(input: BuildDefinitionInput, where = 'buildDefinition'): SegmentDefinition {
  checkOptions(input, INPUT_KEYS, where);
  if (input.preparation === null || typeof input.preparation !== 'object') {
    throw new KinsortError(`${where}: "preparation" must be the Preparation object from prepareTable.`, 'bad-argument');
  }
  const methodName = checkChoice(input.method?.name, DEFINITION_METHODS, 'method');
  const rule = checkChoice(
    input.rule ?? (methodName === 'kmedoids' ? 'nearest-medoid' : methodName === 'mixture' ? 'highest-posterior' : 'nearest-center'),
    ASSIGNMENT_RULES,
    'assignment rule',
  );
  // Medoids are compared under the metric they were chosen with; centres (k-means, a hierarchy
  // cut) always under Euclidean distance in the prepared space.
  const optionMetric = (input.method?.options as { metric?: unknown } | undefined)?.metric;
  const wanted = input.metric ?? (rule === 'nearest-medoid' && optionMetric !== undefined ? optionMetric : 'euclidean');
  if (typeof wanted === 'string' && !(DEFINITION_METRICS as readonly string[]).includes(wanted) && input.metric === undefined) {
    throw new KinsortError(
      `${where}: the segments were found with the "${wanted}" metric, but a definition assigns new rows (and writes SQL) ` +
        `with ${DEFINITION_METRICS.join(', ')} only. Refit k-medoids with one of those to hand the segments on.`,
      'not-supported',
    );
  }
  const mixture = rule === 'highest-posterior';
  if (mixture && input.metric !== undefined) {
    throw new KinsortError(`${where}: the highest-posterior rule measures Mahalanobis distances; leave "metric" out.`, 'bad-argument');
  }
  const metric: StoredMetric = mixture ? MIXTURE_METRIC : checkChoice(wanted, DEFINITION_METRICS, 'assignment metric');

  const matrix = toMatrix(input.training?.matrix as Matrix, { what: `${where}: training rows` });
  const ids = input.training.ids;
  if (!Array.isArray(ids) || ids.length !== matrix.rows) {
    throw new KinsortError(
      `${where}: ${Array.isArray(ids) ? ids.length : 'no'} training ids for ${matrix.rows} training rows.`,
      'bad-input',
    );
  }
  const { labels, k, sizes } = compactLabels(input.training.assignment, matrix.rows, `${where}: training assignment`);
  const dims = matrix.cols;
  const features = featureNamesOf(input.preparation, matrix);
  if (features.length !== dims) {
    throw new KinsortError(
      `${where}: the preparation names ${features.length} features but the training rows have ${dims} columns.`,
      'bad-input',
    );
  }

  let centerRows: number[][];
  let medoidIds: string[] | undefined;
  if (input.medoids !== undefined) {
    if (input.medoids.length !== k) {
      throw new KinsortError(`${where}: ${input.medoids.length} medoids for ${k} segments.`, 'bad-input');
    }
    centerRows = input.medoids.map((r, c) => {
      if (!Number.isInteger(r) || r < 0 || r >= matrix.rows) {
        throw new KinsortError(`${where}: medoid ${c + 1} is row index ${r}, outside 0..${matrix.rows - 1}.`, 'bad-input');
      }
      return Array.from(matrix.data.subarray(r * dims, (r + 1) * dims));
    });
    medoidIds = input.medoids.map((r) => String(ids[r]));
  } else if (input.centers !== undefined) {
    const cm = toMatrix(input.centers, { what: `${where}: centers` });
    if (cm.rows !== k || cm.cols !== dims) {
      throw new KinsortError(`${where}: centers are ${cm.rows} × ${cm.cols}; expected ${k} segments × ${dims} features.`, 'bad-input');
    }
    centerRows = Array.from({ length: k }, (_, c) => Array.from(cm.data.subarray(c * dims, (c + 1) * dims)));
  } else {
    throw new KinsortError(`${where}: give "centers" (one per segment) or "medoids" (training row indices).`, 'bad-argument');
  }
  if (rule === 'nearest-medoid' && medoidIds === undefined) {
    throw new KinsortError(`${where}: the nearest-medoid rule needs "medoids" (training row indices).`, 'bad-argument');
  }

  // Far threshold: a high percentile of the training rows' distances to their own segment's centre
  // (Mahalanobis distances to their own component for a mixture).
  const flatCenters = Float64Array.from(centerRows.flat());
  const components: StoredComponent[] | undefined = mixture ? storedComponents(input.mixture, k, dims, where) : undefined;
  const figures = components
    ? mixtureFigures(
        components.map((p, c) => ({ number: c + 1, size: 0, farBeyond: 0, center: centerRows[c], ...p })),
        dims,
      )
    : undefined;
  const own: Float64Array[] = Array.from({ length: k }, (_, c) => new Float64Array(sizes[c]));
  const filled = new Int32Array(k);
  const diff = new Float64Array(dims);
  for (let i = 0; i < matrix.rows; i++) {
    const c = labels[i];
    own[c][filled[c]++] = figures
      ? Math.sqrt(ruleSquare(matrix.data, i * dims, figures, c, diff))
      : pointToCenter(matrix.data, i, flatCenters, c, dims, metric as DefinitionMetric);
  }

  const given = new Map<number, DefinitionSegmentInput>();
  for (const s of input.segments ?? []) {
    if (!Number.isInteger(s.number) || s.number < 1 || s.number > k) {
      throw new KinsortError(`${where}: segment number ${s.number} is outside 1..${k}.`, 'bad-input');
    }
    if (s.size !== undefined && s.size !== sizes[s.number - 1]) {
      throw new KinsortError(
        `${where}: segment ${s.number} says size ${s.size} but the training assignment puts ${sizes[s.number - 1]} rows in it.`,
        'bad-input',
      );
    }
    given.set(s.number, s);
  }
  const segments: DefinitionSegment[] = centerRows.map((center, c) => {
    const s = given.get(c + 1);
    return {
      number: c + 1,
      title: s?.title,
      text: s?.text,
      size: sizes[c],
      center,
      medoidId: medoidIds?.[c],
      farBeyond: percentile(own[c], FAR_PERCENTILE),
      weight: components?.[c].weight,
      whitening: components?.[c].whitening,
    };
  });

  // The stored rule on the training rows, once (the same loop assign runs): how many rows it gives
  // their fitted segment, and which rows lie beyond every segment's far threshold (for drift).
  const farBeyond = segments.map((s) => s.farBeyond);
  const rule0 = figures
    ? scoreMixture(matrix.data, matrix.rows, figures, farBeyond)
    : nearestCenters(matrix.data, matrix.rows, flatCenters, k, dims, metric as DefinitionMetric, farBeyond);
  let reproducedRows = 0;
  for (let i = 0; i < matrix.rows; i++) if (rule0.segment[i] === labels[i]) reproducedRows++;
  const trainingLabels = checkChoice(input.labels ?? 'fit', TRAINING_LABELS, 'training labels');
  if (trainingLabels === 'rule' && reproducedRows !== matrix.rows) {
    throw new KinsortError(
      `${where}: labels 'rule' says the segments were relabelled by the ${rule === 'nearest-medoid' ? 'nearest-medoid' : mixture ? 'highest-posterior' : 'nearest-centre'} rule, ` +
        `but the rule gives ${matrix.rows - reproducedRows} of ${matrix.rows} training rows another segment.`,
      'bad-input',
    );
  }

  const built: SegmentDefinition = {
    kind: DEFINITION_KIND,
    formatVersion: DEFINITION_FORMAT_VERSION,
    writtenBy: `kinsort ${input.packageVersion ?? kinsortVersion()}`,
    note: input.note,
    method: { name: methodName, options: sortedKeys(input.method.options ?? {}) as { [key: string]: JsonValue } },
    rule,
    metric,
    preparation: sortedKeys(input.preparation) as { [key: string]: JsonValue },
    features,
    segments,
    training: {
      rows: matrix.rows,
      fingerprint: fingerprintRows(ids.map(String), matrix),
      reproducedRows,
      labels: trainingLabels,
    },
    trainingDistributions: trainingDistributions(matrix.data, matrix.rows, dims, rule0.far),
    evidence: input.evidence === undefined ? undefined : (sortedKeys(finiteOrNull(input.evidence)) as { [key: string]: JsonValue }),
  };
  // What is built must load: the loader's checks (schema, names, case clashes, sizes) run on it too.
  return readDefinition(JSON.parse(writeDefinitionJson(built)), where);
}
