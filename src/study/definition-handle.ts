// A loaded definition: assign new rows, write SQL, write the file again.
import { saveText } from '../core/save-file';
import { readRegularTextFile } from '../table/file-text';
import { KinsortError } from '../core/errors';
import { Matrix, toMatrix } from '../core/matrix';
import { writeDefinitionJson } from '../segments/definition-json';
import { SegmentDefinition } from '../segments/definition-types';
import { readDefinition } from '../segments/definition-validate';
import { fingerprintRows } from '../segments/fingerprint';
import { assignRows, AssignmentOutcome, AssignOptions } from '../segments/assign-rows';
import { definitionToSql, SqlOptions } from '../segments/sql';
import { driftOf, DriftOptions, DriftReport } from '../segments/drift';
import { driftView } from '../views/drift';
import type { View } from '../views/view';

/** Drift figures that also draw themselves (view, show, html, save). */
export type DriftResult = DriftReport & {
  view(): View;
  show(): void;
  html(): string;
  save(path: string): string;
};

/** An assignment outcome whose drift() compares the new rows with the training rows. */
export type ScoredOutcome = AssignmentOutcome & { drift(): DriftResult };

function drawable(report: DriftReport): DriftResult {
  let cached: View | undefined;
  const view = (): View => (cached ??= driftView(report));
  const extra = { view, show: () => view().show(), html: () => view().html(), save: (path: string) => view().save(path) };
  for (const [key, fn] of Object.entries(extra)) Object.defineProperty(report, key, { value: fn, enumerable: false, configurable: true });
  return report as DriftResult;
}

export interface DefinitionHandle {
  readonly definition: SegmentDefinition;
  /** Apply the stored preparation to new rows and give each its nearest segment (1-based). */
  assign(input: unknown, options?: AssignOptions): ScoredOutcome;
  /**
   * Drift of new rows against the training rows. With `scored` (rows scored elsewhere, e.g. by the
   * SQL of toSql(), handed back as { id, segment, far }), shares and far rows come from those.
   */
  drift(input: unknown, options?: DriftOptions): DriftResult;
  /** One portable SELECT giving the id column, segment, distance and far for every row of `table`. */
  toSql(options: SqlOptions): string;
  /** The definition file's text (deterministic). */
  toJSON(): string;
  /** Write the definition file; returns the path, as a view's save() does. */
  save(path: string): string;
  /**
   * Whether `ids` and prepared `rows` are the rows this definition was fitted on (order does not
   * matter). Loading never checks this: the training data is not in the file.
   */
  matchesTraining(ids: readonly string[], rows: Matrix | readonly (readonly number[])[]): boolean;
}

function looksLikeJsonText(s: string): boolean {
  const t = s.replace(/^\uFEFF/, '').trimStart();
  return t.startsWith('{') || t.startsWith('[');
}

/** Wrap a definition (already validated) in a handle. */
export function definitionHandle(definition: SegmentDefinition): DefinitionHandle {
  return {
    definition,
    assign(input, options) {
      const outcome = assignRows(definition, input, options);
      const drift = (): DriftResult => drawable(driftOf(definition, input, { read: options?.read }, outcome));
      Object.defineProperty(outcome, 'drift', { value: drift, enumerable: false, configurable: true });
      return outcome as ScoredOutcome;
    },
    drift: (input, options) => drawable(driftOf(definition, input, options)),
    toSql: (options) => definitionToSql(definition, options),
    toJSON: () => writeDefinitionJson(definition),
    save(path: string) {
      // The one rule of every save (core/save-file.ts); returns the path as given.
      saveText(path, writeDefinitionJson(definition), 'the definition');
      return path;
    },
    matchesTraining(ids, rows) {
      const m = toMatrix(rows as Matrix, { what: 'matchesTraining: rows' });
      if (m.cols !== definition.features.length || ids.length !== m.rows) return false;
      return fingerprintRows(ids.map(String), m) === definition.training.fingerprint;
    },
  };
}

/**
 * Load a definition from a file path, JSON text, a parsed object, or a built definition. The
 * contents are validated; a damaged or newer-format file is refused with a message saying why.
 */
export function loadDefinition(source: string | object): DefinitionHandle {
  if (typeof source === 'string') {
    if (looksLikeJsonText(source) || source.trim() === '') return definitionHandle(readDefinition(source));
    // A regular file of bounded size only (a FIFO or /dev/zero would never return).
    const text = readRegularTextFile(source, 'loadDefinition: cannot read');
    return definitionHandle(readDefinition(text, `loadDefinition("${source}")`));
  }
  if (source === null || typeof source !== 'object') {
    throw new KinsortError('loadDefinition: give a file path, JSON text or a definition object.', 'bad-argument');
  }
  // A built definition goes through the same checks, so both paths give identical objects.
  return definitionHandle(readDefinition(JSON.parse(writeDefinitionJson(source))));
}
