// Bounded, seeded fuzzing (a few seconds each) of the CSV intake and the definition loader: only
// KinsortError may ever be thrown. Well-formed generated CSV must also read back exactly.
// Data of our own making: generated here with fixed seeds.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { KinsortError, loadDefinition, prepareTable, readTable, study } from '../../src';
import { decodeCsvBytes } from '../../src/table/decode';
import { riders } from '../segments/definition-data';
import { onlyKinsortErrors } from './helpers';

// Milliseconds of fuzzing per property in CI; KINSORT_FUZZ_MS raises it for a longer local hunt.
const TIME_LIMIT_MS = Number(process.env.KINSORT_FUZZ_MS ?? 3000);
const budget = (seed: number) => ({ seed, numRuns: 1_000_000, interruptAfterTimeLimit: TIME_LIMIT_MS });

const DELIMITERS = [',', ';', '\t'] as const;
const ENDINGS = ['\n', '\r\n', '\r'];
const PIECES = [
  '"',
  '""',
  ',',
  ';',
  '\t',
  '\n',
  '\r\n',
  '\r',
  ' ',
  'a',
  'é',
  '名',
  '😀',
  '\u200b',
  '\uFEFF',
  '1',
  '-',
  '.',
  'e5',
  'NA',
  'x',
];

/** Text of any shape built from the pieces that matter to a CSV reader. */
const chaos = fc
  .tuple(fc.boolean(), fc.array(fc.oneof(fc.constantFrom(...PIECES), fc.string({ maxLength: 3, unit: 'binary' })), { maxLength: 60 }))
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
    payloads: fc.array(
      fc.array(fc.constantFrom(...PIECES.filter((p) => p !== '\uFEFF')), { maxLength: 8 }).map((p) => `x${p.join('')}x`),
      { minLength: 1, maxLength: 10 },
    ),
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

/** Cells that test the text rule: codes, exponents, signs, whitespace of every kind, markers in every case, unicode, comma numbers, true/false spellings. */
const ADVERSARIAL = [
  '007',
  '01',
  '1',
  '1.0',
  '1e3',
  '1000',
  '-0',
  '0',
  '+5',
  '.5',
  '1.',
  '1,5',
  '1,234',
  'Infinity',
  '-inf',
  '0x10',
  ' 5 ',
  '\t5',
  '5\u00a0',
  '\u3000',
  ' ',
  'NA',
  'na',
  ' NA ',
  'N/A',
  'n/a',
  '#N/A',
  'NaN',
  'nan',
  'NAN',
  'null',
  'NULL',
  'Null',
  'TRUE',
  'True',
  'false',
  'é',
  'e\u0301',
  '名',
  '😀',
  '\u200b',
  'a"b',
  'x,y',
  'line\nbreak',
  '12345678901234567890',
  '1e-17',
  '1e300',
];
const adversarialCell = fc.oneof(fc.constantFrom(...ADVERSARIAL), fc.double({ noNaN: true, noDefaultInfinity: true }).map(String));

