// Option objects are checked by name: a misspelt option is an error, never silently ignored.
import { KinsortError, didYouMean } from './errors';

/**
 * Throw when `options` holds a key outside `allowed`. `where` names the call, e.g. "kmeans".
 * Returns the options (or an empty object) so calls can be chained.
 */
export function checkOptions<T extends object>(options: T | undefined | null, allowed: readonly string[], where: string): T {
  if (options === undefined || options === null) return {} as T;
  if (typeof options !== 'object' || Array.isArray(options)) {
    throw new KinsortError(`${where}: options must be an object; got ${describe(options)}.`, 'bad-option');
  }
  for (const key of Object.keys(options)) {
    if (!allowed.includes(key)) {
      throw new KinsortError(
        `${where}: unknown option "${key}".${didYouMean(key, allowed)} Valid options: ${allowed.join(', ')}.`,
        'unknown-option',
      );
    }
  }
  return options;
}

/** A whole number within [min, max], or a clear error naming the option. */
export function checkInteger(value: unknown, name: string, min: number, max = Number.MAX_SAFE_INTEGER): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
    const range = max === Number.MAX_SAFE_INTEGER ? `a whole number ≥ ${min}` : `a whole number from ${min} to ${max}`;
    throw new KinsortError(`${name} must be ${range}; got ${describe(value)}.`, 'bad-option');
  }
  return value;
}

/** A finite number within [min, max], or a clear error naming the option. */
export function checkNumber(value: unknown, name: string, min = -Infinity, max = Infinity): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new KinsortError(`${name} must be a finite number in [${min}, ${max}]; got ${describe(value)}.`, 'bad-option');
  }
  return value;
}

export function describe(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value.length > 60 ? value.slice(0, 57) + '...' : value);
  if (Array.isArray(value)) return `an array of length ${value.length}`;
  if (value === null) return 'null';
  if (typeof value === 'object') return 'an object';
  return String(value);
}
