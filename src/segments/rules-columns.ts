// The original, unscaled columns a rule tree reads, and how a raw cell becomes the tree's number:
// numeric cells in their own units, categorical cells by level name (exactly as written),
// ordinal cells by rank. Missing cells (and levels the tree never saw) become NaN and follow
// the larger branch.
import { KinsortError } from '../core/errors';
import { cellNumber, type DecimalMark } from '../table/cells';
import type { Cell } from '../table/types';
import type { RuleColumn, RuleColumnKind } from '../methods/rules';

/** What the rules need to know about a column to read new rows and write SQL. */
export interface RuleColumnSpec {
  readonly name: string;
  readonly kind: RuleColumnKind;
  /** categorical: levels in code order (sorted); ordinal: lowest first. */
  readonly levels?: readonly string[];
  /** Whether any training row lacked a value (the rules then say "or missing" where it applies). */
  readonly hadMissing: boolean;
  /** numeric: the decimal mark the stored preparation reads numbers with (default '.'). */
  readonly decimalMark?: DecimalMark;
}

/** The level text of a cell: strings as given, numbers as JavaScript writes them. */
export function levelText(cell: Cell): string | null {
  return cell === null ? null : typeof cell === 'string' ? cell : String(cell);
}

/** A column's spec from its training cells; `declared` comes from the preparation when known. */
export function specFromCells(
  name: string,
  cells: readonly Cell[],
  declared?: { type: string; levels: readonly string[] | null },
  decimalMark: DecimalMark = '.',
): RuleColumnSpec {
  const hadMissing = cells.some((c) => c === null);
  if (declared?.type === 'ordinal' && declared.levels) return { name, kind: 'ordinal', levels: [...declared.levels], hadMissing };
  // Undeclared (profile-only) columns: numeric only when every present cell is a number under the
  // text rule (table/cells.ts), so codes such as "007" stay levels.
  const numeric = declared ? declared.type === 'numeric' : cells.every((c) => c === null || cellNumber(c, decimalMark) !== undefined);
  if (numeric) return { name, kind: 'numeric', hadMissing, ...(decimalMark === ',' ? { decimalMark } : {}) };
  const levels = [...new Set(cells.map(levelText).filter((v): v is string => v !== null))].sort();
  return { name, kind: 'categorical', levels, hadMissing };
}

/** Cells of one column as the tree's numbers; a cell that cannot be read is refused by row and column. */
export function codeCells(spec: RuleColumnSpec, cells: readonly Cell[], where: string, rowName: (i: number) => string): Float64Array {
  const out = new Float64Array(cells.length);
  const codeOf = spec.levels ? new Map(spec.levels.map((l, i) => [l, i])) : undefined;
  for (let i = 0; i < cells.length; i++) {
    const cell = cells[i];
    if (cell === null) {
      out[i] = NaN;
    } else if (spec.kind === 'numeric') {
      // Cells are text as given (the text rule reads the number) or numbers from records.
      const value = cellNumber(cell, spec.decimalMark ?? '.');
      if (value === undefined || !Number.isFinite(value)) {
        throw new KinsortError(
          `${where}: ${rowName(i)}, column "${spec.name}" holds ${JSON.stringify(cell)}; the rules compare this column as a number.`,
          'bad-input',
        );
      }
      out[i] = value;
    } else {
      out[i] = codeOf!.get(levelText(cell)!) ?? NaN;
    }
  }
  return out;
}

export function ruleColumn(spec: RuleColumnSpec, values: Float64Array): RuleColumn {
  return { name: spec.name, kind: spec.kind, values, levels: spec.levels };
}
