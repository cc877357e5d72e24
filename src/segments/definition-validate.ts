// Read a definition from text or a parsed object and check every key, saying which key is wrong,
// what it holds and what was expected. A file from a newer format is refused with an upgrade hint.
import { KinsortError } from '../core/errors';
import { JsonValue, sortedKeys } from './definition-json';
import {
  ASSIGNMENT_RULES,
  DEFINITION_FORMAT_VERSION,
  DEFINITION_KIND,
  DEFINITION_METHODS,
  DEFINITION_METRICS,
  DefinitionSegment,
  MIXTURE_METRIC,
  SegmentDefinition,
  StoredMetric,
  TRAINING_LABELS,
} from './definition-types';
import { upgradePreparation } from '../prepare/upgrade';
import { checkMixtureSegment, checkWeightSum } from './definition-validate-mixture';
import { kinsortVersion } from './definition-version';
import { checkName, checkStoredPreparation, onlyKeys } from './definition-validate-preparation';
import { checkTrainingDistributions } from './definition-validate-distributions';
import { checkDenseRows } from './definition-validate-dense';

function fail(where: string, message: string): never {
  throw new KinsortError(`${where}: ${message}`, 'bad-definition');
}

function typeName(v: unknown): string {
  if (v === null) return 'null';
  if (v === undefined) return 'missing';
  if (Array.isArray(v)) return 'an array';
  if (typeof v === 'number' && !Number.isFinite(v)) return String(v);
  return typeof v === 'object' ? 'an object' : `${typeof v} ${JSON.stringify(v)}`.slice(0, 70);
}

function need(
  obj: Record<string, unknown>,
  key: string,
  type: 'string' | 'number' | 'object' | 'array',
  where: string,
  optional = false,
): any {
  const v = obj[key];
  if (v === undefined) {
    if (optional) return undefined;
    fail(where, `key "${key}" is missing (expected ${type === 'array' ? 'an array' : type === 'object' ? 'an object' : 'a ' + type}).`);
  }
  const ok =
    type === 'array'
      ? Array.isArray(v)
      : type === 'object'
        ? v !== null && typeof v === 'object' && !Array.isArray(v)
        : type === 'number'
          ? typeof v === 'number' && Number.isFinite(v)
          : typeof v === 'string';
  if (!ok)
    fail(
      where,
      `key "${key}" holds ${typeName(v)}; expected ${type === 'array' ? 'an array' : type === 'object' ? 'an object' : 'a ' + (type === 'number' ? 'finite number' : type)}.`,
    );
  return v;
}

const TOP_KEYS = [
  'kind',
  'formatVersion',
  'writtenBy',
  'note',
  'method',
  'rule',
  'metric',
  'preparation',
  'features',
  'segments',
  'training',
  'trainingDistributions',
  'evidence',
  'denseRows',
];
const SEGMENT_KEYS = ['number', 'title', 'text', 'size', 'center', 'medoidId', 'farBeyond', 'weight', 'whitening'];
const TRAINING_KEYS = ['rows', 'fingerprint', 'reproducedRows', 'labels', 'noiseRows'];

const CONTROL_ANY = /[\u0000-\u001f\u007f-\u009f\u2028\u2029]/;

const CONTROL_BUT_LINES = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;

/** Prose (notes, titles, texts) may span lines and hold tabs, nothing else that steers a terminal. */
function proseOnly(value: string, where: string, what: string): void {
  if (CONTROL_BUT_LINES.test(value)) fail(where, `${what} holds a control character other than a line break or tab.`);
}

/** Keys that would reach an object's prototype if copied into a plain object. */
const PROTOTYPE_KEYS = ['__proto__', 'constructor', 'prototype'];

