// Fitting one used column: its levels, center and spread from the kept training rows.
import { KinsortError } from '../core/errors';
import { isTrueFalse, levelKey, sortLevels, type DecimalMark } from '../table/cells';
import type { Cell } from '../table/types';
import type { UsedColumn } from './roles';
import { quantileSorted } from '../core/quantile';
import { mean, median, minMax, sampleSd, scaledMad, sortedCopy } from './stats';
import type { PreparedColumn, ScaleMethod } from './types';
import { levelCodes, numericCell, requireLevel } from './values';

export interface FitContext {
  scale: ScaleMethod;
  log: boolean;
  weight: number;
  fill: number | string | null;
  decimalMark: DecimalMark;
  where: (row: number) => string;
  notes: string[];
}

/** The fitted column, or null when it has no spread in the kept rows (constant). */
export function fitColumn(column: UsedColumn, cells: readonly Cell[], kept: Int32Array, ctx: FitContext): PreparedColumn | null {
  const { name, type } = column;
  const base = { name, type, log: ctx.log, weight: ctx.weight, fill: ctx.fill };
  const exact = { ...base, levelMatch: 'exact' as const };
  if (type === 'numeric' || type === 'ordinal') {
    const levels = type === 'ordinal' ? column.ordinalLevels! : null;
    const codes = levels ? levelCodes(levels) : null;
    const values = new Float64Array(kept.length);
    for (let r = 0; r < kept.length; r++) {
      const row = kept[r];
      const cell = cells[row] as Exclude<Cell, null>;
      values[r] = codes
        ? requireLevel(cell, codes, name, 'ordinal', ctx.where, row)
        : numericCell(cell, name, ctx.log, ctx.where, row, ctx.decimalMark);
    }
    const [lo, hi] = minMax(values);
    if (!(hi > lo)) return null;
    const { center, spread, spreadKind } = scaleOf(values, ctx.scale, lo, hi, name, ctx.notes);
    // Values near the ends of double precision overflow (1e300) or underflow (1e-300) in the
    // spread; scaled by it every row would silently become 0 or NaN.
    if (
      !Number.isFinite(center) ||
      !Number.isFinite(spread) ||
      !(spread > 0) ||
      !Number.isFinite(lo / spread) ||
      !Number.isFinite(hi / spread)
    ) {
      throw new KinsortError(
        `column "${name}": its values run from ${lo} to ${hi}, too large or too small in size to scale ` +
          `in double precision (the ${spreadKind === 'none' ? 'centre' : spreadKind} comes out as ${spreadKind === 'none' ? center : spread}); ` +
          `multiply the column by a power of ten first.`,
        'bad-input',
      );
    }
    // `+ 0` turns a -0 centre into +0: JSON writes -0 as 0, and the re-applied matrix must match bit for bit.
    return {
      ...base,
      levels: levels ? [...levels] : null,
      levelMatch: levels ? 'exact' : null,
      center: center + 0,
      spread,
      spreadKind,
      features: [name],
    };
  }
  if (type === 'binary') {
    const trueFalse = trueFalseLevels(cells, kept);
    if (trueFalse === 'constant') return null;
    if (trueFalse !== null) {
      return { ...base, levels: trueFalse, levelMatch: 'ascii-case', center: 0, spread: 1, spreadKind: 'none', features: [name] };
    }
  }
  const present = new Set<string>();
  for (let r = 0; r < kept.length; r++) present.add(levelKey(cells[kept[r]] as Exclude<Cell, null>));
  const levels = sortLevels(present);
  if (levels.length < 2) return null;
  if (type === 'binary') {
    if (levels.length > 2) {
      throw new KinsortError(
        `column "${name}" is treated as binary but has ${levels.length} distinct values ` +
          `(${levels
            .slice(0, 6)
            .map((l) => JSON.stringify(l))
            .join(', ')}${levels.length > 6 ? ', …' : ''}); ` +
          `declare it categorical in types.`,
        'bad-input',
      );
    }
    const plain = levels[0] === '0' && levels[1] === '1';
    const feature = plain ? name : `${name}=${levels[1]}`;
    return { ...exact, levels, center: 0, spread: 1, spreadKind: 'none', features: [feature] };
  }
  return { ...exact, levels, center: 0, spread: 1, spreadKind: 'none', features: levels.map((l) => `${name}=${l}`) };
}

