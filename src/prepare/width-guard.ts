// A guard on the width of the prepared matrix, checked before it is allocated. One-hot coding
// turns a categorical column of L levels into L features, so a column of postcodes or free text
// can silently ask for gigabytes (60,000 rows × 6,000 levels: 2.9 GB) or end in a raw RangeError
// (200,000 × 40,000). Both limits can be changed with setPreparedLimits.
import { KinsortError } from '../core/errors';
import type { PreparedColumn } from './types';

export interface PreparedLimits {
  /** Most levels one categorical column may one-hot code (default 1,000). */
  readonly levels: number;
  /** Most bytes of the prepared matrix (default a quarter of the machine's memory, at most 4 GiB). */
  readonly bytes: number;
}

function defaultBytes(): number {
  let total = 8 * 1024 ** 3;
  try {
    total = require('os').totalmem();
  } catch {
    /* not in Node: keep the fixed default */
  }
  return Math.min(total / 4, 4 * 1024 ** 3);
}

let limits: PreparedLimits = { levels: 1_000, bytes: defaultBytes() };

/** Change the limits (either or both); returns the previous ones. */
export function setPreparedLimits(next: Partial<PreparedLimits>): PreparedLimits {
  const previous = limits;
  limits = { ...limits, ...next };
  return previous;
}

const fmt = (n: number) => n.toLocaleString('en-US');

/** Refuse, before allocating, a one-hot column with too many levels or a matrix above the budget. */
export function guardPreparedWidth(columns: readonly PreparedColumn[], rows: number, where: string): void {
  let widest: PreparedColumn | undefined;
  for (const c of columns) {
    if (c.type !== 'categorical') continue;
    const levels = c.features.length;
    if (levels > limits.levels) {
      throw new KinsortError(
        `${where}: column "${c.name}" has ${fmt(levels)} levels; one-hot coding makes one feature per level, ` +
          `and at most ${fmt(limits.levels)} are allowed. Keep it as a profile-only column (keep), group its ` +
          `rare levels, or leave it out.`,
        'too-large',
      );
    }
    if (widest === undefined || levels > widest.features.length) widest = c;
  }
  const width = columns.reduce((s, c) => s + c.features.length, 0);
  const bytes = rows * width * 8;
  if (bytes > limits.bytes) {
    const named = widest ? ` The widest one-hot column is "${widest.name}" with ${fmt(widest.features.length)} levels.` : '';
    throw new KinsortError(
      `${where}: the prepared matrix would be ${fmt(rows)} rows × ${fmt(width)} features ` +
        `(${fmt(Math.round(bytes / 1024 ** 2))} MB), more than the ${fmt(Math.round(limits.bytes / 1024 ** 2))} MB allowed.${named} ` +
        `Use fewer rows (a sample) or fewer features.`,
      'too-large',
    );
  }
}
