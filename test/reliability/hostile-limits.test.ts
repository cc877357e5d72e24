// Hostile input and resource limits in the library (issue 14): each case here failed before the
// fix — a hang, a raw ENOENT / EISDIR / RangeError, empty segments, or minutes of work with no
// word. Data of our own making (invented riders, seeded; small hand-written tables).
import { execFileSync } from 'child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { afterAll, describe, expect, it } from 'vitest';
import { agglomerate, dissimilarity, kmedoids, loadDefinition, readCsvFile, study } from '../../src';
import { setPreparedLimits } from '../../src/internal';
import { closestName, didYouMean, editDistance } from '../../src/core/errors';
import { forTerminal } from '../../src/core/terminal-text';
import { readRegularTextFile } from '../../src/table/file-text';
import { agglomerationWork } from '../../src/methods/hierarchy';
import { riders } from '../segments/definition-data';
import { refusal } from './helpers';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-hostile-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const seg = study(riders(60, 3), { id: 'rider', use: ['trips', 'peak', 'tenure'] })
  .prepare({})
  .kmeans({ k: 3, seed: 1, restarts: 2 });

describe('one rule for every save(): folders made, failures a KinsortError naming the path, no hang', () => {
  it('a view, a write-up (HTML and Markdown) and a definition all create missing folders', () => {
    const targets = {
      view: join(dir, 'a/b/view.html'),
      html: join(dir, 'c/d/write-up.html'),
      md: join(dir, 'e/f/write-up.md'),
      def: join(dir, 'g/h/def.json'),
    };
    seg.cards().save(targets.view);
    seg.writeUp().save(targets.html);
    seg.writeUp().save(targets.md);
    seg.definition().save(targets.def);
    for (const file of Object.values(targets)) expect(existsSync(file), file).toBe(true);
    expect(readFileSync(targets.md, 'utf8')).not.toMatch(/^<!doctype/);
    expect(loadDefinition(targets.def).definition.segments).toHaveLength(3);
  });

  it("/proc/nope/y.html: a refusal naming the path, not a hang (node's recursive mkdir loops there)", () => {
    for (const save of [
      (p: string) => seg.cards().save(p),
      (p: string) => seg.silhouette().save(p),
      (p: string) => seg.writeUp().save(p),
      (p: string) => seg.definition().save(p),
    ]) {
      refusal(() => save('/proc/nope/y.html'), '"/proc/nope/y.html"');
    }
  });

  it('a folder as the target, and a file in the way of a folder: KinsortError naming the path, never EISDIR/ENOTDIR raw', () => {
    mkdirSync(join(dir, 'folder'), { recursive: true });
    writeFileSync(join(dir, 'plain'), 'x');
    refusal(() => seg.cards().save(join(dir, 'folder')), join(dir, 'folder'), 'folder');
    refusal(() => seg.writeUp().save(join(dir, 'folder')), join(dir, 'folder'));
    refusal(() => seg.definition().save(join(dir, 'folder')), join(dir, 'folder'));
    refusal(() => seg.writeUp().save(join(dir, 'plain/inside.md')), join(dir, 'plain/inside.md'));
    refusal(() => seg.cards().save(''), 'give a file path');
  });
});

describe('reading files: regular files only, bounded', () => {
  it('/dev/zero and a folder are refused at once', () => {
    refusal(() => readCsvFile('/dev/zero'), '/dev/zero', 'character device');
    refusal(() => readCsvFile(dir), 'folder');
    refusal(() => loadDefinition('/dev/zero'), '/dev/zero', 'character device');
  });

  it('a FIFO with no writer is refused, not waited on', () => {
    const fifo = join(dir, 'pipe.csv');
    execFileSync('mkfifo', [fifo]);
    refusal(() => readCsvFile(fifo), 'named pipe');
    refusal(() => loadDefinition(fifo), 'named pipe');
  });

  it('a file larger than the bound is refused, naming the bound; a file under it reads', () => {
    const file = join(dir, 'big.csv');
    writeFileSync(file, 'id,x\n' + 'a,1\n'.repeat(1000));
    refusal(() => readRegularTextFile(file, 'Cannot read CSV file', 1000), 'is larger than 1,000 bytes');
    expect(readRegularTextFile(file, 'Cannot read CSV file', 10_000).length).toBe(4005);
    refusal(() => readCsvFile(join(dir, 'absent.csv')), 'absent.csv', 'no such file');
  });
});

describe('"did you mean" is bounded', () => {
  it('a 1 MB name gets no suggestion and returns at once; short typos still get one', () => {
    const huge = 'x'.repeat(1_000_000);
    // Before the bound this took more than ten minutes (the test's own timeout catches a relapse).
    expect(closestName(huge, ['trips', huge.slice(1)])).toBeUndefined();
    expect(didYouMean('trps', ['trips', 'peak'])).toBe(' Did you mean "trips"?');
    expect(editDistance('kitten', 'sitting')).toBe(3); // the classic worked example (from memory)
    // 15 s before the bound.
    refusal(() => study(riders(20, 3), { id: 'rider', use: ['t'.repeat(60_000)] }).prepare({}));
  });
});

