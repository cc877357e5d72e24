// The text rule kinsort-text-1 (docs/stored-schema.md), cell by cell: the table the SQL side
// implements too. Each row is one decision of the rule; none is left to a parser's defaults.
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_MISSING_MARKERS,
  cellNumber,
  isMissingText,
  isTrueFalse,
  levelKey,
  looksLikeCode,
  looksLikeCommaNumber,
  sortLevels,
  trimSpaces,
} from '../../src/table/cells';

const markers = new Set(DEFAULT_MISSING_MARKERS);

describe('text rule kinsort-text-1', () => {
  it('numbers: the plain notation only, after trimming ASCII spaces', () => {
    const yes: [string, number][] = [
      ['0', 0],
      ['-0', -0],
      ['7', 7],
      ['-2.5', -2.5],
      ['1e3', 1000],
      ['1E-3', 0.001],
      ['1.0', 1],
      [' 5 ', 5],
      ['12345678901234567890', 12345678901234567890],
    ];
    for (const [t, v] of yes) expect(cellNumber(t), t).toBe(v);
    const no = [
      '',
      ' ',
      '+5',
      '007',
      '01',
      '.5',
      '1.',
      'Infinity',
      '-Infinity',
      'inf',
      'NaN',
      '0x10',
      '1,5',
      '1,234',
      '\t5',
      '5\t',
      '\u00a05',
      '1e',
      '1e+',
      '--1',
      '1 000',
      '1e999',
      '١٢',
    ];
    for (const t of no) expect(cellNumber(t), JSON.stringify(t)).toBeUndefined();
    expect(cellNumber('1,5', ',')).toBe(1.5);
    expect(cellNumber('1.5', ',')).toBeUndefined();
    expect(cellNumber('1.234,5', ',')).toBeUndefined();
    // JavaScript numbers are themselves (±Infinity too, so preparation can refuse them by name).
    expect(cellNumber(Infinity)).toBe(Infinity);
  });

  it('missing: empty, ASCII spaces only, or a marker after trimming ASCII spaces; nothing else', () => {
    for (const t of ['', '   ', 'NA', ' NA ', 'N/A', 'n/a', '#N/A', 'NaN', 'nan', 'null', 'NULL'])
      expect(isMissingText(t, markers), JSON.stringify(t)).toBe(true);
    for (const t of ['na', 'Null', 'None', '-', '\tNA', 'NA\u00a0', '\t', '\u00a0', 'NAN', '.'])
      expect(isMissingText(t, markers), JSON.stringify(t)).toBe(false);
  });

  it('trimming removes U+0020 only', () => {
    expect(trimSpaces('  a b  ')).toBe('a b');
    expect(trimSpaces('\ta\u00a0')).toBe('\ta\u00a0');
    expect(trimSpaces('\u3000x')).toBe('\u3000x');
  });

  it('levels and ids are the exact text; numbers as JavaScript prints them', () => {
    expect(levelKey(' a ')).toBe(' a ');
    expect(levelKey('007')).toBe('007');
    expect(levelKey(7)).toBe('7');
    expect(levelKey(0.1 + 0.2)).toBe('0.30000000000000004');
  });

  it('codes and comma numbers are recognised so inference can say so', () => {
    for (const t of ['007', '02134', '+5', '+1.5e3', '00.5']) expect(looksLikeCode(t), t).toBe(true);
    for (const t of ['0', '0.5', '7', '-07', 'A07']) expect(looksLikeCode(t), t).toBe(false);
    for (const t of ['1,5', '-3,25', '1,234', '12,345,678', '1,234.5']) expect(looksLikeCommaNumber(t), t).toBe(true);
    for (const t of ['1,2,3a', 'a,b', '1.5', ',5']) expect(looksLikeCommaNumber(t), t).toBe(false);
  });

  it('true/false in ASCII letters of any case, nothing else', () => {
    for (const t of ['true', 'TRUE', 'True', 'tRuE', 'false', 'FALSE']) expect(isTrueFalse(t)).toBe(true);
    for (const t of [' true', 'yes', '1', 'tru', 'ｔｒｕｅ', 'truE\n']) expect(isTrueFalse(t)).toBe(false);
  });

  it('levels sort numerically when all are numbers (ties by text), else by code unit', () => {
    expect(sortLevels(['10', '9', '1.0', '1'])).toEqual(['1', '1.0', '9', '10']);
    expect(sortLevels(['b', 'B', '01', '1', 'é'])).toEqual(['01', '1', 'B', 'b', 'é']);
  });
});