function noPrototypeKeys(value: unknown, where: string, depth = 0): void {
  if (depth > 32) fail(where, 'is nested more than 32 levels deep.');
  if (Array.isArray(value)) {
    value.forEach((v, i) => noPrototypeKeys(v, `${where}[${i}]`, depth + 1));
    return;
  }
  if (value === null || typeof value !== 'object') return;
  for (const key of Object.keys(value)) {
    if (PROTOTYPE_KEYS.includes(key))
      fail(where, `holds the key ${JSON.stringify(key)}, which a definition may not hold (it would reach an object's prototype).`);
    noPrototypeKeys((value as Record<string, unknown>)[key], `${where}.${key}`, depth + 1);
  }
}

function oneOf<T extends string>(value: string, allowed: readonly T[], key: string, where: string): T {
  if (!(allowed as readonly string[]).includes(value)) fail(where, `key "${key}" is "${value}"; expected one of ${allowed.join(', ')}.`);
  return value as T;
}

function numbers(v: unknown, length: number, where: string): number[] {
  if (!Array.isArray(v)) fail(where, `holds ${typeName(v)}; expected an array of ${length} numbers.`);
  if (v.length !== length) fail(where, `has ${v.length} numbers; expected ${length} (one per prepared feature).`);
  v.forEach((x, j) => {
    if (typeof x !== 'number' || !Number.isFinite(x)) fail(where, `value ${j + 1} is ${typeName(x)}; expected a finite number.`);
  });
  return v.slice();
}

/** Parse text (or take an object) and validate it as a definition, rebuilt in the file's key order. */
/**
 * The oldest format read. Format 2 differs from 3 only in spelling each prepared column's
 * subtracted value `centre` (its preparation is version 2); it is translated on reading.
 */
export const OLDEST_READ_FORMAT = 2;

/** The stored preparation as version 3: a format-2 file must hold version 2, which is upgraded. */
function storedPreparation(p: Record<string, unknown>, format: number, where: string): Record<string, unknown> {
  if (format !== 2) return p;
  if (p.version !== 2) {
    fail(`${where}: preparation`, `key "version" is ${JSON.stringify(p.version)}; a format-2 definition holds preparation version 2.`);
  }
  return upgradePreparation(p);
}

