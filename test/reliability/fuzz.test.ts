// Bounded, seeded fuzzing (a few seconds each) of the CSV intake and the definition loader: only
// KinsortError may ever be thrown. Well-formed generated CSV must also read back exactly.
// Data of our own making: generated here with fixed seeds.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { KinsortError, loadDefinition, readTable, study } from '../../src';
import { riders } from '../segments/definition-data';
import { onlyKinsortErrors } from './helpers';

// Milliseconds of fuzzing per property in CI; KINSORT_FUZZ_MS raises it for a longer local hunt.
const TIME_LIMIT_MS = Number(process.env.KINSORT_FUZZ_MS ?? 3000);
const budget = (seed: number) => ({ seed, numRuns: 1_000_000, interruptAfterTimeLimit: TIME_LIMIT_MS });

const DELIMITERS = [',', ';', '\t'] as const;
const ENDINGS = ['\n', '\r\n', '\r'];
const PIECES = ['"', '""', ',', ';', '\t', '\n', '\r\n', '\r', ' ', 'a', 'é', '名', '😀', '\u200b', '\uFEFF', '1', '-', '.', 'e5', 'NA', 'x'];

/** Text of any shape built from the pieces that matter to a CSV reader. */
const chaos = fc.tuple(fc.boolean(), fc.array(fc.oneof(fc.constantFrom(...PIECES), fc.string({ maxLength: 3, unit: 'binary' })), { maxLength: 60 }))
  .map(([bom, parts]) => (bom ? '\uFEFF' : '') + parts.join(''));

