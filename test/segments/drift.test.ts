// Drift of newly scored rows, checked against a case worked by hand (below, step by step), and the
// same figures from segments handed back by SQL (SQLite through better-sqlite3, the toSql() text).
import { describe, expect, it } from 'vitest';
import Database from 'better-sqlite3';
import { prepareTable } from '../../src/prepare';
import { buildDefinition, writeDefinitionJson } from '../../src/segments/definition-exports';
import { loadDefinition } from '../../src/study/definition-handle';
import { decileCuts, stabilityIndex } from '../../src/segments/training-distributions';
import { KinsortError } from '../../src/core/errors';

// Training: x = 1..10, no scaling, segments {1..5} (centre 3) and {6..10} (centre 8).
const training = Array.from({ length: 10 }, (_, i) => ({ id: `T${i + 1}`, x: i + 1 }));
function handDefinition() {
  const prepared = prepareTable(training, { id: 'id', use: ['x'], scale: 'none' });
  return buildDefinition({
    preparation: prepared.preparation,
    method: { name: 'kmeans', options: { k: 2 } },
    centers: [[3], [8]],
    training: { ids: prepared.ids, matrix: prepared.matrix, assignment: [0, 0, 0, 0, 0, 1, 1, 1, 1, 1] },
  });
}
// New rows: 1, 2, 3 (segment 1), 10 and 12 (segment 2; 12 is 4 from centre 8, beyond its far line).
const fresh = [1, 2, 3, 10, 12].map((x, i) => ({ id: `N${i + 1}`, x }));

describe('drift of new rows, worked by hand', () => {
  it('stores the training deciles in the definition and reads them back', () => {
    const def = handDefinition();
    // Deciles of 1..10 as observed values: sorted[floor(9q)] for q = .1 … .9, so 1, 2, …, 9.
    expect(def.trainingDistributions!.features[0].cuts).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(def.trainingDistributions!.features[0].shares).toEqual(new Array(10).fill(0.1));
    // farBeyond of segment 1: 99th percentile of distances 2,1,0,1,2 (sorted 0,1,1,2,2; position 3.96) = 2;
    // no training row is farther than 2 from its own centre and 2.5 from the other, so none is far.
    expect(def.trainingDistributions!.farShare).toBe(0);
    const back = loadDefinition(writeDefinitionJson(def)).definition;
    expect(back.trainingDistributions).toEqual(def.trainingDistributions);
  });

  it('gives segment shares, far rows and the stability index of the hand-worked case', () => {
    const drift = loadDefinition(handDefinition()).assign(fresh).drift();
    expect(drift.segments.map((s) => s.trainingShare)).toEqual([0.5, 0.5]);
    expect(drift.segments.map((s) => s.newShare)).toEqual([0.6, 0.4]);
    expect(drift.far).toEqual({ trainingShare: 0, newShare: 0.2, newRows: 1 });
    // Bins of the new rows: 1 → bin 1, 2 → bin 2, 3 → bin 3, 10 and 12 → bin 10; new shares .2 .2 .2 0 0 0 0 0 0 .4.
    expect(drift.features[0].newShares).toEqual([0.2, 0.2, 0.2, 0, 0, 0, 0, 0, 0, 0.4]);
    // PSI = 3 × (0.2 − 0.1) ln 2 + (0.4 − 0.1) ln 4 + 6 × (0.0001 − 0.1) ln(0.0001 / 0.1)
    //     = 0.207944 + 0.415888 + 4.140510 = 4.764343 (floor 0.0001 for empty bins).
    expect(drift.features[0].stabilityIndex).toBeCloseTo(4.764343, 5);
    expect(drift.features[0].reading).toBe('large change');
    expect(drift.scoredBy).toBe('memory');
    expect(drift.html()).toContain('New rows against the training rows');
  });

  it('counts the same figures from segments handed back by SQL (SQLite)', () => {
    const handle = loadDefinition(handDefinition());
    const db = new Database(':memory:');
    db.exec('CREATE TABLE fresh (id TEXT, x REAL)');
    const insert = db.prepare('INSERT INTO fresh VALUES (?, ?)');
    for (const r of fresh) insert.run(r.id, r.x);
    const scored = db.prepare(handle.toSql({ table: 'fresh', dialect: 'sqlite' })).all() as { id: string; segment: number; far: number }[];
    db.close();
    const fromSql = handle.drift(fresh, { scored });
    const inMemory = handle.assign(fresh).drift();
    expect(fromSql.scoredBy).toBe('scored');
    expect(fromSql.segments).toEqual(inMemory.segments);
    expect(fromSql.far).toEqual(inMemory.far);
    expect(fromSql.features).toEqual(inMemory.features);
  });

  it('takes the shares from the handed-back segments, and refuses rows it cannot match', () => {
    const handle = loadDefinition(handDefinition());
    const scored = fresh.map((r, i) => ({ id: r.id, segment: i < 2 ? 1 : 2, far: 0 }));
    const drift = handle.drift(fresh, { scored });
    expect(drift.segments.map((s) => s.newShare)).toEqual([0.4, 0.6]);
    expect(drift.far.newShare).toBe(0);
    expect(drift.notes.join(' ')).toContain('1 row(s) got a different segment');
    expect(() => handle.drift(fresh, { scored: scored.slice(1) })).toThrow(/new row 1 \(id "N1"\) is not among the scored rows/);
    expect(() => handle.drift(fresh, { scored: [...scored, { id: 'X', segment: 1 }] })).toThrow(KinsortError);
    expect(() => handle.drift(fresh, { scored: scored.map((r) => ({ ...r, segment: 3 })) })).toThrow(/expected 1\.\.2/);
  });
});

