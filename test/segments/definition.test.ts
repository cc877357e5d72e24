// Segment definitions: built from a fit, written deterministically, read back with validation,
// applied to new rows. Data of our own making (definition-data.ts, fixed seeds).
import { mkdtempSync, readFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { prepareTable } from '../../src/prepare';
import { kmeans, kmedoids } from '../../src/methods/partition';
import { KinsortError } from '../../src/core/errors';
import { agglomerate } from '../../src/methods/hierarchy';
import { buildDefinition, writeDefinitionJson, DEFINITION_FORMAT_VERSION } from '../../src/segments/definition-exports';
import { loadDefinition } from '../../src/study/definition-handle';
import { readDefinition } from '../../src/segments/definition-validate';
import { toNested } from '../../src/core/matrix';
import { riders } from './definition-data';

const USE = ['trips', 'peak', 'tenure', 'fare', 'autopay', 'band'];
const PREPARE = {
  id: 'rider',
  use: USE,
  keep: ['postcode'],
  log: ['trips'],
  weights: { fare: 0.5 },
  ordinalLevels: { band: ['low', 'mid', 'high'] },
};

function fitKmeans(records = riders(160, 11), note?: string) {
  const prepared = prepareTable(records, PREPARE);
  const fit = kmeans(prepared.matrix, { k: 4, seed: 3, restarts: 5 });
  const definition = buildDefinition({
    preparation: prepared.preparation,
    method: { name: 'kmeans', options: { k: 4, seed: 3, restarts: 5 } },
    centers: fit.centers,
    segments: [{ number: 2, title: 'Peak commuters', text: 'Many trips, mostly at peak.', size: fit.sizes[1] }],
    training: { ids: prepared.ids, matrix: prepared.matrix, assignment: fit.assignment },
    note,
  });
  return { prepared, fit, definition };
}

describe('a definition built from k-means', () => {
  it('assigns every training row to the segment k-means gave it (fit is at a fixed point: nearest centre)', () => {
    const { fit, definition } = fitKmeans();
    const outcome = loadDefinition(definition).assign(riders(160, 11));
    expect(outcome.rows.map((r) => r.segment)).toEqual(Array.from(fit.assignment, (s) => s + 1));
    expect(outcome.report.refused).toEqual([]);
    expect(outcome.report.ignoredColumns).toEqual([]);
  });

  it('stores sizes, titles, the far threshold and a version', () => {
    const { fit, definition } = fitKmeans();
    expect(definition.segments.map((s) => s.size)).toEqual(fit.sizes);
    expect(definition.segments[1].title).toBe('Peak commuters');
    expect(definition.writtenBy).toBe(`kinsort ${require('../../package.json').version}`);
    expect(definition.formatVersion).toBe(DEFINITION_FORMAT_VERSION);
    // About 1 % of training rows lie beyond their own segment's 99th percentile.
    const outcome = loadDefinition(definition).assign(riders(160, 11));
    const beyondOwn = outcome.rows.filter((r, i) => r.distance! > definition.segments[fit.assignment[i]].farBeyond).length;
    expect(beyondOwn).toBeGreaterThan(0);
    expect(beyondOwn).toBeLessThanOrEqual(8);
  });

  it('writes the same bytes for the same inputs, and written → read → written is byte-identical', () => {
    const a = writeDefinitionJson(fitKmeans(undefined, 'made 2026-12-02').definition);
    const b = writeDefinitionJson(fitKmeans(undefined, 'made 2026-12-02').definition);
    expect(a).toBe(b);
    const again = loadDefinition(a).toJSON();
    expect(again).toBe(a);
    const dir = mkdtempSync(join(tmpdir(), 'kinsort-def-'));
    const path = join(dir, 'riders.json');
    loadDefinition(again).save(path);
    expect(readFileSync(path, 'utf8')).toBe(a);
    expect(loadDefinition(path).toJSON()).toBe(a);
  });

  it('fingerprints the training data regardless of row order', () => {
    const { prepared, definition } = fitKmeans();
    const handle = loadDefinition(definition);
    const rows = toNested(prepared.matrix);
    const order = rows.map((_, i) => i).reverse();
    expect(
      handle.matchesTraining(
        order.map((i) => prepared.ids[i]),
        order.map((i) => rows[i]),
      ),
    ).toBe(true);
    const nudged = rows.map((r) => r.slice());
    nudged[5][0] += 1e-12;
    expect(handle.matchesTraining(prepared.ids, nudged)).toBe(false);
    expect(handle.matchesTraining(prepared.ids.slice(1), rows.slice(1))).toBe(false);
  });
});

describe('assigning new rows', () => {
  const { definition } = fitKmeans();
  const handle = loadDefinition(definition);

  it('names a column the definition uses that the rows lack', () => {
    const rows = riders(5, 99).map(({ peak, ...rest }) => ({ ...rest, peek: peak }));
    expect(() => handle.assign(rows)).toThrow(/lack column "peak".*Did you mean "peek"\?/);
  });

  it('ignores extra columns and says so once', () => {
    const rows = riders(20, 99).map((r) => ({ ...r, colour: 'red', size: 3 }));
    const outcome = handle.assign(rows);
    expect(outcome.report.ignoredColumns).toEqual(['colour', 'size']);
    expect(outcome.report.notes.filter((n) => n.includes('colour'))).toHaveLength(1);
  });

  it('reports a category level never seen in training and gives the row a segment', () => {
    const rows = riders(10, 99);
    rows[3].fare = 'night-owl';
    const outcome = handle.assign(rows);
    expect(outcome.report.unseenLevels).toEqual([{ id: rows[3].rider, row: 3, column: 'fare', level: 'night-owl' }]);
    expect(outcome.rows[3].segment).not.toBeNull();
    // The note names the row, the column and the level, so a command-line user sees them too.
    expect(outcome.report.notes.join(' ')).toContain(`${rows[3].rider}: fare = "night-owl"`);
  });

  it('keeps every row: a missing value under refuse, an unknown binary level and text in a number are named by id', () => {
    const rows = riders(12, 99);
    rows[2].trips = null;
    rows[5].autopay = 'maybe';
    (rows[8] as { tenure: unknown }).tenure = 'ten';
    const outcome = handle.assign(rows);
    expect(outcome.rows).toHaveLength(12);
    expect(outcome.rows.map((r) => r.id)).toEqual(rows.map((r) => r.rider));
    expect(outcome.report.refused.map((r) => r.id)).toEqual([rows[2].rider, rows[5].rider, rows[8].rider]);
    expect(outcome.report.refused[0].reason).toMatch(/missing value in trips/);
    expect(outcome.report.refused[1].reason).toMatch(/"maybe"/);
    expect(outcome.report.refused[2].reason).toMatch(/"ten".*not a number/);
    for (const i of [2, 5, 8]) expect(outcome.rows[i]).toMatchObject({ segment: null, distance: null, far: null });
    expect(outcome.report.assignedRows + outcome.report.refused.length).toBe(outcome.report.inputRows);
  });

  it('refuses an unknown option with a did-you-mean', () => {
    expect(() => handle.assign(riders(3, 1), { raed: {} } as never)).toThrow(/unknown option "raed".*Did you mean "read"/);
  });

  it('flags a row far from every segment', () => {
    const rows = riders(3, 5);
    rows[0].trips = 500;
    rows[0].tenure = 90;
    const outcome = handle.assign(rows);
    expect(outcome.rows[0].far).toBe(true);
    expect(outcome.rows.slice(1).every((r) => r.far === false)).toBe(true);
  });
});

describe('a hierarchy cut', () => {
  it('assigns by the nearest segment mean in the prepared space, which reproduces a Ward cut on well-separated data', () => {
    const records = riders(120, 21);
    const prepared = prepareTable(records, { id: 'rider', use: ['trips', 'peak', 'tenure'] });
    const tree = agglomerate(prepared.matrix, { method: 'ward' });
    const cut = tree.cut({ k: 4 });
    const d = prepared.matrix.cols;
    const sums = Array.from({ length: 4 }, () => new Array(d).fill(0));
    const counts = new Array(4).fill(0);
    for (let i = 0; i < prepared.matrix.rows; i++) {
      counts[cut[i]]++;
      for (let j = 0; j < d; j++) sums[cut[i]][j] += prepared.matrix.data[i * d + j];
    }
    const centers = sums.map((s, c) => s.map((v) => v / counts[c]));
    const definition = buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'hierarchy', options: { k: 4, linkage: 'ward' } },
      centers,
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: cut },
    });
    expect(definition.rule).toBe('nearest-center');
    const outcome = loadDefinition(definition).assign(records);
    const agree = outcome.rows.filter((r, i) => r.segment === cut[i] + 1).length;
    // A Ward cut is not a nearest-mean partition in general; on these loose groups nearly all agree.
    expect(agree / records.length).toBeGreaterThan(0.95);
  });
});

