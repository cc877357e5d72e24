// applyPreparation: re-apply a fitted preparation to new rows, never refitting.
import { KinsortError, didYouMean } from '../core/errors';
import { checkOptions } from '../core/options';
import { readTable } from '../table/read';
import { isTable, type Cell, type Table } from '../table/types';
import { assemble } from './assemble';
import { readIds, rowText } from './ids';
import { applyMissingPolicy } from './missing';
import { parseNumericColumn } from './values';
import { PREPARATION_VERSION, type Preparation, type PreparedData } from './types';
import { upgradePreparation } from './upgrade';
import { TEXT_RULE } from '../table/cells';

export interface ApplyPreparationOptions {
  /** Id column of the new rows when it differs from training; null for "1".."n". */
  id?: string | null;
}

function checkPreparation(p: Preparation): void {
  if (typeof p !== 'object' || p === null || p.format !== 'kinsort-preparation' || !Array.isArray(p.columns)) {
    throw new KinsortError('applyPreparation: the first argument is not a kinsort preparation.', 'bad-definition');
  }
  if ((p.version as number) === 1) {
    throw new KinsortError(
      'applyPreparation: this preparation is version 1, written before the schema was stored (text rule, missing ' +
        'markers, level matching); re-applying it could read cells differently from training. Fit the preparation ' +
        'again with this kinsort (prepareTable on the training rows).',
      'bad-definition',
    );
  }
  if (p.version !== PREPARATION_VERSION) {
    throw new KinsortError(
      `applyPreparation: preparation version ${JSON.stringify(p.version)} is not supported (this package reads ${PREPARATION_VERSION}).`,
      'bad-definition',
    );
  }
  if (p.textRule !== TEXT_RULE) {
    throw new KinsortError(
      `applyPreparation: text rule ${JSON.stringify(p.textRule)} is not one this package knows (it reads "${TEXT_RULE}").`,
      'bad-definition',
    );
  }
}

/**
 * The new rows as a Table read under the preparation's stored schema: its missing markers and
 * decimal mark. Nothing about the batch is inferred that the transform uses (types and levels are
 * the stored ones), so a row gives the same result alone or beside any other rows.
 */
export function readUnderSchema(p: Preparation, input: unknown, where: string): Table {
  if (!isTable(input)) return readTable(input, { missingMarkers: p.missingMarkers, decimalMark: p.decimalMark });
  const same = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i]);
  if (input.missingMarkers !== undefined && !same(input.missingMarkers, p.missingMarkers)) {
    throw new KinsortError(
      `${where}: the Table was read with missing markers ${JSON.stringify(input.missingMarkers)}, but the preparation ` +
        `stores ${JSON.stringify(p.missingMarkers)}; give the raw rows (or read them with the stored markers) so cells mean the same.`,
      'bad-input',
    );
  }
  if (input.decimalMark !== undefined && input.decimalMark !== p.decimalMark) {
    throw new KinsortError(
      `${where}: the Table was read with decimal mark "${input.decimalMark}", but the preparation stores "${p.decimalMark}".`,
      'bad-input',
    );
  }
  return input;
}

/**
 * Transform new rows exactly as the training rows were: same columns, levels, centres, spreads,
 * weights and feature order. A categorical level never seen in training sets all of that column's
 * indicators to 0 and is listed in report.unseenLevels; missing cells follow the stored policy
 * ('median' imputes the stored training values).
 */
export function applyPreparation(given: Preparation, input: Table | unknown, options?: ApplyPreparationOptions): PreparedData {
  // A version-2 preparation (key `centre`) is read as version 3 (key `center`): the same numbers.
  const preparation = upgradePreparation(given);
  checkPreparation(preparation);
  const opts = checkOptions(options, ['id'], 'applyPreparation');
  const table = readUnderSchema(preparation, input, 'applyPreparation');
  const names = table.columns.map((c) => c.name);
  const idColumn = opts.id === undefined ? preparation.idColumn : opts.id;
  if (idColumn !== null && !names.includes(idColumn)) {
    throw new KinsortError(
      `applyPreparation: the new rows have no id column "${idColumn}".${didYouMean(idColumn, names)} ` +
        `Pass { id: 'other_column' } to name it, or { id: null } to number the rows 1..n.`,
      'unknown-column',
    );
  }
  const needed = preparation.columns.map((c) => c.name);
  const absent = needed.filter((n) => !names.includes(n));
  if (absent.length > 0) {
    const hint = absent.length === 1 ? didYouMean(absent[0], names) : '';
    throw new KinsortError(
      `applyPreparation: the new rows lack the used column(s) ${absent.map((n) => `"${n}"`).join(', ')}, ` +
        `which the preparation needs.${hint}`,
      'unknown-column',
    );
  }
  const notes: string[] = [];
  const known = new Set([...needed, ...preparation.constantColumns, ...preparation.keep]);
  if (idColumn !== null) known.add(idColumn);
  const extra = names.filter((n) => !known.has(n));
  if (extra.length > 0) notes.push(`Ignored columns not in the preparation: ${extra.join(', ')}.`);
  const keepPresent = preparation.keep.filter((n) => names.includes(n));
  const keepAbsent = preparation.keep.filter((n) => !names.includes(n));
  if (keepAbsent.length > 0) notes.push(`Profile-only columns absent from the new rows: ${keepAbsent.join(', ')}.`);

  const ids = readIds(table, idColumn, 'applyPreparation');
  const where = (row: number) => rowText(row, ids, idColumn !== null);
  const raw = new Map<string, readonly Cell[]>(
    preparation.columns.map((spec) => {
      const values = table.columns.find((c) => c.name === spec.name)!.values;
      return [spec.name, spec.type === 'numeric' ? parseNumericColumn(values, spec.name, where, preparation.decimalMark) : values];
    }),
  );
  const outcome = applyMissingPolicy({
    policy: preparation.missing,
    names: needed,
    raw,
    rowCount: table.rowCount,
    ids,
    where,
    fillFor: (name) => {
      const fill = preparation.columns.find((c) => c.name === name)!.fill;
      if (fill === null) {
        throw new KinsortError(
          `applyPreparation: column "${name}" has missing cells but the training rows had none there, so no ` +
            `imputation value was stored.`,
          'missing-value',
        );
      }
      return fill;
    },
  });
  if (outcome.dropped.length > 0) notes.push(`${outcome.dropped.length} row(s) dropped for missing values (see dropped).`);
  const usedPresent = [...needed, ...preparation.constantColumns.filter((n) => names.includes(n))];
  return assemble({
    preparation,
    table,
    ids,
    cells: outcome.cells,
    kept: outcome.kept,
    where,
    profileColumns: [...keepPresent, ...usedPresent],
    parsed: raw,
    report: {
      inputRows: table.rowCount,
      dropped: outcome.dropped,
      imputed: outcome.imputed,
      constantColumns: [...preparation.constantColumns],
      notes,
    },
  });
}
