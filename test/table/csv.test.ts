// CSV intake edge cases: quoting, BOM, delimiters, line endings, ragged rows, missing markers.
import { mkdtempSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { describe, expect, test } from 'vitest';
import { readCsvFile, readTable } from '../../src/table';

const col = (t: ReturnType<typeof readTable>, name: string) => t.columns.find((c) => c.name === name)!.values;

describe('CSV text', () => {
  test('quoted fields keep embedded delimiters, quotes and newlines', () => {
    const t = readTable('id,note,n\n1,"a, b",2\n2,"line one\nline two",3\n3,"say ""hi""",4\n');
    expect(t.rowCount).toBe(3);
    expect(col(t, 'note')).toEqual(['a, b', 'line one\nline two', 'say "hi"']);
    expect(col(t, 'n')).toEqual(['2', '3', '4']); // text as given; the preparation parses numbers
  });

  test('a leading byte-order mark is stripped from the first column name', () => {
    const t = readTable('\uFEFFrider,trips\nr1,3\nr2,4\n');
    expect(t.columns.map((c) => c.name)).toEqual(['rider', 'trips']);
  });

  test('semicolon and tab delimiters are detected; the delimiter can be given', () => {
    const semi = readTable('a;b\n1,5;2\n3,5;4\n');
    expect(semi.columns.map((c) => c.name)).toEqual(['a', 'b']);
    expect(col(semi, 'a')).toEqual(['1,5', '3,5']);
    const tab = readTable('a\tb\tc\n1\t2\t3\n4\t5\t6\n7\t8\t9\n');
    expect(col(tab, 'c')).toEqual(['3', '6', '9']);
    // Forced: a comma file read with ';' is one column whose name holds the comma.
    const forced = readTable('a,b\n1,2\n', { delimiter: ';' });
    expect(forced.columns.map((c) => c.name)).toEqual(['a,b']);
  });

  test('CRLF, LF and mixed line endings read the same', () => {
    const lf = readTable('a,b\n1,x\n2,y\n3,z\n');
    const crlf = readTable('a,b\r\n1,x\r\n2,y\r\n3,z\r\n');
    const mixed = readTable('a,b\r\n1,x\n2,y\r\n3,z');
    expect(crlf).toEqual(lf);
    expect(mixed).toEqual(lf);
    expect(col(mixed, 'b')).toEqual(['x', 'y', 'z']);
  });

  test('a ragged row is refused naming its line, counting lines inside quoted fields', () => {
    expect(() => readTable('a,b\n1,2\n3\n4,5\n')).toThrow(/line 3 \(data row 2\) has 1 fields but the header on line 1 has 2/);
    expect(() => readTable('a,b\n1,"x\ny"\n3,4,5\n')).toThrow(/line 4 \(data row 2\) has 3 fields/);
    expect(() => readTable('a,b\r\n\r\n1,2\r\n3,4,5\r\n')).toThrow(/line 4 \(data row 2\)/);
  });

  test('missing markers: empty, NA, NaN, null, N/A by default; overridable', () => {
    const t = readTable('a,b\n1,NA\n,x\nNaN,null\nN/A,y\n5, \n');
    expect(col(t, 'a')).toEqual(['1', null, null, null, '5']);
    expect(col(t, 'b')).toEqual([null, 'x', null, 'y', null]);
    const own = readTable('a,b\n1,NA\n-99,x\n3,y\n', { missingMarkers: ['-99', ''] });
    expect(col(own, 'a')).toEqual(['1', null, '3']);
    expect(col(own, 'b')).toEqual(['NA', 'x', 'y']);
  });

  test('empty text, header only, duplicate and blank header names are refused', () => {
    expect(() => readTable('')).toThrow(/empty/);
    expect(() => readTable('a,b\n')).toThrow(/header but no rows/);
    expect(() => readTable('a,b,a\n1,2,3\n')).toThrow(/duplicate column name "a" \(columns 1 and 3\)/);
    expect(() => readTable('a,,c\n1,2,3\n')).toThrow(/column 2 has no name/);
    expect(() => readTable('a,b\n1,2\n', { delimiter: '|' as never })).toThrow(/delimiter "\|" is not supported/);
  });
});

describe('CSV text: odd corners', () => {
  test('an unclosed quote is refused naming the line where its row starts', () => {
    expect(() => readTable('a,b\n1,2\n3,"x\n4,5\n')).toThrow(/Quoted field unterminated \(row starting on line 3\)/);
  });

  test('a single-column file (no delimiter to detect) reads as one column', () => {
    const t = readTable('score\n1.5\n2\nNA\n4\n');
    expect(t.columns.map((c) => c.name)).toEqual(['score']);
    expect(col(t, 'score')).toEqual(['1.5', '2', null, '4']);
  });
});

describe('CSV file', () => {
  test('readCsvFile reads a file with BOM, CRLF and semicolons', () => {
    const dir = mkdtempSync(join(tmpdir(), 'kinsort-csv-'));
    const path = join(dir, 'riders.csv');
    writeFileSync(path, '\uFEFFrider;trips;fare\r\nr1;3;adult\r\nr2;NA;student\r\nr3;7;adult\r\n', 'utf8');
    const t = readCsvFile(path);
    expect(t.rowCount).toBe(3);
    expect(t.columns.map((c) => [c.name, c.inferred])).toEqual([
      ['rider', 'categorical'],
      ['trips', 'binary'],
      ['fare', 'binary'],
    ]);
    expect(col(t, 'trips')).toEqual(['3', null, '7']);
  });

  test('an unreadable path is a clear error naming it', () => {
    expect(() => readCsvFile('/nonexistent/kinsort.csv')).toThrow(/Cannot read CSV file "\/nonexistent\/kinsort.csv"/);
  });
});