describe('a definition with medoids', () => {
  it('stores the medoid ids and vectors and assigns by the nearest medoid', () => {
    const records = riders(60, 8);
    const prepared = prepareTable(records, { id: 'rider', use: ['trips', 'peak', 'tenure'] });
    const fit = kmeans(prepared.matrix, { k: 3, seed: 1 });
    // Medoid of each segment by brute force: the member with the least summed distance to the others.
    const rows = toNested(prepared.matrix);
    const dist = (a: number[], b: number[]) => Math.hypot(...a.map((v, j) => v - b[j]));
    const medoids = [0, 1, 2].map((c) => {
      const members = rows.map((_, i) => i).filter((i) => fit.assignment[i] === c);
      let best = members[0];
      let bestCost = Infinity;
      for (const m of members) {
        const cost = members.reduce((s, o) => s + dist(rows[m], rows[o]), 0);
        if (cost < bestCost) [best, bestCost] = [m, cost];
      }
      return best;
    });
    const definition = buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'kmedoids', options: { k: 3 } },
      medoids,
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: fit.assignment },
    });
    expect(definition.rule).toBe('nearest-medoid');
    expect(definition.segments.map((s) => s.medoidId)).toEqual(medoids.map((m) => prepared.ids[m]));
    const outcome = loadDefinition(definition).assign(records);
    outcome.rows.forEach((r, i) => {
      const ds = medoids.map((m) => dist(rows[i], rows[m]));
      expect(r.segment).toBe(ds.indexOf(Math.min(...ds)) + 1);
      expect(r.distance).toBeCloseTo(Math.min(...ds), 12);
    });
    for (const [c, m] of medoids.entries()) expect(outcome.rows[m]).toMatchObject({ segment: c + 1, distance: 0 });
  });
});