describe('unseen levels and filled values by column', () => {
  it('groups them by column with row counts', () => {
    const rows = Array.from({ length: 12 }, (_, i) => ({
      id: `T${i}`,
      x: i === 0 ? null : i % 6,
      fare: i % 2 ? 'adult' : 'student',
      zone: ['n', 's', 'e'][i % 3],
    }));
    const prepared = prepareTable(rows, { id: 'id', use: ['x', 'fare', 'zone'], missing: 'median' });
    const def = buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'kmeans', options: {} },
      centers: [
        prepared.matrix.data.slice(0, prepared.matrix.cols),
        prepared.matrix.data.slice(prepared.matrix.cols, 2 * prepared.matrix.cols),
      ].map((c) => Array.from(c)),
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: rows.map((_, i) => i % 2) },
    });
    const fresh = [
      { id: 'A', x: 1, fare: 'adult', zone: 'w' },
      { id: 'B', x: null, fare: 'adult', zone: 'w' },
      { id: 'C', x: null, fare: 'adult', zone: 'q' },
      { id: 'D', x: 2, fare: 'student', zone: 'n' },
    ];
    const drift = loadDefinition(def).assign(fresh).drift();
    const zone = drift.columns.find((c) => c.column === 'zone')!;
    expect(zone.unseenLevels).toEqual([
      { level: 'w', rows: 2 },
      { level: 'q', rows: 1 },
    ]);
    const x = drift.columns.find((c) => c.column === 'x')!;
    // Training x (row T0 missing): 1,2,3,4,5,0,1,2,3,4,5, sorted 0 1 1 2 2 3 3 4 4 5 5, median 3.
    expect(x.filled).toEqual({ value: 3, rows: 2 });
    expect(drift.scoredRows).toBe(4);
  });
});

describe('the stability index itself', () => {
  it('is zero for identical shares and symmetric in its two arguments', () => {
    expect(stabilityIndex([0.5, 0.5], [0.5, 0.5])).toBe(0);
    expect(stabilityIndex([0.3, 0.7], [0.6, 0.4])).toBeCloseTo(stabilityIndex([0.6, 0.4], [0.3, 0.7]), 12);
    // (0.6 − 0.3) ln 2 + (0.4 − 0.7) ln(4/7) = 0.207944 + 0.167884 = 0.375828
    expect(stabilityIndex([0.3, 0.7], [0.6, 0.4])).toBeCloseTo(0.375828, 5);
  });
  it('merges tied deciles: a 0/1 column gets one cut', () => {
    expect(decileCuts([0, 0, 0, 0, 0, 0, 1, 1, 1, 1])).toEqual([0]);
  });
});

describe('the drift view', () => {
  it('shows hostile levels, names and titles as text, never as markup', () => {
    const bad = `<img src=x onerror="window.__pwned=1">`;
    const rows = Array.from({ length: 10 }, (_, i) => ({ id: `T${i}`, x: i, zone: i % 2 ? 'n' : 's' }));
    const prepared = prepareTable(rows, { id: 'id', use: ['x', 'zone'] });
    const def = buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'kmeans', options: {} },
      centers: [
        Array.from(prepared.matrix.data.slice(0, prepared.matrix.cols)),
        Array.from(prepared.matrix.data.slice(prepared.matrix.cols * 9)),
      ],
      segments: [{ number: 1, title: bad }],
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: rows.map((_, i) => (i < 5 ? 0 : 1)) },
    });
    const html = loadDefinition(def)
      .assign([{ id: bad, x: 3, zone: bad }])
      .drift()
      .html();
    expect(html).not.toMatch(/<img/i);
    expect(html).not.toMatch(/<[^>]+\son[a-z]+\s*=/i);
    expect(html).toContain('&lt;img src=x');
  });
});
