// Text that may go into SQL at all: no U+0000 (engines read SQL as C strings, or cannot store it)
// and no unpaired surrogate (it cannot be written as UTF-8, so it would reach the engine as U+FFFD
// and compare unequal to the user's text). Everything else is quoted by the dialect.
import { KinsortError } from '../core/errors';

export function checkSqlText(text: string, what: string): string {
  if (typeof text !== 'string') throw new KinsortError(`SQL: ${what} is not text.`, 'bad-definition');
  if (text.includes('\u0000')) {
    throw new KinsortError(
      `SQL: ${what} ${JSON.stringify(text.slice(0, 80))} holds the character U+0000, which SQL text cannot carry.`,
      'not-supported',
    );
  }
  if (/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(text)) {
    throw new KinsortError(
      `SQL: ${what} ${JSON.stringify(text.slice(0, 80))} holds an unpaired surrogate (not valid Unicode), which SQL text cannot carry unchanged.`,
      'not-supported',
    );
  }
  return text;
}

/**
 * Text for a `--` comment: one line whatever it holds. JSON escapes quotes, backslashes and C0
 * controls; C1 controls and the Unicode line and paragraph separators are escaped too, so no
 * engine (or terminal) can see a line break or a control sequence inside the comment.
 */
export function commentText(text: string): string {
  return JSON.stringify(String(text)).replace(/[\u007f-\u009f\u2028\u2029]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** The exact decimal expansion of a power of two (2^e, e may be negative), as text. */
export function powerOfTwoDecimal(e: number): string {
  if (e >= 0) return (1n << BigInt(e)).toString();
  // 2^-n = 5^n / 10^n
  const digits = (5n ** BigInt(-e)).toString().padStart(-e, '0');
  return `0.${digits}`;
}
