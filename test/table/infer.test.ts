// Type inference from values, and the person's overrides.
import { describe, expect, test } from 'vitest';
import { readTable } from '../../src/table';

const typeOf = (input: unknown, name: string, options?: Parameters<typeof readTable>[1]) =>
  readTable(input, options).columns.find((c) => c.name === name)!;

describe('type inference', () => {
  test('numbers from CSV text, including exponents and signs, are numeric; text is kept as given', () => {
    const c = typeOf('v\n1e3\n-2.5\n0.5\n7\n', 'v');
    expect(c.inferred).toBe('numeric');
    expect(c.values).toEqual(['1e3', '-2.5', '0.5', '7']);
    // Text rule kinsort-text-1: "+" and ".5" are not numbers, and a code with "+" makes the column categorical.
    expect(typeOf('v\n1e3\n-2.5\n+.5\n7\n', 'v').inferred).toBe('categorical');
  });

  test('exactly two distinct values is binary: 0/1, true/false, yes/no, any two levels', () => {
    expect(typeOf({ v: [0, 1, 1, 0] }, 'v').inferred).toBe('binary');
    expect(typeOf({ v: [true, false, true] }, 'v').inferred).toBe('binary');
    expect(typeOf({ v: ['yes', 'no', null, 'yes'] }, 'v').inferred).toBe('binary');
    expect(typeOf({ v: ['bus', 'rail', 'rail'] }, 'v').inferred).toBe('binary');
  });

  test('three or more text levels is categorical; mostly-distinct text is free text', () => {
    expect(typeOf({ v: ['a', 'b', 'c', 'a'] }, 'v').inferred).toBe('categorical');
    const names = Array.from({ length: 30 }, (_, i) => `person ${i}`);
    expect(typeOf({ v: names }, 'v').inferred).toBe('text');
  });

  test('a mostly numeric column with a stray text cell stays numeric (refused later by name)', () => {
    const c = typeOf('v\n1\n2\n12abc\n4\n5\n', 'v');
    expect(c.inferred).toBe('numeric');
    expect(c.values).toEqual(['1', '2', '12abc', '4', '5']);
  });

  test('a mostly text column with a few numbers is categorical, values untouched', () => {
    const c = typeOf('v\na\nb\nc\n4\n', 'v');
    expect(c.inferred).toBe('categorical');
    expect(c.values).toEqual(['a', 'b', 'c', '4']);
  });

  test('overrides: types and ordinalLevels, checked against the column names', () => {
    const input = { size: ['S', 'L', 'M', 'S'], n: [1, 2, 3, 4], code: ['1', '2', '3', '4'] };
    const t = readTable(input, { types: { n: 'categorical', code: 'numeric' }, ordinalLevels: { size: ['S', 'M', 'L'] } });
    const size = t.columns.find((c) => c.name === 'size')!;
    expect(size.declared).toBe('ordinal');
    expect(size.ordinalLevels).toEqual(['S', 'M', 'L']);
    expect(t.columns.find((c) => c.name === 'n')!.declared).toBe('categorical');
    expect(t.columns.find((c) => c.name === 'code')!.values).toEqual(['1', '2', '3', '4']);
    expect(() => readTable(input, { types: { sise: 'numeric' } })).toThrow(/no column named "sise". Did you mean "size"\?/);
    expect(() => readTable(input, { types: { n: 'numerical' as never } })).toThrow(/Did you mean "numeric"\?/);
    expect(() => readTable(input, { types: { size: 'ordinal' } })).toThrow(/give its level order/);
    expect(() => readTable(input, { ordinalLevels: { size: ['S', 'S'] } })).toThrow(/lists "S" twice/);
  });
});