/**
 * A binary column whose cells are all true/false in ASCII letters of any case is one column: its two
 * levels are [false, true], each stored in the spelling the training rows use most (ties: code-unit
 * order), matched ignoring case. null when the cells are anything else; 'constant' when only one of
 * the two occurs.
 */
function trueFalseLevels(cells: readonly Cell[], kept: Int32Array): [string, string] | 'constant' | null {
  const spellings = new Map<string, number>();
  for (let r = 0; r < kept.length; r++) {
    const cell = cells[kept[r]];
    if (typeof cell !== 'string' || !isTrueFalse(cell)) return null;
    spellings.set(cell, (spellings.get(cell) ?? 0) + 1);
  }
  const pick = (lower: string): string | undefined => {
    let best: string | undefined;
    for (const s of sortLevels(spellings.keys())) {
      if (s.toLowerCase() === lower && (best === undefined || spellings.get(s)! > spellings.get(best)!)) best = s;
    }
    return best;
  };
  const f = pick('false');
  const t = pick('true');
  if (f === undefined || t === undefined) return 'constant';
  return [f, t];
}

function scaleOf(
  values: Float64Array,
  scale: ScaleMethod,
  lo: number,
  hi: number,
  name: string,
  notes: string[],
): Pick<PreparedColumn, 'center' | 'spread' | 'spreadKind'> {
  switch (scale) {
    case 'none':
      return { center: 0, spread: 1, spreadKind: 'none' };
    case 'zscore':
      return { center: mean(values), spread: sampleSd(values), spreadKind: 'sd' };
    case 'minmax':
      return { center: lo, spread: hi - lo, spreadKind: 'range' };
    case 'robust': {
      const sorted = sortedCopy(values);
      const center = quantileSorted(sorted, 0.5);
      const iqr = quantileSorted(sorted, 0.75) - quantileSorted(sorted, 0.25);
      if (iqr > 0) return { center, spread: iqr, spreadKind: 'iqr' };
      const mad = scaledMad(values, center);
      if (mad > 0) {
        notes.push(`Column "${name}": interquartile range is 0, so robust scaling divides by the MAD (×1.4826) instead.`);
        return { center, spread: mad, spreadKind: 'mad' };
      }
      notes.push(
        `Column "${name}": interquartile range and MAD are both 0, so robust scaling divides by the ` + `standard deviation instead.`,
      );
      return { center, spread: sampleSd(values), spreadKind: 'sd' };
    }
  }
}

/** The training value imputed under 'median': numeric median, else the most frequent level. */
export function fillValue(
  column: UsedColumn,
  cells: readonly Cell[],
  where: (row: number) => string,
  decimalMark: DecimalMark = '.',
): number | string {
  const rows: number[] = [];
  cells.forEach((c, i) => {
    if (c !== null) rows.push(i);
  });
  if (rows.length === 0) {
    throw new KinsortError(`column "${column.name}" has no values at all, so there is nothing to impute from.`, 'empty');
  }
  if (column.type === 'numeric') {
    const values = Float64Array.from(rows, (i) => numericCell(cells[i]!, column.name, false, where, i, decimalMark));
    return median(values) + 0; // no -0: it would not survive JSON
  }
  const counts = new Map<string, number>();
  for (const i of rows) {
    const key = levelKey(cells[i]!);
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  let best = '';
  let bestCount = -1;
  for (const level of sortLevels(counts.keys())) {
    const c = counts.get(level)!;
    if (c > bestCount) {
      best = level;
      bestCount = c;
    }
  }
  return best;
}
