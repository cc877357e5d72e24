// Reading preparations written by earlier versions. Version 2 spelled the subtracted value of a
// column `centre`; version 3 (this one) spells it `center`, as every other name and key does. The
// two versions mean the same numbers, so a version-2 preparation is translated on reading, key by
// key, and nothing else about it changes; it is written back as version 3.

/** The preparation version that spelled each column's subtracted value `centre`. */
export const PREPARATION_VERSION_CENTRE = 2;

/**
 * A version-2 preparation as version 3: each column's `centre` becomes `center`, `version` becomes
 * 3. Anything else (another version, a damaged object, a column that already has `center`) is
 * returned as given, for the checks that follow to refuse with their own messages.
 */
export function upgradePreparation<T>(p: T): T {
  if (p === null || typeof p !== 'object' || Array.isArray(p)) return p;
  const raw = p as Record<string, unknown>;
  if (raw.format !== 'kinsort-preparation' || raw.version !== PREPARATION_VERSION_CENTRE || !Array.isArray(raw.columns)) return p;
  const columns = raw.columns.map((c: unknown) => {
    if (c === null || typeof c !== 'object' || Array.isArray(c)) return c;
    const col = c as Record<string, unknown>;
    if (!Object.prototype.hasOwnProperty.call(col, 'centre') || Object.prototype.hasOwnProperty.call(col, 'center')) return c;
    // Key by key, in the same order, with only the one key renamed.
    const out: Record<string, unknown> = {};
    for (const key of Object.keys(col)) out[key === 'centre' ? 'center' : key] = col[key];
    return out;
  });
  return { ...raw, version: PREPARATION_VERSION_CENTRE + 1, columns } as T;
}
