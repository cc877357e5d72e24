// Column names that a caller refers to must exist; a typo gets a "did you mean".
import { KinsortError, didYouMean } from '../core/errors';

/** Throw when `name` is not among `available`, saying what `what` expected. */
export function requireColumn(name: unknown, available: readonly string[], what: string): string {
  if (typeof name !== 'string') {
    throw new KinsortError(`${what}: column names must be text; got ${JSON.stringify(name)}.`, 'bad-option');
  }
  if (!available.includes(name)) {
    throw new KinsortError(
      `${what}: no column named "${name}".${didYouMean(name, available)} Columns: ${available.join(', ')}.`,
      'unknown-column',
    );
  }
  return name;
}

/** Header names must be non-empty and unique. */
export function checkHeader(names: readonly string[], source: string): void {
  if (names.length === 0) throw new KinsortError(`${source} has no columns.`, 'empty');
  const firstAt = new Map<string, number>();
  names.forEach((name, j) => {
    if (typeof name !== 'string' || name.trim() === '') {
      throw new KinsortError(`${source}: column ${j + 1} has no name; every column needs a unique name.`, 'bad-input');
    }
    const before = firstAt.get(name);
    if (before !== undefined) {
      throw new KinsortError(
        `${source}: duplicate column name "${name}" (columns ${before + 1} and ${j + 1}); names must be unique.`,
        'bad-input',
      );
    }
    firstAt.set(name, j);
  });
}
