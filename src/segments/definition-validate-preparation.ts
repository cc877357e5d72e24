// The preparation inside a definition is checked on load too, so a damaged file is refused with
// the key named rather than failing later inside assign or toSql.
import { KinsortError } from '../core/errors';
import { COLUMN_TYPES as PREPARED_COLUMN_TYPES, MISSING_POLICIES, SCALE_METHODS, SPREAD_KINDS as PREPARED_SPREAD_KINDS } from '../prepare/types';

const COLUMN_TYPES: readonly string[] = PREPARED_COLUMN_TYPES;
const SPREAD_KINDS: readonly string[] = PREPARED_SPREAD_KINDS;

function fail(where: string, message: string): never {
  throw new KinsortError(`${where}: ${message}`, 'bad-definition');
}

const isStringArray = (v: unknown): v is string[] => Array.isArray(v) && v.every((x) => typeof x === 'string');
const isFinite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/** Throws when `p` is not a well-formed preparation giving exactly `features`. */
export function checkStoredPreparation(p: Record<string, unknown>, features: readonly string[], where: string): void {
  const at = `${where}: preparation`;
  if (p.format !== 'kinsort-preparation') fail(at, `key "format" is ${JSON.stringify(p.format)}; expected "kinsort-preparation".`);
  if (p.idColumn !== null && typeof p.idColumn !== 'string') fail(at, 'key "idColumn" must be a column name or null.');
  if (!SCALE_METHODS.includes(p.scale as never)) fail(at, `key "scale" is ${JSON.stringify(p.scale)}; expected one of ${SCALE_METHODS.join(', ')}.`);
  if (!MISSING_POLICIES.includes(p.missing as never)) fail(at, `key "missing" is ${JSON.stringify(p.missing)}; expected one of ${MISSING_POLICIES.join(', ')}.`);
  for (const key of ['keep', 'constantColumns', 'featureNames']) {
    if (!isStringArray(p[key])) fail(at, `key "${key}" must be an array of column names.`);
  }
  if (!Array.isArray(p.columns) || p.columns.length === 0) fail(at, 'key "columns" must be a non-empty array.');
  const produced: string[] = [];
  p.columns.forEach((raw: unknown, j: number) => {
    const c = `${at}.columns[${j}]`;
    if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) fail(c, 'expected an object.');
    const col = raw as Record<string, unknown>;
    if (typeof col.name !== 'string') fail(c, 'key "name" must be a column name.');
    if (!COLUMN_TYPES.includes(col.type as string)) fail(c, `key "type" is ${JSON.stringify(col.type)}; expected one of ${COLUMN_TYPES.join(', ')}.`);
    if (typeof col.log !== 'boolean') fail(c, 'key "log" must be true or false.');
    if (!SPREAD_KINDS.includes(col.spreadKind as string)) fail(c, `key "spreadKind" is ${JSON.stringify(col.spreadKind)}; expected one of ${SPREAD_KINDS.join(', ')}.`);
    for (const key of ['weight', 'centre', 'spread']) {
      if (!isFinite(col[key])) fail(c, `key "${key}" must be a finite number.`);
    }
    if (col.spread === 0) fail(c, 'key "spread" is 0; a scaling divisor must not be 0.');
    if (col.fill !== null && typeof col.fill !== 'string' && !isFinite(col.fill)) fail(c, 'key "fill" must be a number, a level or null.');
    const levels = col.levels;
    if (col.type === 'numeric') {
      if (levels !== null) fail(c, 'key "levels" must be null for a numeric column.');
    } else if (!isStringArray(levels) || levels.length < (col.type === 'binary' ? 2 : 1) || (col.type === 'binary' && levels.length !== 2)) {
      fail(c, `key "levels" must list the ${col.type} column's levels${col.type === 'binary' ? ' (exactly two)' : ''}.`);
    }
    if (!isStringArray(col.features)) fail(c, 'key "features" must be an array of feature names.');
    const expected = col.type === 'categorical' ? (levels as string[]).length : 1;
    if (col.features.length !== expected) fail(c, `key "features" has ${col.features.length} names; a ${col.type} column gives ${expected}.`);
    produced.push(...col.features);
  });
  const same = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i]);
  if (!same(produced, p.featureNames as string[])) fail(at, 'key "featureNames" does not match the features its columns give.');
  if (!same(produced, features)) fail(where, 'key "features" does not match the features the preparation gives.');
}
