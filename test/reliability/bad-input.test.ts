// Hostile and degenerate input through the functional core and the fluent layer: each case is
// either refused with a KinsortError naming what and where, or handled correctly (checked here).
// Data of our own making, written out in each test.
import { describe, expect, it } from 'vitest';
import {
  adjustedRandIndex,
  agglomerate,
  bootstrapStability,
  calinskiHarabasz,
  compareK,
  daviesBouldin,
  dissimilarity,
  gapStatistic,
  kmeans,
  kmeansMiniBatch,
  kmedoids,
  loadDefinition,
  normalizedMutualInfo,
  prepareTable,
  project,
  readTable,
  silhouette,
  study,
  findKnee,
  viewsPage,
} from '../../src';
import { makeDissimilarity } from '../../src/internal';
import { refusal } from './helpers';

const rows = [
  [1, 2],
  [3, 4],
  [5, 6],
  [7, 9],
];
const HUGE = [
  [1e300, 1e300],
  [-1e300, -1e300],
  [1e300, 9e299],
  [-1e300, -9e299],
];
const TINY = HUGE.map((r) => r.map((v) => v / 1e300 / 1e300));

describe('numbers that cannot be used name the row and column', () => {
  for (const [label, bad, shown] of [
    ['NaN', NaN, 'NaN'],
    ['+Infinity', Infinity, 'Infinity'],
    ['-Infinity', -Infinity, '-Infinity'],
  ] as const) {
    it(`${label} in rows: every method refuses, naming row 2, column 2`, () => {
      const input = [
        [1, 2],
        [3, bad],
        [4, 5],
        [6, 1],
      ];
      for (const f of [
        () => kmeans(input, { k: 2 }),
        () => kmeansMiniBatch(input, { k: 2 }),
        () => kmedoids(input, { k: 2 }),
        () => agglomerate(input, { method: 'average' }),
        () => agglomerate(input, { method: 'ward' }),
        () => dissimilarity(input, { metric: 'manhattan' }),
        () => silhouette(input, [0, 0, 1, 1]),
        () => calinskiHarabasz(input, [0, 0, 1, 1]),
        () => project(input, { components: 1 }),
      ]) {
        refusal(f, 'row 2', 'column 2', shown);
      }
    });
  }
  it('text in a numeric row names the cell and its content', () => {
    refusal(
      () =>
        kmeans(
          [
            [1, 2],
            ['x' as unknown as number, 3],
            [4, 5],
          ],
          { k: 2 },
        ),
      'row 2',
      'column 1',
      '"x"',
    );
  });
  it('text in a numeric table column names the row id and the column', () => {
    const t = readTable([
      { id: 'a', x: 1 },
      { id: 'b', x: 'two' },
      { id: 'c', x: 3 },
    ]);
    refusal(() => prepareTable(t, { id: 'id', types: { x: 'numeric' } }), 'row 2', 'id "b"', 'column "x"', '"two"');
  });
  it('a missing cell under the default policy names the row id, the column and the alternatives', () => {
    const t = readTable([
      { id: 'a', x: 1 },
      { id: 'b', x: null },
      { id: 'c', x: 3 },
    ]);
    refusal(() => prepareTable(t, { id: 'id' }), 'id "b"', 'column "x"', "'drop'", "'median'");
  });
});

