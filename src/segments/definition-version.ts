// The package version, read from package.json at run time. The relative path is the same from
// src/segments/ (tests, ts) and dist/segments/ (the built package), both two levels below the root.
let cached: string | undefined;

export function kinsortVersion(): string {
  if (cached === undefined) {
    try {
      cached = String(require('../../package.json').version);
    } catch {
      cached = 'unknown';
    }
  }
  return cached;
}
