// The one rule for text echoed to a terminal: control characters (line breaks, escape sequences,
// the C1 range, bidirectional overrides) are written as visible escapes, so an id or a column name
// cannot forge lines or steer the terminal. Printable text, accents and emoji are left alone.

// C0 controls, DEL, C1 controls, line/paragraph separators, bidi embeddings/overrides/isolates.
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

const NAMED: ReadonlyMap<string, string> = new Map([
  ['\n', '\\n'],
  ['\r', '\\r'],
  ['\t', '\\t'],
  ['\u001b', '\\e'],
]);

/** `text` with every control character shown as an escape (`\n`, `\e`, `\u009b`, …). */
export function forTerminal(text: string): string {
  return text.replace(UNSAFE, (c) => NAMED.get(c) ?? `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}