/** RFC 4180 quoting: a field with a delimiter, quote or line break is quoted, quotes doubled. */
const quote = (v: string) => (/[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);

describe('CSV intake fuzz: the text rule families (ids, codes, whitespace, markers, encodings)', () => {
  it('cells read back exactly as written; ids are the written text; a row scores alone as in its batch', () => {
    let runs = 0;
    let fitted = 0;
    fc.assert(
      fc.property(
        fc.array(fc.tuple(adversarialCell, adversarialCell, fc.double({ noNaN: true, noDefaultInfinity: true, min: -100, max: 100 })), {
          minLength: 4,
          maxLength: 12,
        }),
        (rows) => {
          runs++;
          const ids = rows.map(([id], i) => `${id}#${i}`);
          const text = 'id,code,x\n' + rows.map(([, code, x], i) => [ids[i], code, String(x)].map(quote).join(',')).join('\n') + '\n';
          const t = readTable(text);
          expect(t.columns[0].values).toEqual(ids.map((id) => (id.trim() === '' ? null : id)));
          // Every written cell is back as written, or missing under the rule (empty, spaces, a marker).
          t.columns[1].values.forEach((v, i) => {
            if (v !== null) expect(v).toBe(rows[i][1]);
            else expect(['', ...['NA', 'N/A', 'n/a', '#N/A', 'NaN', 'nan', 'null', 'NULL']]).toContain(rows[i][1].replace(/^ +| +$/g, ''));
          });
          onlyKinsortErrors(() => {
            const p = prepareTable(text, { id: 'id', missing: 'median' });
            expect(p.ids).toEqual(ids);
            const seg = study(text, { id: 'id' }).prepare({ missing: 'median' });
            if (seg.data.matrix.rows < 3) return;
            const def = seg.kmeans({ k: 2, seed: 1, restarts: 1 }).definition();
            fitted++;
            const batch = def.assign(text);
            expect(batch.rows.map((r) => r.id)).toEqual(ids);
            const i = runs % rows.length;
            const alone = def.assign('id,code,x\n' + [ids[i], rows[i][1], String(rows[i][2])].map(quote).join(',') + '\n');
            expect(alone.rows[0]).toEqual(batch.rows[i]);
          });
        },
      ),
      budget(31),
    );
    expect(runs).toBeGreaterThan(20);
    expect(fitted).toBeGreaterThan(0);
  });

  it('everyday shapes: an unnamed first header, trailing empty lines, any bytes as a file', () => {
    let runs = 0;
    fc.assert(
      fc.property(
        fc.array(fc.array(adversarialCell, { minLength: 2, maxLength: 2 }), { minLength: 1, maxLength: 6 }),
        fc.integer({ min: 0, max: 3 }),
        fc.uint8Array({ maxLength: 40 }),
        (rows, trailing, bytes) => {
          runs++;
          const text =
            ',a,b\n' + rows.map((r, i) => [String(i + 1), ...r].map(quote).join(',')).join('\n') + '\n' + ',,\n'.repeat(trailing);
          onlyKinsortErrors(() => {
            const t = readTable(text);
            expect(t.columns[0].name).toBe('row_name');
            expect(t.columns[0].values).toEqual(rows.map((_, i) => String(i + 1)));
            expect(t.rowCount).toBe(rows.length);
          });
          // Any bytes: text, or a KinsortError naming the encoding problem; never U+FFFD put in silently.
          const decoded = onlyKinsortErrors(() => {
            const s = decodeCsvBytes(bytes, 'fuzz');
            expect(
              Buffer.from(s, 'utf8').equals(
                Buffer.from(bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? bytes.subarray(3) : bytes),
              ),
            ).toBe(true);
          });
          expect(typeof decoded).toBe('boolean');
        },
      ),
      budget(32),
    );
    expect(runs).toBeGreaterThan(20);
  });
});

describe('definition loader fuzz (loadDefinition on mutated valid JSON, bounded time, seeded)', () => {
  const records = riders(80, 12);
  const seg = study(records, {
    id: 'rider',
    use: ['trips', 'peak', 'tenure', 'fare', 'autopay', 'band'],
    keep: ['postcode'],
    ordinalLevels: { band: ['low', 'mid', 'high'] },
  })
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
    // Tampering families: control characters, names that clash in case, duplicated levels.
    fc.constantFrom(
      'a\nCREATE TABLE pwned AS SELECT 1; --',
      'x\u0000y',
      '\u001b[2J',
      'Trips',
      'TRIPS',
      'standard',
      'kinsort-text-0',
      'ascii-case',
      ',',
    ),
    fc.constantFrom(1e308, -1e308, 5e-324, -0, 0, -1, -5, 1.5, 2 ** 53, 0.5, 1e300),
    fc.constantFrom(['standard', 'standard'], ['yes', 'yes'], ['low', 'high'], { __proto__: null, polluted: true }),
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

  /** Insert a `__proto__` key (as JSON text writes it) into a random object of the file. */
  const protoInsert = fc.integer({ min: 0, max: 1000 }).map((n) => {
    const at = [...text.matchAll(/": \{\n/g)];
    const m = at[n % at.length];
    return text.slice(0, m.index! + 4) + '"__proto__": { "polluted": 1 },\n' + text.slice(m.index! + 4);
  });

  it('__proto__ keys inserted into any object: refused, and nothing polluted', () => {
    let runs = 0;
    fc.assert(
      fc.property(protoInsert, (damaged) => {
        runs++;
        expect(onlyKinsortErrors(() => loadDefinition(damaged))).toBe(true);
        expect(({} as Record<string, unknown>).polluted).toBeUndefined();
      }),
      { ...budget(33), numRuns: 200 },
    );
    expect(runs).toBeGreaterThan(20);
  });

  it('a definition that loads is consistent: sizes add up, reproduced rows within range, it scores', () => {
    let loaded = 0;
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 3 }), (mutations) => {
        const d = JSON.parse(text);
        for (const m of mutations) apply(d, m);
        onlyKinsortErrors(() => {
          const h = loadDefinition(JSON.stringify(d));
          loaded++;
          const def = h.definition;
          expect(def.segments.reduce((s, g) => s + g.size, 0)).toBe(def.training.rows);
          expect(def.training.reproducedRows).toBeLessThanOrEqual(def.training.rows);
          expect(JSON.stringify(def)).not.toMatch(/[\u0000-\u0008\u000b-\u001f]/);
          h.assign(sample);
        });
      }),
      budget(34),
    );
    expect(loaded).toBeGreaterThan(0);
  });

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
