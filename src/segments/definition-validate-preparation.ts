// The preparation inside a definition — the stored schema (docs/stored-schema.md) — is checked on
// load too, so a damaged or tampered file is refused with the key named rather than failing later
// inside assign or toSql, or (worse) scoring rows under a rule that contradicts itself.
import { KinsortError, didYouMean } from '../core/errors';
import { DECIMAL_MARKS, TEXT_RULE, isTrueFalse, trimSpaces } from '../table/cells';
import {
  COLUMN_TYPES as PREPARED_COLUMN_TYPES,
  MISSING_POLICIES,
  PREPARATION_VERSION,
  SCALE_METHODS,
  SPREAD_KINDS as PREPARED_SPREAD_KINDS,
} from '../prepare/types';

// The column-type vocabulary has one home (prepare/types.ts); here it is only read as text.
const COLUMN_TYPES: readonly string[] = PREPARED_COLUMN_TYPES;
const SPREAD_KINDS: readonly string[] = PREPARED_SPREAD_KINDS;
export const PREPARATION_KEYS = [
  'columns',
  'constantColumns',
  'decimalMark',
  'featureNames',
  'format',
  'idColumn',
  'keep',
  'missing',
  'missingMarkers',
  'scale',
  'textRule',
  'version',
];
export const PREPARED_COLUMN_KEYS = [
  'center',
  'features',
  'fill',
  'levelMatch',
  'levels',
  'log',
  'name',
  'spread',
  'spreadKind',
  'type',
  'weight',
];

function fail(where: string, message: string): never {
  throw new KinsortError(`${where}: ${message}`, 'bad-definition');
}

const CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029]/;

/** Names (columns, features, markers) may not hold control characters: they reach SQL, CSV headers and terminals. */
export function checkName(value: unknown, where: string, what: string): string {
  if (typeof value !== 'string' || value === '') fail(where, `${what} must be a non-empty text; got ${JSON.stringify(value)}.`);
  if (CONTROL.test(value)) fail(where, `${what} ${JSON.stringify(value)} holds a control character, which a name may not hold.`);
  return value;
}

/** Unknown keys are refused, `__proto__` included: a hand edit with a typo must not be silently ignored. */
export function onlyKeys(obj: object, allowed: readonly string[], where: string): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key))
      fail(where, `unknown key ${JSON.stringify(key)}.${didYouMean(key, allowed)} Keys allowed here: ${allowed.join(', ')}.`);
  }
}

const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

function nameList(p: Record<string, unknown>, key: string, at: string): string[] {
  const v = p[key];
  if (!Array.isArray(v)) fail(at, `key "${key}" must be an array of column names.`);
  return v.map((x, i) => checkName(x, at, `${key}[${i}]`));
}

function firstDuplicate(list: readonly string[]): string | undefined {
  const seen = new Set<string>();
  for (const x of list) {
    if (seen.has(x)) return x;
    seen.add(x);
  }
  return undefined;
}

/** Column names that one SQL identifier would not tell apart (`X` and `x`) are refused. */
export function checkCaseClashes(names: readonly string[], where: string): void {
  const byFolded = new Map<string, string>();
  for (const n of names) {
    const folded = n.toLowerCase();
    const other = byFolded.get(folded);
    if (other !== undefined && other !== n) {
      fail(
        where,
        `columns ${JSON.stringify(other)} and ${JSON.stringify(n)} differ only in letter case; most SQL engines read them as ` +
          'one column, so a definition cannot hold both. Rename one before fitting.',
      );
    }
    byFolded.set(folded, n);
  }
}

