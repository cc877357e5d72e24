// prepareTable: fit the preparation on a training table and return the prepared features.
import { KinsortError, checkChoice } from '../core/errors';
import { checkNumber, checkOptions } from '../core/options';
import { readTable } from '../table/read';
import { DEFAULT_MISSING_MARKERS, TEXT_RULE } from '../table/cells';
import { requireColumn } from '../table/names';
import { isTable, type Cell, type Table } from '../table/types';
import { assemble } from './assemble';
import { fillValue, fitColumn } from './fit';
import { readIds, rowText } from './ids';
import { applyMissingPolicy } from './missing';
import { parseNumericColumn } from './values';
import { resolveRoles } from './roles';
import {
  MISSING_POLICIES,
  PREPARATION_VERSION,
  SCALE_METHODS,
  type PreparedColumn,
  type Preparation,
  type PrepareOptions,
  type PreparedData,
} from './types';

const PREPARE_OPTIONS = [
  'id',
  'use',
  'keep',
  'types',
  'ordinalLevels',
  'scale',
  'log',
  'weights',
  'missing',
  'missingMarkers',
  'decimalMark',
];

/**
 * Fit a preparation on `input` (a Table or anything readTable accepts) and apply it. Scaling:
 * 'zscore' (default) uses the sample standard deviation (n − 1), as R's scale(); 'robust' is
 * (x − median) / IQR with type-7 quantiles; 'minmax' maps to [0, 1]. Binary and one-hot columns
 * stay 0/1 (times their weight); only numeric and ordinal columns are centred and scaled.
 */
export function prepareTable(input: Table | unknown, options?: PrepareOptions): PreparedData {
  const opts = checkOptions(options, PREPARE_OPTIONS, 'prepareTable');
  if (isTable(input) && (opts.missingMarkers !== undefined || opts.decimalMark !== undefined)) {
    throw new KinsortError(
      'prepareTable: the input is already a Table; missingMarkers and decimalMark apply when reading, so give them to readTable.',
      'bad-option',
    );
  }
  const table = isTable(input) ? input : readTable(input, { missingMarkers: opts.missingMarkers, decimalMark: opts.decimalMark });
  const decimalMark = table.decimalMark ?? '.';
  const scale = checkChoice(opts.scale ?? 'zscore', SCALE_METHODS, 'scale method');
  const policy = checkChoice(opts.missing ?? 'refuse', MISSING_POLICIES, 'missing-value policy');
  const roles = resolveRoles(table, opts);
  const usedNames = roles.use.map((c) => c.name);
  const notes = [...(table.notes ?? []), ...roles.notes];

  const logged = new Set<string>();
  if (opts.log !== undefined) {
    if (!Array.isArray(opts.log)) throw new KinsortError('prepareTable: log must be an array of column names.', 'bad-option');
    for (const name of opts.log) {
      requireColumn(name, usedNames, 'prepareTable log (a used column)');
      const type = roles.use.find((c) => c.name === name)!.type;
      if (type !== 'numeric') {
        throw new KinsortError(`prepareTable log: column "${name}" is ${type}; log1p applies to numeric columns only.`, 'bad-option');
      }
      logged.add(name);
    }
  }
  const weights = new Map<string, number>();
  for (const [name, w] of Object.entries(opts.weights ?? {})) {
    requireColumn(name, usedNames, 'prepareTable weights (a used column)');
    weights.set(name, checkNumber(w, `prepareTable weights.${name}`, Number.MIN_VALUE));
  }

  const ids = readIds(table, roles.idColumn, 'prepareTable');
  const where = (row: number) => rowText(row, ids, roles.idColumn !== null);
  // Numeric columns are parsed once here (under the text rule), not again in every later step.
  const raw = new Map<string, readonly Cell[]>(
    roles.use.map((u) => {
      const values = table.columns.find((c) => c.name === u.name)!.values;
      return [u.name, u.type === 'numeric' ? parseNumericColumn(values, u.name, where, decimalMark) : values];
    }),
  );
  const outcome = applyMissingPolicy({
    policy,
    names: usedNames,
    raw,
    rowCount: table.rowCount,
    ids,
    where,
    fillFor: (name) =>
      fillValue(
        roles.use.find((c) => c.name === name)!,
        raw.get(name)!,
        where,
        decimalMark,
      ),
  });
  if (outcome.kept.length === 0) {
    throw new KinsortError(
      `prepareTable: every one of the ${table.rowCount} rows has a missing feature, so none is left after ` +
        `dropping; use missing: 'median' or fewer columns.`,
      'empty',
    );
  }
  if (outcome.dropped.length > 0) notes.push(`${outcome.dropped.length} row(s) dropped for missing values (see dropped).`);

  const fills = new Map(outcome.imputed.map((m) => [m.column, m.value]));
  const columns: PreparedColumn[] = [];
  const constantColumns: string[] = [];
  for (const used of roles.use) {
    const fitted = fitColumn(used, outcome.cells.get(used.name)!, outcome.kept, {
      scale,
      log: logged.has(used.name),
      weight: weights.get(used.name) ?? 1,
      fill: fills.get(used.name) ?? null,
      decimalMark,
      where,
      notes,
    });
    if (fitted === null) constantColumns.push(used.name);
    else columns.push(fitted);
  }
  if (constantColumns.length > 0) {
    notes.push(
      `Dropped from the features because they do not vary in the ${outcome.kept.length} kept row(s): ` +
        `${constantColumns.join(', ')} (still in the profile).`,
    );
  }
  if (columns.length === 0) {
    throw new KinsortError(
      `prepareTable: every used column is constant in the kept rows (${constantColumns.join(', ')}); nothing to segment on.`,
      'empty',
    );
  }
  const preparation: Preparation = {
    format: 'kinsort-preparation',
    version: PREPARATION_VERSION,
    textRule: TEXT_RULE,
    missingMarkers: [...(table.missingMarkers ?? DEFAULT_MISSING_MARKERS)],
    decimalMark,
    idColumn: roles.idColumn,
    scale,
    missing: policy,
    columns,
    constantColumns,
    keep: roles.keep,
    featureNames: columns.flatMap((c) => c.features),
  };
  return assemble({
    preparation,
    table,
    ids,
    cells: outcome.cells,
    kept: outcome.kept,
    where,
    profileColumns: [...roles.keep, ...usedNames],
    parsed: raw,
    report: {
      inputRows: table.rowCount,
      dropped: outcome.dropped,
      imputed: outcome.imputed,
      constantColumns,
      notes,
    },
  });
}