describe('a definition from k-medoids (PAM)', () => {
  it('takes the metric from the method options and reproduces the PAM assignment on the training rows', () => {
    const records = riders(90, 17);
    const prepared = prepareTable(records, { id: 'rider', use: ['trips', 'peak', 'tenure'] });
    const fit = kmedoids(prepared.matrix, { k: 4, metric: 'manhattan' });
    const definition = buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'kmedoids', options: { k: 4, metric: 'manhattan' } },
      medoids: fit.medoids,
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: fit.assignment },
    });
    expect(definition.metric).toBe('manhattan');
    const outcome = loadDefinition(definition).assign(records);
    expect(outcome.rows.map((r) => r.segment)).toEqual(Array.from(fit.assignment, (s) => s + 1));
    const total = outcome.rows.reduce((sum, r) => sum + r.distance!, 0);
    expect(total).toBeCloseTo(fit.cost, 9);
  });

  it('refuses a metric it cannot assign with, saying which ones it can', () => {
    const prepared = prepareTable(riders(30, 3), { id: 'rider', use: ['trips', 'peak'] });
    const fit = kmeans(prepared.matrix, { k: 2, seed: 1 });
    expect(() =>
      buildDefinition({
        preparation: prepared.preparation,
        method: { name: 'kmedoids', options: { metric: 'gower' } },
        medoids: [0, 1],
        training: { ids: prepared.ids, matrix: prepared.matrix, assignment: fit.assignment },
      }),
    ).toThrow(/"gower" metric.*euclidean, sqeuclidean, manhattan only/);
  });
});

describe('loading a damaged or newer definition', () => {
  const text = writeDefinitionJson(fitKmeans().definition);
  const edit = (change: (d: any) => void) => {
    const d = JSON.parse(text);
    change(d);
    return JSON.stringify(d);
  };

  it('says where the text is not JSON', () => {
    expect(() => loadDefinition(text.slice(0, 200))).toThrow(/not JSON/);
  });
  it('refuses a file of a newer format, naming the writer and asking to upgrade', () => {
    const newer = edit((d) => {
      d.formatVersion = DEFINITION_FORMAT_VERSION + 1;
      d.writtenBy = 'kinsort 9.0.0';
    });
    expect(() => loadDefinition(newer)).toThrow(
      new RegExp(
        `written by kinsort 9\\.0\\.0, format ${DEFINITION_FORMAT_VERSION + 1}; this kinsort .* reads formats up to ${DEFINITION_FORMAT_VERSION} — upgrade`,
      ),
    );
  });
  it('names a missing key and its expected type', () => {
    expect(() => loadDefinition(edit((d) => delete d.training))).toThrow(/key "training" is missing \(expected an object\)/);
  });
  it('names a key of the wrong type', () => {
    expect(() => loadDefinition(edit((d) => (d.segments[1].size = '40')))).toThrow(
      /segments\[1\]: key "size" holds string "40"; expected a finite number/,
    );
  });
  it('finds damaged numbers: a centre too short or holding null (NaN written as JSON)', () => {
    expect(() => loadDefinition(edit((d) => d.segments[0].center.pop()))).toThrow(/segments\[0\]\.center: has \d+ numbers; expected \d+/);
    expect(() => loadDefinition(edit((d) => (d.segments[2].center[1] = null)))).toThrow(/segments\[2\]\.center: value 2 is null/);
    const built = fitKmeans().definition;
    (built.segments[0].center as number[])[0] = NaN;
    expect(() => loadDefinition(built)).toThrow(/segments.*center.*NaN/);
  });
  it('refuses an unknown key with a did-you-mean and a file that is not a definition', () => {
    expect(() => loadDefinition(edit((d) => (d.segments[0].titel = 'x')))).toThrow(/unknown key "titel"\. Did you mean "title"\?/);
    expect(() => loadDefinition('{"hello": 1}')).toThrow(/not a kinsort segment definition/);
    expect(() => loadDefinition('/no/such/file.json')).toThrow(/cannot read "\/no\/such\/file\.json"/);
  });
});

