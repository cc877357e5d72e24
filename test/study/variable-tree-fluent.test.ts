// The fluent variable tree is sugar over variableTree(): same merges on the same columns, names as
// leaves, categorical columns left out with the reason, representatives handed back into use.
import { readFileSync } from 'fs';
import { join } from 'path';
import { describe, expect, it } from 'vitest';
import { study } from '../../src/study';
import { variableTree } from '../../src/methods/variables';
import { readTable } from '../../src/table';

const csv = readFileSync(join(__dirname, '../../demo-data/pass-holders.csv'), 'utf8');

describe('prepared.variableTree()', () => {
  const prepared = study(csv, { id: 'holder_id' }).prepare({ scale: 'zscore', missing: 'drop' });
  const vars = prepared.variableTree();

  it('equals the functional twin on the unscaled numeric and binary columns', () => {
    const left = vars.leftOut.map((c) => c.name);
    expect(left).toContain('fare_type');
    expect(vars.leftOut[0].reason).toMatch(/unordered levels/);
    const names = vars.names as string[];
    expect(names).not.toContain('fare_type');
    // Twin: the same columns from the table, on the rows the 'drop' policy kept.
    const records = readTable(csv);
    const kept = new Set(prepared.data.rowNumbers);
    const table = {
      ...records,
      rowCount: kept.size,
      columns: records.columns.map((c) => ({ ...c, values: c.values.filter((_, i) => kept.has(i)) })),
    };
    const twin = variableTree(table, { columns: names });
    expect(vars.tree.merges.map((m) => [m.left, m.right])).toEqual(twin.merges.map((m) => [m.left, m.right]));
    vars.tree.merges.forEach((m, i) => expect(m.height).toBeCloseTo(twin.merges[i].height, 12));
  });

  it('groups, representatives and use(): one column per group in a new preparation with the same options', () => {
    const groups = vars.groups({ k: 4 });
    expect(groups).toHaveLength(4);
    const reps = vars.representatives({ k: 4 });
    expect(reps).toHaveLength(4);
    const again = prepared.use(reps);
    expect(again.featureNames.length).toBeGreaterThanOrEqual(4);
    expect(again.preparation.columns.map((c) => c.name)).toEqual(reps);
    expect(again.preparation.scale).toBe('zscore');
    expect(groups.html()).toContain('keep');
  });

  it('draws the dendrogram with names as leaves and the correlation grid in tree order, escaping names', () => {
    const d = vars.dendrogram({ k: 4 }).svg();
    for (const name of vars.names) expect(d).toContain(name);
    const h = vars.heatmap({ k: 4 });
    expect(h.caption).toMatch(/4 framed, numbered squares/);
    expect(h.html()).toContain('Left out: fare_type');
    expect(h.html()).toMatch(/autopay entered as binary: &quot;no&quot; = 0, &quot;yes&quot; = 1/);
    const odd = study([
      { '<b>a': 1, b: 2 },
      { '<b>a': 2, b: 1 },
      { '<b>a': 3, b: 5 },
      { '<b>a': 4, b: 3 },
    ])
      .prepare()
      .variableTree();
    expect(odd.heatmap().html()).not.toContain('<b>a');
    expect(odd.heatmap().html()).toContain('&lt;b&gt;a');
  });
});
