// CSV text and files, parsed by papaparse. We normalise line endings first so CRLF, LF and mixed
// files all parse the same, and we refuse ragged rows by line number rather than padding them.
import Papa from 'papaparse';
import { readRegularFileBytes } from './file-text';
import { KinsortError } from '../core/errors';
import { trimSpaces } from './cells';
import { decodeCsvBytes } from './decode';

export type CsvDelimiter = ',' | ';' | '\t';
const DELIMITERS: readonly string[] = [',', ';', '\t'];

export interface RawColumns {
  readonly names: string[];
  /** columns[j][i]: column j, row i, as given. */
  readonly columns: unknown[][];
  /** Where the input came from, for messages. */
  readonly source: string;
  /** 1-based line number where each data row starts (CSV only). */
  readonly lines?: number[];
  /** What the reader decided that a person should know. */
  readonly notes?: string[];
}

/** Parse CSV text into a header and rows of strings. */
export function parseCsvText(text: string, delimiter?: string): RawColumns {
  if (typeof text !== 'string') throw new KinsortError('CSV input must be text.', 'bad-input');
  if (delimiter !== undefined && !DELIMITERS.includes(delimiter)) {
    throw new KinsortError(`CSV delimiter ${JSON.stringify(delimiter)} is not supported; use ",", ";" or "\\t" (tab).`, 'bad-option');
  }
  const clean = (text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).replace(/\r\n?/g, '\n');
  if (clean.trim() === '') throw new KinsortError('CSV input is empty: no header and no rows.', 'empty');

  const rows: string[][] = [];
  const lines: number[] = [];
  // Line of each row start: count newlines up to the row's first character.
  let line = 1;
  let scanned = 0;
  let rowStart = 0;
  const errors: Papa.ParseError[] = [];
  Papa.parse<string[]>(clean, {
    delimiter: delimiter ?? '',
    delimitersToGuess: [',', ';', '\t'],
    newline: '\n',
    skipEmptyLines: true,
    step: (result) => {
      const end = result.meta.cursor;
      // Skip blank lines papaparse dropped before this row.
      let start = rowStart;
      while (start < end && clean[start] === '\n') start++;
      for (; scanned < start; scanned++) if (clean[scanned] === '\n') line++;
      rows.push(result.data);
      lines.push(line);
      rowStart = end;
      if (result.errors.length > 0) errors.push(...result.errors.map((e) => ({ ...e, row: rows.length - 1 })));
    },
  });
  const quoteError = errors.find((e) => e.type === 'Quotes');
  if (quoteError) {
    const at = quoteError.row === undefined ? '' : ` (row starting on line ${lines[quoteError.row] ?? '?'})`;
    throw new KinsortError(`CSV: ${quoteError.message}${at}; check for an unclosed quote.`, 'bad-input');
  }
  // A lone quote (or text papaparse reads as nothing) yields no rows at all.
  if (rows.length === 0) throw new KinsortError('CSV input has no header row (is a quote left open?).', 'empty');
  const header = rows[0].map((h) => trimSpaces(h));
  const body = rows.slice(1);
  // Lines of empty fields only (",,,") at the end are what spreadsheets leave behind, not rows.
  let trailing = 0;
  while (body.length > 0 && body[body.length - 1].every((f) => f === '')) {
    body.pop();
    trailing++;
  }
  const notes: string[] = [];
  if (trailing > 0) {
    notes.push(`${trailing} line(s) of empty fields at the end of the CSV were not read as rows.`);
  }
  for (let i = 0; i < body.length; i++) {
    if (body[i].length !== header.length) {
      throw new KinsortError(
        `CSV: line ${lines[i + 1]} (data row ${i + 1}) has ${body[i].length} fields but the header on ` +
          `line ${lines[0]} has ${header.length}; every row needs the same columns.`,
        'ragged',
      );
    }
  }
  const columns = header.map((_, j) => body.map((row) => row[j]));
  return { names: header, columns, source: 'CSV', lines: lines.slice(1, body.length + 1), notes };
}

/** Read a CSV file (UTF-8 unless `encoding` names another) and parse it. */
export function readCsvText(path: string, delimiter?: string, encoding?: string): RawColumns {
  // A regular file only, of bounded size (file-text.ts): a FIFO or /dev/zero is refused, not read forever.
  const bytes = readRegularFileBytes(path, 'Cannot read CSV file');
  const text = decodeCsvBytes(bytes, `CSV file "${path}"`, encoding);
  return { ...parseCsvText(text, delimiter), source: `CSV file "${path}"` };
}