function quoteField(value: string, delimiter: string): string {
  return /["\r\n]/.test(value) || value.includes(delimiter) || value !== value.trim() ? `"${value.replace(/"/g, '""')}"` : value;
}

/** A well-formed CSV: header, an id column, a payload column full of awkward characters. */
const wellFormed = fc
  .record({
    delimiter: fc.constantFrom(...DELIMITERS),
    bom: fc.boolean(),
    endings: fc.array(fc.constantFrom(...ENDINGS), { minLength: 12, maxLength: 12 }),
    payloads: fc.array(fc.array(fc.constantFrom(...PIECES.filter((p) => p !== '\uFEFF')), { maxLength: 8 }).map((p) => `x${p.join('')}x`), { minLength: 1, maxLength: 10 }),
    numbers: fc.array(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }), { minLength: 10, maxLength: 10 }),
  })
  .map(({ delimiter, bom, endings, payloads, numbers }) => {
    const lines = [['id', 'payload', 'amount'].join(delimiter)];
    payloads.forEach((p, i) => lines.push([`row-${i}`, quoteField(p, delimiter), String(numbers[i])].join(delimiter)));
    const text = (bom ? '\uFEFF' : '') + lines.map((l, i) => l + endings[i]).join('');
    return { text, delimiter, payloads, numbers: numbers.slice(0, payloads.length) };
  });

describe('CSV intake fuzz (readTable on generated text, bounded time, seeded)', () => {
  it('arbitrary text: a Table or a KinsortError, nothing else; the guessed delimiter too', () => {
    let runs = 0;
    fc.assert(
      fc.property(chaos, fc.constantFrom<(typeof DELIMITERS)[number] | undefined>(undefined, ...DELIMITERS), (text, delimiter) => {
        runs++;
        onlyKinsortErrors(() => {
          const t = readTable(text, delimiter ? { delimiter } : {});
          // What reads must also go through the fluent entry without anything but KinsortError.
          onlyKinsortErrors(() => study(t).prepare({ missing: 'median' }));
        });
      }),
      budget(20261202),
    );
    expect(runs).toBeGreaterThan(100);
  });

  it('well-formed CSV with quotes, delimiters, BOM, mixed line endings and unicode reads back exactly', () => {
    let runs = 0;
    fc.assert(
      fc.property(wellFormed, ({ text, delimiter, payloads, numbers }) => {
        runs++;
        const t = readTable(text, { delimiter });
        expect(t.rowCount).toBe(payloads.length);
        expect(t.columns.map((c) => c.name)).toEqual(['id', 'payload', 'amount']);
        expect(t.columns[0].values).toEqual(payloads.map((_, i) => `row-${i}`));
        // Line endings inside a quoted field are read as \n (the reader normalises them).
        expect(t.columns[1].values).toEqual(payloads.map((p) => p.replace(/\r\n?/g, '\n')));
        expect(t.columns[2].values).toEqual(numbers.map((v) => String(v))); // cells keep their text
      }),
      { ...budget(7), numRuns: 100_000 },
    );
    expect(runs).toBeGreaterThan(50);
  });
});

describe('definition loader fuzz (loadDefinition on mutated valid JSON, bounded time, seeded)', () => {
  const records = riders(80, 12);
  const seg = study(records, { id: 'rider', use: ['trips', 'peak', 'tenure', 'fare', 'autopay', 'band'], keep: ['postcode'], ordinalLevels: { band: ['low', 'mid', 'high'] } })
    .prepare({ missing: 'median' })
    .kmeans({ k: 3, seed: 1, restarts: 2 });
  const text = seg.definition().toJSON();
  const base = JSON.parse(text);
  const paths: (string | number)[][] = [];
  const walk = (v: unknown, path: (string | number)[]) => {
    if (path.length > 0) paths.push(path);
    if (v && typeof v === 'object') for (const [k, c] of Object.entries(v)) walk(c, [...path, Array.isArray(v) ? Number(k) : k]);
  };
  walk(base, []);
  const sample = riders(6, 13, 'n');
  const strange = fc.oneof(
    fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '', ' ', '__proto__', 'constructor', '-0', '0x10'),
    fc.constantFrom(1e308, -1e308, 5e-324, -0, 0, -1, 2 ** 53, 0.5, 1e300),
    fc.constantFrom(null, true, false, [], {}, [null], [[]], { kind: 'x' }),
    fc.constant(undefined), // delete the key
  );
  const mutation = fc.tuple(fc.integer({ min: 0, max: paths.length - 1 }), strange);

  function apply(d: unknown, [p, value]: [number, unknown]): void {
    const path = paths[p];
    let parent = d as Record<string | number, unknown>;
    for (const key of path.slice(0, -1)) {
      if (parent === null || typeof parent !== 'object') return;
      parent = parent[key] as Record<string | number, unknown>;
    }
    if (parent === null || typeof parent !== 'object') return;
    const last = path[path.length - 1];
    // A fresh copy each time: constantFrom hands out the same object, and writing a shared object
    // into itself would make a cycle no JSON text can hold.
    if (value === undefined) delete parent[last];
    else parent[last] = structuredClone(value);
  }

  function tryAll(source: string): void {
    onlyKinsortErrors(() => {
      const handle = loadDefinition(source);
      onlyKinsortErrors(() => handle.assign(sample));
      onlyKinsortErrors(() => handle.toSql({ table: 't' }));
      onlyKinsortErrors(() => handle.toJSON());
    });
  }

  it('one to four deleted keys, wrong types, NaN strings and extreme numbers: only KinsortError', () => {
    let runs = 0;
    let refused = 0;
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 4 }), (mutations) => {
        runs++;
        const d = JSON.parse(text);
        for (const m of mutations) apply(d, m);
        try {
          loadDefinition(JSON.stringify(d));
        } catch (e) {
          if (!(e instanceof KinsortError)) throw e;
          refused++;
        }
        tryAll(JSON.stringify(d));
      }),
      budget(99),
    );
    expect(runs).toBeGreaterThan(50);
    expect(refused).toBeGreaterThan(0);
  });

  it('text-level damage (truncated, characters deleted or inserted, numbers turned to NaN): only KinsortError', () => {
    let runs = 0;
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: text.length }),
        fc.integer({ min: 0, max: text.length - 1 }),
        fc.constantFrom('', '{', '}', '[', ']', '"', ',', ':', 'NaN', '\\', '\u0000', '😀'),
        fc.boolean(),
        (cut, at, insert, nanNumbers) => {
          runs++;
          const damaged = nanNumbers ? text.replace(/-?\d+\.\d+(e[+-]?\d+)?/g, (m) => (m.length % 3 === 0 ? 'NaN' : m)) : text;
          tryAll(damaged.slice(0, cut));
          tryAll(damaged.slice(0, at) + insert + damaged.slice(at + 1));
        },
      ),
      budget(5),
    );
    expect(runs).toBeGreaterThan(50);
  });
});