/** Throws when `p` is not a well-formed preparation (version 3; a version 2 one is upgraded first) giving exactly `features`. */
export function checkStoredPreparation(p: Record<string, unknown>, features: readonly string[], where: string): void {
  const at = `${where}: preparation`;
  if (p.format !== 'kinsort-preparation') fail(at, `key "format" is ${JSON.stringify(p.format)}; expected "kinsort-preparation".`);
  if (p.version !== PREPARATION_VERSION) {
    fail(
      at,
      `key "version" is ${JSON.stringify(p.version)}; this kinsort reads preparation version ${PREPARATION_VERSION} (with the stored schema).`,
    );
  }
  onlyKeys(p, PREPARATION_KEYS, at);
  if (p.textRule !== TEXT_RULE) fail(at, `key "textRule" is ${JSON.stringify(p.textRule)}; this kinsort knows "${TEXT_RULE}".`);
  if (!DECIMAL_MARKS.includes(p.decimalMark as never))
    fail(at, `key "decimalMark" is ${JSON.stringify(p.decimalMark)}; expected "." or ",".`);
  const markers = nameList(p, 'missingMarkers', at);
  markers.forEach((m, i) => {
    if (trimSpaces(m) !== m)
      fail(
        at,
        `key "missingMarkers" entry ${i + 1} (${JSON.stringify(m)}) has leading or trailing spaces; markers are compared after trimming them.`,
      );
  });
  const dupMarker = firstDuplicate(markers);
  if (dupMarker !== undefined) fail(at, `key "missingMarkers" lists ${JSON.stringify(dupMarker)} twice.`);
  if (p.idColumn !== null) checkName(p.idColumn, at, 'key "idColumn"');
  if (!SCALE_METHODS.includes(p.scale as never))
    fail(at, `key "scale" is ${JSON.stringify(p.scale)}; expected one of ${SCALE_METHODS.join(', ')}.`);
  if (!MISSING_POLICIES.includes(p.missing as never))
    fail(at, `key "missing" is ${JSON.stringify(p.missing)}; expected one of ${MISSING_POLICIES.join(', ')}.`);
  const keep = nameList(p, 'keep', at);
  const constant = nameList(p, 'constantColumns', at);
  const featureNames = nameList(p, 'featureNames', at);
  if (!Array.isArray(p.columns) || p.columns.length === 0) fail(at, 'key "columns" must be a non-empty array.');
  const produced: string[] = [];
  const used: string[] = [];
  p.columns.forEach((raw: unknown, j: number) => {
    const c = `${at}.columns[${j}]`;
    if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) fail(c, 'expected an object.');
    const col = raw as Record<string, unknown>;
    onlyKeys(col, PREPARED_COLUMN_KEYS, c);
    const name = checkName(col.name, c, 'key "name"');
    used.push(name);
    const type = col.type as string;
    if (!COLUMN_TYPES.includes(type)) fail(c, `key "type" is ${JSON.stringify(col.type)}; expected one of ${COLUMN_TYPES.join(', ')}.`);
    if (typeof col.log !== 'boolean') fail(c, 'key "log" must be true or false.');
    if (col.log && type !== 'numeric') fail(c, `key "log" is true, but log1p applies to numeric columns only (this one is ${type}).`);
    if (!SPREAD_KINDS.includes(col.spreadKind as string))
      fail(c, `key "spreadKind" is ${JSON.stringify(col.spreadKind)}; expected one of ${SPREAD_KINDS.join(', ')}.`);
    for (const key of ['weight', 'center', 'spread']) {
      if (!isFiniteNumber(col[key])) fail(c, `key "${key}" must be a finite number.`);
    }
    if (!((col.weight as number) > 0))
      fail(c, `key "weight" is ${col.weight}; a weight must be greater than 0 (leave the column out instead).`);
    if (!((col.spread as number) > 0)) fail(c, `key "spread" is ${col.spread}; a scaling divisor must be greater than 0.`);
    const levels = col.levels;
    if (type === 'numeric') {
      if (levels !== null) fail(c, 'key "levels" must be null for a numeric column.');
      if (col.levelMatch !== null) fail(c, 'key "levelMatch" must be null for a numeric column.');
    } else {
      if (!Array.isArray(levels) || levels.some((l) => typeof l !== 'string'))
        fail(c, `key "levels" must list the ${type} column's levels as texts.`);
      const need = type === 'binary' ? 'exactly two' : type === 'ordinal' ? 'at least two' : 'at least one';
      if (type === 'binary' ? levels.length !== 2 : levels.length < (type === 'ordinal' ? 2 : 1)) {
        fail(c, `key "levels" has ${levels.length} level(s); a ${type} column has ${need}.`);
      }
      const dup = firstDuplicate(levels as string[]);
      if (dup !== undefined) fail(c, `key "levels" lists ${JSON.stringify(dup)} twice; levels must be distinct.`);
      const matches = type === 'binary' ? ['exact', 'ascii-case'] : ['exact'];
      if (!matches.includes(col.levelMatch as string)) {
        fail(
          c,
          `key "levelMatch" is ${JSON.stringify(col.levelMatch)}; a ${type} column takes ${matches.map((m) => `"${m}"`).join(' or ')}.`,
        );
      }
      if (col.levelMatch === 'ascii-case') {
        const lower = (levels as string[]).map((l) => (isTrueFalse(l) ? l.toLowerCase() : '?'));
        if (lower[0] !== 'false' || lower[1] !== 'true') {
          fail(
            c,
            `key "levelMatch" is "ascii-case", which holds for true/false columns only: levels must be a spelling of false, then of true; got ${JSON.stringify(levels)}.`,
          );
        }
      }
      if (type === 'binary' || type === 'categorical') {
        if (col.center !== 0 || col.spread !== 1 || col.spreadKind !== 'none') {
          fail(c, `a ${type} column is coded 0/1 unscaled: "center" must be 0, "spread" 1 and "spreadKind" "none".`);
        }
      }
      if (type === 'ordinal') {
        const top = (levels as string[]).length - 1;
        if ((col.center as number) < 0 || (col.center as number) > top) {
          fail(
            c,
            `key "center" is ${col.center}, outside the ranks 0..${top} of the ${top + 1} ordinal levels; the levels and the stored center contradict each other.`,
          );
        }
      }
    }
    if (col.fill !== null) {
      if (p.missing !== 'median')
        fail(
          c,
          `key "fill" is ${JSON.stringify(col.fill)}, but only the 'median' missing-value policy fills cells (this one is '${p.missing}'); expected null.`,
        );
      if (type === 'numeric' ? !isFiniteNumber(col.fill) : !(levels as string[]).includes(col.fill as string)) {
        fail(
          c,
          `key "fill" must be ${type === 'numeric' ? 'a finite number' : "one of the column's levels"} or null; got ${JSON.stringify(col.fill)}.`,
        );
      }
    }
    if (!Array.isArray(col.features)) fail(c, 'key "features" must be an array of feature names.');
    const names = col.features.map((f, i) => checkName(f, c, `features[${i}]`));
    const expected = expectedFeatures(name, type, levels as string[] | null);
    const ok =
      names.length === expected.length &&
      (type === 'binary' ? names[0] === name || names[0] === expected[0] : names.every((f, i) => f === expected[i]));
    if (!ok)
      fail(
        c,
        `key "features" is ${JSON.stringify(names)}; a ${type} column named ${JSON.stringify(name)} gives ${JSON.stringify(type === 'binary' ? [name] : expected)}${type === 'binary' ? ` or ${JSON.stringify(expected)}` : ''}.`,
      );
    produced.push(...names);
  });
  const dupColumn = firstDuplicate(used);
  if (dupColumn !== undefined) fail(at, `column ${JSON.stringify(dupColumn)} appears twice in "columns".`);
  const roles: [string, readonly string[]][] = [
    ['columns', used],
    ['constantColumns', constant],
    ['keep', keep],
  ];
  const all = [...used, ...constant, ...keep];
  const dupRole = firstDuplicate(all);
  if (dupRole !== undefined) {
    const where2 = roles
      .filter(([, l]) => l.includes(dupRole))
      .map(([k]) => `"${k}"`)
      .join(' and ');
    fail(at, `column ${JSON.stringify(dupRole)} is in ${where2}${where2.includes(' and ') ? '' : ' twice'}; a column plays one part.`);
  }
  if (p.idColumn !== null) {
    const role = roles.find(([, l]) => l.includes(p.idColumn as string));
    if (role) fail(at, `the id column ${JSON.stringify(p.idColumn)} is also in "${role[0]}"; ids are never features or profile columns.`);
  }
  checkCaseClashes([...(p.idColumn === null ? [] : [p.idColumn as string]), ...all], at);
  const same = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i]);
  if (!same(produced, featureNames)) fail(at, 'key "featureNames" does not match the features its columns give.');
  if (!same(produced, features)) fail(where, 'key "features" does not match the features the preparation gives.');
}

/** The feature names a column gives (binary: the `name=level` form; the plain name is also allowed). */
function expectedFeatures(name: string, type: string, levels: readonly string[] | null): string[] {
  if (type === 'categorical') return levels!.map((l) => `${name}=${l}`);
  if (type === 'binary') return [`${name}=${levels![1]}`];
  return [name];
}