describe('huge and tiny magnitudes: correct, or a clear refusal (never silent Infinity, 0 or a hang)', () => {
  it('1e300 rows are refused by every row-taking method before any distance overflows', () => {
    for (const f of [
      () => kmeans(HUGE, { k: 2, seed: 1 }),
      () => kmeansMiniBatch(HUGE, { k: 2, seed: 1 }),
      () => kmedoids(HUGE, { k: 2 }),
      () => agglomerate(HUGE, { method: 'ward' }),
      () => agglomerate(HUGE, { method: 'average' }),
      () => dissimilarity(HUGE, { metric: 'euclidean' }),
      () => silhouette(HUGE, [0, 1, 0, 1]),
      () => calinskiHarabasz(HUGE, [0, 1, 0, 1]),
      () => daviesBouldin(HUGE, [0, 1, 0, 1]),
      () => project(HUGE, { components: 1 }),
    ]) {
      refusal(f, 'row 1', 'column 1', '1e+300', 'rescale');
    }
  });
  it('a Euclidean dissimilarity of 1e300 values: Ward, centroid and median (which square it) refuse; average is exact', () => {
    const c = [1e300, 1.7e308, 1.5e300, 3e300, 1e308, 2e300];
    const d = makeDissimilarity(4, Float64Array.from(c), 'euclidean');
    for (const method of ['ward', 'centroid', 'median'] as const) refusal(() => agglomerate(d, { method }), 'overflow', 'Rescale');
    // Average linkage by hand: {0,1} at 1e300, {2,3} at 2e300, then the mean of the four cross pairs.
    const heights = agglomerate(d, { method: 'average' }).merges.map((m) => m.height);
    expect(heights[0]).toBe(1e300);
    expect(heights[1]).toBe(2e300);
    expect(heights[2] / 1e307).toBeCloseTo((1.7e308 / 4 + 1.5e300 / 4 + 3e300 / 4 + 1e308 / 4) / 1e307, 9);
  });
  it('rows whose largest value is 1e-300 are refused (squared differences would all be 0)', () => {
    expect(TINY[0][0]).toBe(1e-300);
    refusal(() => kmeans(TINY, { k: 2, seed: 1 }), 'underflow', 'rescale');
    refusal(() => agglomerate(TINY, { method: 'single' }), 'underflow');
  });
  it('a 1e-300 value beside ordinary values is fine (it is simply near 0)', () => {
    const r = kmeans(
      [
        [1e-300, 0],
        [0, 0.1],
        [10, 10],
        [10.1, 10],
      ],
      { k: 2, seed: 3 },
    );
    expect(r.assignment[0]).toBe(r.assignment[1]);
    expect(r.assignment[2]).toBe(r.assignment[3]);
    expect(r.assignment[0]).not.toBe(r.assignment[2]);
    expect(Number.isFinite(r.withinSS)).toBe(true);
  });
  it('a 1e300 column with z-score scaling is refused naming the column; min-max scaling is exact', () => {
    const t = readTable([
      { id: 'a', x: 1e300 },
      { id: 'b', x: -1e300 },
      { id: 'c', x: 5e299 },
    ]);
    refusal(() => prepareTable(t, { id: 'id', scale: 'zscore' }), 'column "x"', 'power of ten');
    const mm = prepareTable(t, { id: 'id', scale: 'minmax' });
    // (x - min) / (max - min) by hand: 1, 0, 0.75.
    expect(Array.from(mm.matrix.data)).toEqual([1, 0, 0.75]);
  });
  it('a 1e-300 column with z-score scaling is refused, never a matrix of NaN', () => {
    const t = readTable([
      { id: 'a', x: 1e-300 },
      { id: 'b', x: -1e-300 },
      { id: 'c', x: 5e-301 },
    ]);
    refusal(() => prepareTable(t, { id: 'id', scale: 'zscore' }), 'column "x"');
  });
});