export function readDefinition(source: string | object, where = 'loadDefinition'): SegmentDefinition {
  let raw: unknown = source;
  if (typeof source === 'string') {
    if (source.trim() === '') fail(where, 'the text is empty; expected a definition (JSON).');
    try {
      raw = JSON.parse(source.charCodeAt(0) === 0xfeff ? source.slice(1) : source);
    } catch (e) {
      fail(where, `the text is not JSON (${(e as Error).message}).`);
    }
  }
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) fail(where, `expected a JSON object, got ${typeName(raw)}.`);
  const d = raw as Record<string, unknown>;
  if (d.kind !== DEFINITION_KIND) {
    fail(where, `this is not a kinsort segment definition (key "kind" is ${typeName(d.kind)}; expected "${DEFINITION_KIND}").`);
  }
  const version = need(d, 'formatVersion', 'number', where);
  const writtenBy = need(d, 'writtenBy', 'string', where);
  if (CONTROL_ANY.test(writtenBy))
    fail(
      where,
      `key "writtenBy" holds a control character (${JSON.stringify(writtenBy).slice(0, 80)}); it names a program version on one line.`,
    );
  if (!Number.isInteger(version) || version < 1) fail(where, `key "formatVersion" is ${version}; expected a whole number ≥ 1.`);
  if (version < OLDEST_READ_FORMAT) {
    fail(
      where,
      `written by ${writtenBy}, format ${version}, which stores no schema (how cells were read: missing markers, ` +
        `numbers, level matching). Scoring with it could read rows differently from training, so this kinsort ` +
        `(${kinsortVersion()}) does not load it. Rebuild the definition from the fitted segmentation ` +
        `(segmentation.definition().save(…) or kinsort fit) with this kinsort.`,
    );
  }
  if (version > DEFINITION_FORMAT_VERSION) {
    fail(
      where,
      `written by ${writtenBy}, format ${version}; this kinsort (${kinsortVersion()}) reads formats up to ${DEFINITION_FORMAT_VERSION} — upgrade kinsort to read it.`,
    );
  }
  onlyKeys(d, TOP_KEYS, where);
  const note = need(d, 'note', 'string', where, true);
  if (note !== undefined) proseOnly(note, where, 'key "note"');
  const method = need(d, 'method', 'object', `${where}`);
  const methodName = oneOf(need(method, 'name', 'string', `${where}: method`), DEFINITION_METHODS, 'name', `${where}: method`);
  onlyKeys(method, ['name', 'options'], `${where}: method`);
  const methodOptions = need(method, 'options', 'object', `${where}: method`);
  noPrototypeKeys(methodOptions, `${where}: method.options`);
  const rule = oneOf(need(d, 'rule', 'string', where), ASSIGNMENT_RULES, 'rule', where);
  // The highest-posterior rule measures Mahalanobis distances, every other rule a distance metric.
  const mixture = rule === 'highest-posterior';
  const metric: StoredMetric = oneOf(
    need(d, 'metric', 'string', where),
    mixture ? [MIXTURE_METRIC] : DEFINITION_METRICS,
    'metric',
    mixture ? `${where} (rule highest-posterior)` : where,
  );
  const preparation = storedPreparation(need(d, 'preparation', 'object', where), version, where);
  const features: unknown[] = need(d, 'features', 'array', where);
  features.forEach((f, j) => {
    if (typeof f !== 'string') fail(where, `features: entry ${j + 1} is ${typeName(f)}; expected a feature name.`);
    checkName(f, where, `features[${j}]`);
  });
  const dims = features.length;
  if (dims === 0) fail(where, 'key "features" is empty; a definition needs at least one prepared feature.');
  checkStoredPreparation(preparation, features as string[], where);
  const segmentsRaw: unknown[] = need(d, 'segments', 'array', where);
  if (segmentsRaw.length === 0) fail(where, 'key "segments" is empty; a definition needs at least one segment.');
  const segments: DefinitionSegment[] = segmentsRaw.map((s, c) => {
    const at = `${where}: segments[${c}]`;
    if (s === null || typeof s !== 'object' || Array.isArray(s)) fail(at, `holds ${typeName(s)}; expected an object.`);
    const seg = s as Record<string, unknown>;
    onlyKeys(seg, SEGMENT_KEYS, at);
    const number = need(seg, 'number', 'number', at);
    if (number !== c + 1) fail(at, `key "number" is ${number}; segments must be numbered 1, 2, … in order (expected ${c + 1}).`);
    const size = need(seg, 'size', 'number', at);
    if (!Number.isInteger(size) || size < 0) fail(at, `key "size" is ${size}; expected a whole number ≥ 0.`);
    const farBeyond = need(seg, 'farBeyond', 'number', at);
    if (farBeyond < 0) fail(at, `key "farBeyond" is ${farBeyond}; expected a distance ≥ 0.`);
    const medoidId = need(seg, 'medoidId', 'string', at, true);
    if (rule !== 'nearest-medoid' && medoidId !== undefined)
      fail(at, `key "medoidId" is set, but the rule is "${rule}"; only nearest-medoid definitions name medoids.`);
    const title = need(seg, 'title', 'string', at, true);
    if (title !== undefined) proseOnly(title, at, 'key "title"');
    const text = need(seg, 'text', 'string', at, true);
    if (text !== undefined) proseOnly(text, at, 'key "text"');
    if (rule === 'nearest-medoid' && medoidId === undefined)
      fail(at, 'key "medoidId" is missing; the nearest-medoid rule needs the id of each medoid.');
    if (!mixture && (seg.weight !== undefined || seg.whitening !== undefined))
      fail(at, `keys "weight" and "whitening" are set, but the rule is "${rule}"; only highest-posterior definitions hold them.`);
    const component = mixture ? checkMixtureSegment(seg, dims, at) : undefined;
    return {
      number,
      title,
      text,
      size,
      center: numbers(seg.center, dims, `${at}.center`),
      medoidId,
      farBeyond,
      weight: component?.weight,
      whitening: component?.whitening,
    };
  });
  if (mixture)
    checkWeightSum(
      segments.map((s) => s.weight!),
      where,
    );
  const training = need(d, 'training', 'object', where);
  const at = `${where}: training`;
  onlyKeys(training, TRAINING_KEYS, at);
  const rows = need(training, 'rows', 'number', at);
  if (!Number.isInteger(rows) || rows < 1) fail(at, `key "rows" is ${rows}; expected a whole number ≥ 1.`);
  const noiseRows = need(training, 'noiseRows', 'number', at, true);
  if (noiseRows !== undefined && (rule !== 'nearest-dense-row' || !Number.isInteger(noiseRows) || noiseRows < 0))
    fail(at, `key "noiseRows" is ${noiseRows}; only nearest-dense-row definitions count noise, as a whole number ≥ 0.`);
  const total = segments.reduce((s, g) => s + g.size, 0) + (noiseRows ?? 0);
  if (total !== rows)
    fail(
      where,
      `the segment sizes${noiseRows ? ' and noise rows' : ''} add up to ${total}, but key "training.rows" is ${rows}; they must agree.`,
    );
  if ((rule === 'nearest-dense-row') !== (methodName === 'density'))
    fail(where, `key "rule" is "${rule}" for method "${methodName}"; density segments, and only they, use the nearest-dense-row rule.`);
  const denseRows =
    rule === 'nearest-dense-row'
      ? checkDenseRows(d.denseRows, dims, segments, `${where}: denseRows`)
      : d.denseRows === undefined
        ? undefined
        : fail(where, `key "denseRows" is set, but the rule is "${rule}"; only nearest-dense-row definitions store rows.`);
  const fingerprint = need(training, 'fingerprint', 'string', at);
  if (!/^sha256:[0-9a-f]{64}$/.test(fingerprint)) fail(at, 'key "fingerprint" must be "sha256:" followed by 64 hexadecimal digits.');
  const reproducedRows = need(training, 'reproducedRows', 'number', at);
  if (!Number.isInteger(reproducedRows) || reproducedRows < 0 || reproducedRows > rows) {
    fail(at, `key "reproducedRows" is ${reproducedRows}; expected a whole number from 0 to ${rows} (the training rows).`);
  }
  const labels = oneOf(need(training, 'labels', 'string', at), TRAINING_LABELS, 'labels', at);
  if (labels === 'rule' && reproducedRows !== rows)
    fail(
      at,
      `key "labels" is "rule" (relabelled by the rule), so every training row is reproduced; "reproducedRows" is ${reproducedRows} of ${rows}.`,
    );
  const evidence = need(d, 'evidence', 'object', where, true);
  if (evidence !== undefined) noPrototypeKeys(evidence, `${where}: evidence`);
  const distributions =
    d.trainingDistributions === undefined
      ? undefined
      : checkTrainingDistributions(d.trainingDistributions, dims, `${where}: trainingDistributions`);
  return {
    kind: DEFINITION_KIND,
    // A format-2 file is held as format 3 once read (its preparation's `centre` keys are now
    // `center`), and is written back as format 3.
    formatVersion: DEFINITION_FORMAT_VERSION,
    writtenBy,
    note,
    method: { name: methodName, options: sortedKeys(methodOptions) as { [key: string]: JsonValue } },
    rule,
    metric,
    preparation: sortedKeys(preparation) as { [key: string]: JsonValue },
    features: features as string[],
    segments,
    training:
      noiseRows === undefined ? { rows, fingerprint, reproducedRows, labels } : { rows, fingerprint, reproducedRows, labels, noiseRows },
    denseRows,
    trainingDistributions: distributions,
    evidence: evidence === undefined ? undefined : (sortedKeys(evidence) as { [key: string]: JsonValue }),
  };
}