describe('the loader under generated damage (fuzz, bounded)', () => {
  it('either loads or throws a KinsortError naming the problem; never anything else', () => {
    const text = writeDefinitionJson(fitKmeans().definition);
    const base = JSON.parse(text);
    const paths: (string | number)[][] = [];
    const walk = (v: unknown, path: (string | number)[]) => {
      paths.push(path);
      if (v && typeof v === 'object') for (const [k, c] of Object.entries(v)) walk(c, [...path, Array.isArray(v) ? Number(k) : k]);
    };
    walk(base, []);
    const sample = riders(8, 2);
    const junk = fc.oneof(
      fc.constant(undefined),
      fc.constant(null),
      fc.double(),
      fc.string(),
      fc.integer(),
      fc.constant([]),
      fc.constant({}),
      fc.boolean(),
    );
    fc.assert(
      fc.property(fc.integer({ min: 1, max: paths.length - 1 }), junk, fc.integer({ min: 0, max: text.length }), (p, value, cut) => {
        const d = JSON.parse(text);
        const path = paths[p];
        let parent = d;
        for (const key of path.slice(0, -1)) parent = parent[key];
        const last = path[path.length - 1];
        if (value === undefined) delete parent[last];
        else parent[last] = value;
        for (const source of [JSON.stringify(d), text.slice(0, cut)]) {
          try {
            const handle = loadDefinition(source);
            // What loads must also assign and write SQL (or refuse clearly).
            handle.assign(sample);
            handle.toSql({ table: 't' });
          } catch (e) {
            expect(e).toBeInstanceOf(KinsortError);
            if ((e as KinsortError).code !== 'bad-definition') expect((e as Error).message).toMatch(/definition|row|column|level/);
          }
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('the writer', () => {
  it('stores evidence with NaN as null', () => {
    const { prepared, fit } = fitKmeans();
    const d = buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'kmeans' },
      centers: fit.centers,
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: fit.assignment },
      evidence: { withinSS: fit.withinSS, gap: [NaN, 0.5], stability: new Float64Array([0.9, Infinity]) },
    });
    expect(d.evidence).toEqual({ gap: [null, 0.5], stability: [0.9, null], withinSS: fit.withinSS });
    expect(loadDefinition(d).toJSON()).toBe(writeDefinitionJson(d));
  });

  it('writes any finite numbers so that read → write is byte-identical (property)', () => {
    const base = fitKmeans().definition;
    const dims = base.features.length;
    const vec = fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { minLength: dims, maxLength: dims });
    fc.assert(
      // Notes and titles are prose: line breaks and tabs allowed, other control characters refused (tested elsewhere).
      fc.property(
        fc.array(vec, { minLength: 1, maxLength: 5 }),
        fc.string().map((t) => t.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g, '')),
        (centers, note) => {
          const d = {
            ...base,
            note,
            training: { ...base.training, rows: centers.length, reproducedRows: 0 },
            segments: centers.map((center, c) => ({ number: c + 1, title: note, size: 1, center, farBeyond: Math.abs(center[0]) })),
          };
          const once = writeDefinitionJson(readDefinition(writeDefinitionJson(d)));
          expect(writeDefinitionJson(readDefinition(once))).toBe(once);
          const read = readDefinition(once);
          read.segments.forEach((s, c) => expect(s.center).toEqual(centers[c].map((v) => (Object.is(v, -0) ? 0 : v))));
        },
      ),
      { numRuns: 60 },
    );
  });
});