describe('empty, one row, identical rows, constant columns', () => {
  it('empty inputs are refused as empty', () => {
    refusal(() => kmeans([], { k: 1 }), 'empty');
    refusal(() => dissimilarity([], {}), 'empty');
    refusal(() => agglomerate([], { method: 'ward' }), '0 row');
    refusal(() => readTable(''), 'empty');
    refusal(() => readTable('a,b\n'), 'no rows');
    refusal(() => readTable([]), 'empty');
    refusal(() => study([]), 'empty');
  });
  it('one row: k = 1 works (centre is the row), k = 2 and a hierarchy are refused', () => {
    const r = kmeans([[1, 2]], { k: 1 });
    expect(Array.from(r.assignment)).toEqual([0]);
    expect(r.withinSS).toBe(0);
    refusal(() => kmeans([[1, 2]], { k: 2 }), 'k = 2', 'only 1 rows');
    refusal(() => agglomerate([[1, 2]], { method: 'ward' }), 'at least 2 rows');
    expect(dissimilarity([[1, 2]], {}).condensed.length).toBe(0);
  });
  it('identical rows: k above the distinct rows is refused saying so; k = 1 and a tree work', () => {
    const same = [
      [1, 1],
      [1, 1],
      [1, 1],
    ];
    refusal(() => kmeans(same, { k: 2 }), 'distinct');
    refusal(() => kmedoids(same, { k: 2 }), 'distinct');
    expect(kmeans(same, { k: 1 }).withinSS).toBe(0);
    const tree = agglomerate(same, { method: 'average' });
    expect(tree.merges.every((m) => m.height === 0)).toBe(true);
    // A cut never splits identical rows (issue 14): k above the distinct rows is refused as well.
    refusal(() => tree.cut({ k: 2 }), 'height 0', 'at most 1');
    expect(Array.from(tree.cut({ k: 1 }))).toEqual([0, 0, 0]);
    // Rousseeuw (1987): s(i) = 0 when a(i) = b(i) (here both 0).
    expect(
      Array.from(
        silhouette(
          [
            [1, 1],
            [1, 1],
            [1, 1],
            [1, 1],
          ],
          [0, 1, 0, 1],
        ).values,
      ),
    ).toEqual([0, 0, 0, 0]);
  });
  it('a constant column is dropped and reported; all-constant and one-row tables are refused', () => {
    const d = prepareTable(
      readTable([
        { id: 'a', x: 1, y: 5 },
        { id: 'b', x: 2, y: 5 },
        { id: 'c', x: 3, y: 5 },
      ]),
      { id: 'id' },
    );
    expect(d.featureNames).toEqual(['x']);
    expect(d.report.constantColumns).toEqual(['y']);
    refusal(
      () =>
        prepareTable(
          readTable([
            { id: 'a', y: 5 },
            { id: 'b', y: 5 },
          ]),
          { id: 'id' },
        ),
      'constant',
      'y',
    );
    refusal(() => study([{ id: 'a', x: 1, y: 2 }], { id: 'id' }).prepare(), 'constant');
  });
});

describe('ids: unicode, very long, duplicate, empty', () => {
  it('unicode and 5,000-character ids pass through unchanged', () => {
    const long = 'é'.repeat(5000) + '😀';
    const d = prepareTable(
      readTable([
        { id: long, x: 1 },
        { id: '名前', x: 2 },
        { id: 'ﬁ\u0301', x: 3 },
      ]),
      { id: 'id' },
    );
    expect(d.ids).toEqual([long, '名前', 'ﬁ\u0301']);
  });
  it('a duplicate id is refused naming the id and both rows', () => {
    refusal(
      () =>
        prepareTable(
          readTable([
            { id: 'a', x: 1 },
            { id: 'b', x: 1 },
            { id: 'a', x: 2 },
          ]),
          { id: 'id' },
        ),
      '"a"',
      'rows 1 and 3',
    );
  });
  it('an empty id is refused naming the row', () => {
    refusal(
      () =>
        prepareTable(
          readTable([
            { id: 'a', x: 1 },
            { id: '', x: 2 },
          ]),
          { id: 'id' },
        ),
      'row 2',
      '"id"',
    );
  });
});

