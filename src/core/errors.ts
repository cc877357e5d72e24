// One error type for everything the package refuses, so callers (and the notebook layer) can tell
// a clear message about their input from an internal failure.

/** Short machine-readable reasons; the message is for people. */
export type ErrorCode =
  | 'bad-seed'
  | 'bad-argument'
  | 'bad-option'
  | 'unknown-option'
  | 'bad-input'
  | 'not-finite'
  | 'ragged'
  | 'empty'
  | 'missing-value'
  | 'duplicate-id'
  | 'unknown-column'
  | 'bad-k'
  | 'bad-assignment'
  | 'too-large'
  | 'bad-dissimilarity'
  | 'bad-definition'
  | 'not-supported'
  | 'query-failed';

export class KinsortError extends Error {
  readonly code: ErrorCode;
  constructor(message: string, code: ErrorCode) {
    super(message);
    this.name = 'KinsortError';
    this.code = code;
  }
}

/** Edit distance (Levenshtein), for "did you mean" suggestions on names. */
export function editDistance(a: string, b: string): number {
  const m = a.length;
  const n = b.length;
  let previous = new Array<number>(n + 1);
  let current = new Array<number>(n + 1);
  for (let j = 0; j <= n; j++) previous[j] = j;
  for (let i = 1; i <= m; i++) {
    current[0] = i;
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
    }
    [previous, current] = [current, previous];
  }
  return previous[n];
}

/**
 * Names longer than this get no suggestion: the edit distance costs length × length, and a typo
 * in a 200-character name is not what a suggestion helps with (a 1 MB name took minutes).
 */
export const SUGGESTION_MAX_LENGTH = 200;

/** Most character comparisons one suggestion may cost (many long candidates: stop looking). */
const SUGGESTION_WORK = 20_000_000;

/** The closest candidate to `name`, when it is close enough to be a likely typo. */
export function closestName(name: string, candidates: readonly string[]): string | undefined {
  if (name.length > SUGGESTION_MAX_LENGTH) return undefined;
  const lower = name.toLowerCase();
  const allowed = Math.max(2, Math.floor(name.length / 3));
  let best: string | undefined;
  let bestDistance = Infinity;
  let work = 0;
  for (const candidate of candidates) {
    // The distance is at least the difference in length: skip what cannot be close enough.
    if (Math.abs(candidate.length - name.length) > allowed) continue;
    work += (name.length + 1) * (candidate.length + 1);
    if (work > SUGGESTION_WORK) break;
    const d = editDistance(lower, candidate.toLowerCase());
    if (d < bestDistance) {
      bestDistance = d;
      best = candidate;
    }
  }
  return bestDistance <= allowed ? best : undefined;
}

/** ` Did you mean "x"?` or the empty string. */
export function didYouMean(name: string, candidates: readonly string[]): string {
  const guess = closestName(name, candidates);
  return guess === undefined ? '' : ` Did you mean "${guess}"?`;
}

/** Refuse a value that is not one of the allowed names, listing them and suggesting the closest. */
export function checkChoice<T extends string>(value: unknown, allowed: readonly T[], what: string): T {
  if (typeof value === 'string' && (allowed as readonly string[]).includes(value)) return value as T;
  const shown = typeof value === 'string' ? `"${value}"` : String(value);
  const hint = typeof value === 'string' ? didYouMean(value, allowed) : '';
  throw new KinsortError(`Unknown ${what} ${shown}.${hint} Valid ${what}s: ${allowed.join(', ')}.`, 'bad-option');
}
