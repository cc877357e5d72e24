// Deterministic JSON for definition files: keys in the order the object holds them (the builder
// and the loader build objects in one fixed order; foreign sub-objects are key-sorted first with
// `sortedKeys`), numbers as JavaScript prints them (shortest text that reads back to the same
// double), two-space indent, and arrays of plain values on one line so centres stay readable.
// The same object always gives the same bytes, and text read back and written again is identical.
import { KinsortError } from '../core/errors';

export type JsonValue = null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };

function isPlain(value: unknown): boolean {
  return value === null || typeof value !== 'object';
}

function writeScalar(value: unknown, path: string): string {
  if (value === null) return 'null';
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) {
      throw new KinsortError(`definition: ${path} is ${value}; a definition file holds finite numbers only.`, 'bad-definition');
    }
    return JSON.stringify(value);
  }
  if (typeof value === 'string' || typeof value === 'boolean') return JSON.stringify(value);
  throw new KinsortError(`definition: ${path} holds a ${typeof value}, which JSON cannot store.`, 'bad-definition');
}

function write(value: unknown, indent: string, path: string): string {
  if (isPlain(value)) return writeScalar(value, path);
  if (ArrayBuffer.isView(value)) value = Array.from(value as unknown as ArrayLike<number>);
  const inner = indent + '  ';
  if (Array.isArray(value)) {
    if (value.length === 0) return '[]';
    if (value.every(isPlain)) return '[' + value.map((v, i) => writeScalar(v, `${path}[${i}]`)).join(', ') + ']';
    return '[\n' + value.map((v, i) => inner + write(v, inner, `${path}[${i}]`)).join(',\n') + '\n' + indent + ']';
  }
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
  if (entries.length === 0) return '{}';
  return (
    '{\n' + entries.map(([k, v]) => inner + JSON.stringify(k) + ': ' + write(v, inner, `${path}.${k}`)).join(',\n') + '\n' + indent + '}'
  );
}

/** The definition's text: deterministic, ends with a newline. */
export function writeDefinitionJson(value: unknown): string {
  return write(value, '', 'definition') + '\n';
}

/** A deep copy with every object's keys sorted (typed arrays become plain arrays; undefined and functions dropped). */
export function sortedKeys(value: unknown): JsonValue {
  if (isPlain(value)) return value as JsonValue;
  if (ArrayBuffer.isView(value)) return Array.from(value as unknown as ArrayLike<number>);
  if (Array.isArray(value)) return value.map((v) => (v === undefined ? null : sortedKeys(v)));
  const out: { [key: string]: JsonValue } = {};
  for (const key of Object.keys(value as object).sort()) {
    // Copied into a plain object, this key would set its prototype instead of a property.
    if (key === '__proto__') throw new KinsortError('definition: a key "__proto__" cannot be stored in a definition.', 'bad-definition');
    const v = (value as Record<string, unknown>)[key];
    // Callbacks (e.g. a progress callback among the method's options) do not shape a result.
    if (v !== undefined && typeof v !== 'function') out[key] = sortedKeys(v);
  }
  return out;
}