describe('CSV text: BOM, mixed line endings, ragged rows, quotes, duplicate headers', () => {
  it('a BOM and \\r\\n, \\n and \\r line endings in one text read as three rows', () => {
    const t = readTable('\uFEFFa,b\r\n1,2\n3,4\r5,6\n');
    expect(t.columns.map((c) => c.name)).toEqual(['a', 'b']);
    expect(t.columns.map((c) => c.values)).toEqual([
      ['1', '3', '5'],
      ['2', '4', '6'],
    ]);
  });
  it('ragged rows name the line and the field counts', () => {
    refusal(() => readTable('a,b\n1,2\n3\n'), 'line 3', '1 fields', '2');
    refusal(() => readTable('a,b\n1,2\n3,4,5\n'), 'line 3', '3 fields');
  });
  it('an unclosed quote and a duplicate header are refused', () => {
    refusal(() => readTable('a,b\n"1,2\n3,4\n'), 'quote');
    refusal(() => readTable('a,a\n1,2\n'), 'duplicate', '"a"');
  });
  it('NaN in records reads as missing; Infinity reaching the preparation is refused naming row id and column', () => {
    const t = readTable([{ a: NaN }, { a: 1 }, { a: 2 }]);
    expect(t.columns[0].values).toEqual([null, 1, 2]);
    const inf = readTable([
      { id: 'p', a: 3 },
      { id: 'q', a: Infinity },
      { id: 'r', a: 2 },
    ]);
    refusal(() => prepareTable(inf, { id: 'id' }), 'id "q"', 'column "a"');
  });
  it('a cell that is an object is refused naming row and column', () => {
    refusal(() => readTable([{ a: { x: 1 } }, { a: 2 }]), 'row 1', 'column "a"');
  });
});

describe('k out of range, unknown names with a "did you mean"', () => {
  it('k of 0, 1.5 and above the rows, for every method', () => {
    refusal(() => kmeans(rows, { k: 0 }), 'got 0');
    refusal(() => kmeans(rows, { k: 1.5 }), '1.5');
    refusal(() => kmeans(rows, { k: 5 }), 'at most 4');
    refusal(() => kmeansMiniBatch(rows, { k: 5 }), 'at most 4');
    refusal(() => kmedoids(rows, { k: 5 }), 'at most 4');
    refusal(() => agglomerate(rows, { method: 'ward' }).cut({ k: 9 }), 'from 1 to 4', 'got 9');
    refusal(() => agglomerate(rows, { method: 'ward' }).cut({ k: 0 }), 'got 0');
    refusal(() => gapStatistic(rows, { kFrom: 1, kTo: 9, references: 2, seed: 1 }), 'kTo', 'got 9');
    refusal(() => compareK(rows, { from: 2, to: 9 }), 'got 9');
    refusal(() => bootstrapStability(rows, { k: 9 } as never), 'got 9');
    refusal(() => project(rows, { components: 5 }), 'got 5');
  });
  it('unknown metric, linkage, scale, missing policy and option names suggest the intended one', () => {
    refusal(() => dissimilarity(rows, { metric: 'euclidian' as never }), 'Did you mean "euclidean"');
    refusal(() => agglomerate(rows, { method: 'wards' as never }), 'Did you mean "ward"');
    refusal(() => kmeans(rows, { k: 2, restart: 3 } as never), 'Did you mean "restarts"');
    refusal(() => gapStatistic(rows, { kfrom: 1 } as never), 'Did you mean "kFrom"');
    refusal(() => compareK(rows, { form: 2 } as never), 'Did you mean "from"');
    refusal(() => agglomerate(rows, { method: 'ward' }).cut({ kk: 2 } as never), 'Did you mean "k"');
    const t = readTable([
      { id: 'a', x: 1 },
      { id: 'b', x: 2 },
    ]);
    refusal(() => prepareTable(t, { id: 'id', scale: 'z-score' as never }), 'Did you mean "zscore"');
    refusal(() => prepareTable(t, { id: 'id', missing: 'drops' as never }), 'Did you mean "drop"');
    refusal(() => prepareTable(t, { id: 'idd' }), 'Did you mean "id"');
    refusal(() => prepareTable(t, { id: 'id', use: ['xx'] }), 'Did you mean "x"');
  });
});