describe('one-hot width is guarded before allocating', () => {
  it('a column with more levels than allowed is refused, naming it and its level count', () => {
    const records = Array.from({ length: 3000 }, (_, i) => ({ id: `p${i}`, trips: i % 17, postcode: `Z${i % 1500}` }));
    refusal(() => study(records, { id: 'id', use: ['trips', 'postcode'] }).prepare({}), '"postcode"', '1,500 levels', 'keep');
  });

  it('a matrix above the byte budget is refused naming the widest one-hot column; below it, it prepares', () => {
    const records = Array.from({ length: 400 }, (_, i) => ({ id: `p${i}`, trips: i % 17, fare: `f${i % 50}` }));
    const previous = setPreparedLimits({ bytes: 400 * 20 * 8 });
    try {
      refusal(() => study(records, { id: 'id', use: ['trips', 'fare'] }).prepare({}), '400 rows × 51 features', '"fare" with 50 levels');
    } finally {
      setPreparedLimits(previous);
    }
    expect(study(records, { id: 'id', use: ['trips', 'fare'] }).prepare({}).featureNames).toHaveLength(51);
  });
});

describe('k above the distinct rows', () => {
  const twoDistinct = Array.from({ length: 8 }, (_, i) => ({ id: `d${i}`, a: i % 2, b: (i % 2) * 3 }));

  it('k-medoids (fluent: on a dissimilarity) refuses k = 5 on 2 distinct rows, as k-means does', () => {
    const prepared = study(twoDistinct, { id: 'id', use: ['a', 'b'] }).prepare({});
    refusal(() => prepared.kmedoids({ k: 5 }), 'only 2 distinct', 'at most 2');
    refusal(() => prepared.kmeans({ k: 5 }), 'at most 2');
    refusal(() => kmedoids(dissimilarity([[0], [0], [1], [1], [1]], {}), { k: 3 }), 'at most 2');
    expect(prepared.kmedoids({ k: 2 }).profiles()).toHaveLength(2);
  });

  it('a hierarchy cut will not split identical rows; at most the distinct count is allowed', () => {
    const rows = [
      [0, 0],
      [0, 0],
      [0, 0],
      [5, 1],
      [5, 1],
      [9, 9],
    ];
    for (const method of ['ward', 'average', 'single'] as const) {
      const tree = agglomerate(rows, { method });
      refusal(() => tree.cut({ k: 4 }), 'height 0', 'at most 3');
      expect(Array.from(tree.cut({ k: 3 }))).toEqual([0, 0, 0, 1, 1, 2].map((s) => Array.from(tree.cut({ k: 3 }))[[0, 3, 5][s]]));
    }
    const prepared = study(twoDistinct, { id: 'id', use: ['a', 'b'] }).prepare({});
    refusal(() => prepared.agglomerate({ method: 'ward' }).cut({ k: 3 }), 'at most 2');
  });
});

describe('Ward from rows says how much work is coming, then reports progress', () => {
  it('the first progress event, before any merge, carries the estimate; ticks follow', () => {
    const events: { done: number; detail?: string }[] = [];
    const rows = Array.from({ length: 300 }, (_, i) => [Math.sin(i), Math.cos(i * 1.7), (i % 7) / 7]);
    agglomerate(rows, { method: 'ward', progress: (e) => events.push(e) });
    expect(events[0].done).toBe(0);
    expect(events[0].detail).toContain('ward linkage on 300 rows: about 90,000 distance evaluations');
    expect(events.at(-1)!.done).toBe(299);
    const fluent: string[] = [];
    study(riders(40, 2), { id: 'rider', use: ['trips', 'peak'] })
      .prepare({})
      .agglomerate({ method: 'ward', onProgress: (e) => fluent.push(e.detail ?? '') });
    expect(fluent[0]).toMatch(/^ward linkage on 40 rows/);
  });

  it('at 200,000 rows the estimate warns of minutes', () => {
    const w = agglomerationWork(200_000, 8, 'ward');
    expect(w.distanceEvaluations).toBe(4e10);
    expect(w.summary).toContain('4.0e10 distance evaluations');
    expect(w.summary).toContain('expect minutes');
  });
});

describe('terminal text: one escaping helper', () => {
  it('line breaks, escape sequences, C1 controls and bidi overrides are shown, printable text kept', () => {
    expect(forTerminal('a\nb')).toBe('a\\nb');
    expect(forTerminal('\u001b[2Jx')).toBe('\\e[2Jx');
    expect(forTerminal('x\r\ty')).toBe('x\\r\\ty');
    expect(forTerminal('\u009b31m')).toBe('\\u009b31m');
    expect(forTerminal('abc\u202edef')).toBe('abc\\u202edef');
    expect(forTerminal('名前 é 😀')).toBe('名前 é 😀');
  });
});

describe('"did you mean" among many long candidates is bounded too', () => {
  it('50,000 candidates of 190 characters: an answer without the 1.8e9 comparisons', () => {
    const candidates = Array.from({ length: 50_000 }, (_, i) => `${'c'.repeat(180)}${String(i).padStart(10, '0')}`);
    // Whatever it suggests must be a real candidate within the typo allowance, or nothing.
    const guess = closestName(`${'c'.repeat(180)}000000001x`, candidates);
    expect(guess === undefined || candidates.includes(guess)).toBe(true);
    expect(closestName('trps', ['trips', ...candidates])).toBe('trips');
  });
});
