// Every string that came from data passes through here before it reaches markup. JSON placed
// inside <script> is escaped so no value can close the element or open a comment.

const HTML_ENTITIES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
  '`': '&#96;',
};

/** Text or attribute value → safe HTML (both quote styles escaped). */
export function escapeHtml(value: unknown): string {
  return String(value ?? '').replace(/[&<>"'`]/g, (c) => HTML_ENTITIES[c]);
}

/**
 * JSON for an inline <script>: `<`, `>`, `&` and the JS line separators are written as \u
 * escapes, so `</script>` or `<!--` inside a value stays inert text.
 */
export function scriptJson(value: unknown): string {
  return JSON.stringify(value, (_key, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v))
    .replace(/</g, '\\u003c')
    .replace(/>/g, '\\u003e')
    .replace(/&/g, '\\u0026')
    .replace(/\u2028/g, '\\u2028')
    .replace(/\u2029/g, '\\u2029');
}

/** A safe element id / file-name piece from a title: letters, digits and dashes only. */
export function slug(text: string, fallback = 'view'): string {
  const s = text
    .normalize('NFKD')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 48);
  return s || fallback;
}