describe('assignment arrays of the wrong length or kind', () => {
  it('silhouette, Calinski–Harabasz, Davies–Bouldin, ARI and NMI name both lengths', () => {
    refusal(() => silhouette(rows, [0, 1, 0]), '3 entries', '4');
    refusal(() => calinskiHarabasz(rows, [0, 1, 0]), '3 entries');
    refusal(() => daviesBouldin(rows, [0, 1, 0, 1, 1]), '5 entries');
    refusal(() => adjustedRandIndex([0, 1, 0], [0, 1]), '2 entries', '3');
    refusal(() => normalizedMutualInfo([0, 1, 0], [0, 1]), '2 entries');
    refusal(() => adjustedRandIndex([0, 1.5, 0], [0, 1, 1]), 'entry 2', '1.5');
  });
});

describe('the fluent layer refuses the same things as clearly', () => {
  const recs = [
    { id: 'a', x: 1, y: 0 },
    { id: 'b', x: 2, y: 1 },
    { id: 'c', x: 3, y: 0 },
    { id: 'd', x: 9, y: 1 },
  ];
  it('unknown roles and options, k out of range, unknown linkage and metric, bad segment numbers', () => {
    refusal(() => study(recs, { idd: 'id' } as never), 'Did you mean "id"');
    const s = study(recs, { id: 'id' }).prepare();
    refusal(() => study(recs, { id: 'id' }).prepare({ scal: 'none' } as never), 'Did you mean "scale"');
    refusal(() => s.kmeans({ k: 5 }), 'at most 4');
    refusal(() => s.agglomerate({ method: 'avrage' as never }), 'Did you mean "average"');
    refusal(() => s.kmedoids({ k: 2, metric: 'manhatan' as never }), 'Did you mean "manhattan"');
    refusal(() => s.agglomerate({ method: 'ward' }).cut({ k: 7 }), 'got 7');
    const seg = s.kmeans({ k: 2, seed: 1 });
    refusal(() => seg.name(5, { title: 'x' }), 'got 5');
    refusal(() => seg.compare([0, 1]), '2 entries');
    refusal(() => seg.segmentOf('zz'), '"zz"');
  });
  it('a 1e300 column in the fluent layer is refused naming the column', () => {
    refusal(
      () =>
        study(
          [
            { id: 'a', x: 1e300 },
            { id: 'b', x: -1e300 },
            { id: 'c', x: 1 },
          ],
          { id: 'id' },
        ).prepare(),
      'column "x"',
    );
  });
});

describe('damaged definition files', () => {
  it('not JSON, truncated, the wrong kind, nothing, and a missing file are each refused saying why', () => {
    refusal(() => loadDefinition('{"a":'), 'not JSON');
    refusal(() => loadDefinition('{"a":1}'), 'not a kinsort segment definition');
    refusal(() => loadDefinition(''), /definition|empty|JSON/);
    refusal(() => loadDefinition(null as never), 'give a file path');
    refusal(() => loadDefinition('/nonexistent/kinsort-def.json'), 'cannot read', 'ENOENT');
  });
});

describe('misused entry points (plain JavaScript callers) refuse instead of crashing', () => {
  it('viewsPage without a list of views, or with something that is not a view', () => {
    refusal(() => viewsPage('t', null as never), 'list of views');
    refusal(() => viewsPage('t', [{}] as never), 'item 1');
  });
  it('findKnee given one list instead of two', () => {
    refusal(() => (findKnee as unknown as (xs: number[]) => unknown)([1, 2, 3]), 'two lists');
  });
  it('saving a definition where it cannot be written names the path', () => {
    const def = study([{ a: 1 }, { a: 2 }, { a: 4 }])
      .prepare()
      .kmeans({ k: 2 })
      .definition();
    refusal(() => def.save('/proc/kinsort-cannot-write/def.json'), 'cannot write', '/proc/kinsort-cannot-write/def.json');
  });
});
