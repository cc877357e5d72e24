// Read a definition from text or a parsed object and check every key, saying which key is wrong,
// what it holds and what was expected. A file from a newer format is refused with an upgrade hint.
import { KinsortError, didYouMean } from '../core/errors';
import { JsonValue, sortedKeys } from './definition-json';
import {
  ASSIGNMENT_RULES,
  DEFINITION_FORMAT_VERSION,
  DEFINITION_KIND,
  DEFINITION_METHODS,
  DEFINITION_METRICS,
  DefinitionSegment,
  SegmentDefinition,
} from './definition-types';
import { kinsortVersion } from './definition-version';
import { checkStoredPreparation } from './definition-validate-preparation';
import { checkTrainingDistributions } from './definition-validate-distributions';

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

function need(obj: Record<string, unknown>, key: string, type: 'string' | 'number' | 'object' | 'array', where: string, optional = false): any {
  const v = obj[key];
  if (v === undefined) {
    if (optional) return undefined;
    fail(where, `key "${key}" is missing (expected ${type === 'array' ? 'an array' : type === 'object' ? 'an object' : 'a ' + type}).`);
  }
  const ok =
    type === 'array' ? Array.isArray(v) :
    type === 'object' ? v !== null && typeof v === 'object' && !Array.isArray(v) :
    type === 'number' ? typeof v === 'number' && Number.isFinite(v) :
    typeof v === 'string';
  if (!ok) fail(where, `key "${key}" holds ${typeName(v)}; expected ${type === 'array' ? 'an array' : type === 'object' ? 'an object' : 'a ' + (type === 'number' ? 'finite number' : type)}.`);
  return v;
}

const TOP_KEYS = ['kind', 'formatVersion', 'writtenBy', 'note', 'method', 'rule', 'metric', 'preparation', 'features', 'segments', 'training', 'trainingDistributions', 'evidence'];
const SEGMENT_KEYS = ['number', 'title', 'text', 'size', 'center', 'medoidId', 'farBeyond'];

/** Unknown keys are refused: a hand edit with a typo must not be silently ignored. */
function onlyKeys(obj: Record<string, unknown>, allowed: readonly string[], where: string): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key)) fail(where, `unknown key "${key}".${didYouMean(key, allowed)} Keys allowed here: ${allowed.join(', ')}.`);
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
  if (!Number.isInteger(version) || version < 1) fail(where, `key "formatVersion" is ${version}; expected a whole number ≥ 1.`);
  if (version > DEFINITION_FORMAT_VERSION) {
    fail(
      where,
      `written by ${writtenBy}, format ${version}; this kinsort (${kinsortVersion()}) reads formats up to ${DEFINITION_FORMAT_VERSION} — upgrade kinsort to read it.`,
    );
  }
  onlyKeys(d, TOP_KEYS, where);
  const note = need(d, 'note', 'string', where, true);
  const method = need(d, 'method', 'object', `${where}`);
  const methodName = oneOf(need(method, 'name', 'string', `${where}: method`), DEFINITION_METHODS, 'name', `${where}: method`);
  const methodOptions = need(method, 'options', 'object', `${where}: method`);
  const rule = oneOf(need(d, 'rule', 'string', where), ASSIGNMENT_RULES, 'rule', where);
  const metric = oneOf(need(d, 'metric', 'string', where), DEFINITION_METRICS, 'metric', where);
  const preparation = need(d, 'preparation', 'object', where);
  const features: unknown[] = need(d, 'features', 'array', where);
  features.forEach((f, j) => {
    if (typeof f !== 'string') fail(where, `features: entry ${j + 1} is ${typeName(f)}; expected a feature name.`);
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
    if (rule === 'nearest-medoid' && medoidId === undefined) fail(at, 'key "medoidId" is missing; the nearest-medoid rule needs the id of each medoid.');
    return {
      number,
      title: need(seg, 'title', 'string', at, true),
      text: need(seg, 'text', 'string', at, true),
      size,
      center: numbers(seg.center, dims, `${at}.center`),
      medoidId,
      farBeyond,
    };
  });
  const training = need(d, 'training', 'object', where);
  const rows = need(training, 'rows', 'number', `${where}: training`);
  const fingerprint = need(training, 'fingerprint', 'string', `${where}: training`);
  const evidence = need(d, 'evidence', 'object', where, true);
  const distributions = d.trainingDistributions === undefined ? undefined : checkTrainingDistributions(d.trainingDistributions, dims, `${where}: trainingDistributions`);
  return {
    kind: DEFINITION_KIND,
    formatVersion: version,
    writtenBy,
    note,
    method: { name: methodName, options: sortedKeys(methodOptions) as { [key: string]: JsonValue } },
    rule,
    metric,
    preparation: sortedKeys(preparation) as { [key: string]: JsonValue },
    features: features as string[],
    segments,
    training: { rows, fingerprint },
    trainingDistributions: distributions,
    evidence: evidence === undefined ? undefined : (sortedKeys(evidence) as { [key: string]: JsonValue }),
  };
}
