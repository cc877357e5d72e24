// The fluent layer is sugar over the functional core: each fluent call must give exactly what its
// functional twin gives on the same prepared rows, keep ids with the assignment, and hand the
// same segmentation to profiles, definitions and write-ups whatever method made it.
import { describe, expect, it } from 'vitest';
import { study } from '../../src/study';
import { createRandom } from '../../src/random';
import { prepareTable } from '../../src/prepare';
import { kmeans, kmedoids } from '../../src/methods/partition';
import { agglomerate } from '../../src/methods/hierarchy';
import { silhouette } from '../../src/assess/silhouette';
import { dissimilarity } from '../../src/measure/dissimilarity';
import { loadDefinition } from '../../src/study/definition-handle';

function riders(n: number, seed = 1) {
  const r = createRandom(seed);
  const fares = ['adult', 'student', 'senior'];
  return Array.from({ length: n }, (_, i) => {
    const g = i % 3;
    return {
      rider: `R${String(i).padStart(4, '0')}`,
      trips: 5 + 6 * g + r.normal(),
      peak: 0.2 + 0.25 * g + 0.06 * r.normal(),
      fare: fares[(g + (r.next() < 0.1 ? 1 : 0)) % 3],
      zone: r.next() < 0.5 ? 'north' : 'south',
    };
  });
}

const roles = { id: 'rider', use: ['trips', 'peak', 'fare'], keep: ['zone'] };

describe('study → prepare', () => {
  it('prepares exactly as prepareTable does with the same roles and options', () => {
    const records = riders(120);
    const s = study(records, roles).prepare({ scale: 'robust' });
    const direct = prepareTable(records, { ...roles, scale: 'robust' });
    expect(Array.from(s.data.matrix.data)).toEqual(Array.from(direct.matrix.data));
    expect(s.ids).toEqual(direct.ids);
    expect(s.featureNames).toEqual(['trips', 'peak', 'fare=adult', 'fare=senior', 'fare=student']);
  });

  it('refuses misspelt role and option names, suggesting the right one', () => {
    expect(() => study(riders(10), { id: 'rider', usee: ['trips'] } as never)).toThrow(/unknown option "usee".*Did you mean "use"/);
    expect(() => study(riders(10), roles).prepare({ scal: 'zscore' } as never)).toThrow(/Did you mean "scale"/);
  });
});

describe('fluent calls equal their functional twins', () => {
  const records = riders(150);
  const s = study(records, roles).prepare();

  it('kmeans', () => {
    const seg = s.kmeans({ k: 3, seed: 4, restarts: 5 });
    const twin = kmeans(s.data.matrix, { k: 3, seed: 4, restarts: 5 });
    expect(Array.from(seg.assignment)).toEqual(Array.from(twin.assignment));
    expect(seg.objective).toEqual({ name: 'withinSS', value: twin.withinSS });
    expect(seg.sizes.reduce((a, b) => a + b, 0)).toBe(150);
  });

  it('kmedoids, on the prepared rows and on Gower dissimilarities of the mixed columns', () => {
    const seg = s.kmedoids({ k: 3 });
    const twin = kmedoids(dissimilarity(s.data.matrix), { k: 3 });
    expect(seg.medoids).toEqual(twin.medoids);
    expect(seg.objective.value).toBeCloseTo(twin.cost, 12);
    const gower = s.kmedoids({ k: 3, metric: 'gower' });
    const gowerTwin = kmedoids(dissimilarity(s.data.mixed), { k: 3 });
    expect(Array.from(gower.assignment)).toEqual(Array.from(gowerTwin.assignment));
    // A definition cannot carry Gower medoids (new rows are assigned in the prepared space); the
    // refusal names the call the user made.
    expect(() => gower.definition()).toThrow(/^definition: the segments were found with the "gower" metric/);
  });

  it('agglomerate and cut', () => {
    const tree = s.agglomerate({ method: 'average' });
    const twin = agglomerate(dissimilarity(s.data.matrix), { method: 'average' });
    expect(tree.merges.map((m) => m.height)).toEqual(twin.merges.map((m) => m.height));
    const cut = tree.cut({ k: 4 });
    expect(Array.from(cut.assignment)).toEqual(Array.from(twin.cut({ k: 4 })));
    expect(cut.k).toBe(4);
    expect(tree.order).toHaveLength(150);
  });

  it('silhouette of a segmentation', () => {
    const seg = s.kmeans({ k: 3, seed: 1 });
    expect(seg.silhouette().average).toBeCloseTo(silhouette(s.data.matrix, seg.assignment).average, 12);
  });
});

describe('a segmentation', () => {
  const records = riders(150);
  const s = study(records, roles).prepare();
  const seg = s.kmeans({ k: 3, seed: 2, restarts: 4 });

  it('keeps ids with segments, people-facing numbers 1..k', () => {
    const id = seg.ids[10];
    expect(seg.segmentOf(id)).toBe(seg.assignment[10] + 1);
    const all = [1, 2, 3].flatMap((n) => seg.members(n));
    expect(all.sort()).toEqual([...seg.ids].sort());
    expect(() => seg.segmentOf('nobody')).toThrow(/no prepared row has id "nobody"/);
    expect(() => seg.name(4, { title: 'x' })).toThrow(/segment number must be a whole number from 1 to 3/);
    expect(() => seg.name(1, { titel: 'x' } as never)).toThrow(/Did you mean "title"/);
    expect(() => seg.name(1, null as never)).toThrow(/give the segment's name as \{ title, text \}/);
    expect(() => seg.name(1, 'Commuters' as never)).toThrow(/give the segment's name as/);
  });

  it('carries names into profiles, the write-up and the definition file', () => {
    seg.name(2, { title: 'Peak <commuters>', text: 'Ride *mostly* at peak.' });
    const p = seg.profiles();
    expect(p[1].title).toBe('Peak <commuters>');
    const md = seg.writeUp({ title: 'Riders' }).markdown();
    expect(md).toContain('## Segment 2: Peak &lt;commuters&gt;');
    expect(md).toContain('Ride \\*mostly\\* at peak.');
    expect(md).not.toContain('<commuters>');
    const html = seg.writeUp().html();
    expect(html).not.toContain('<commuters>');
    expect(html).toContain('Peak &lt;commuters&gt;');
    const def = seg.definition({ note: 'fluent test' });
    expect(def.definition.segments[1].title).toBe('Peak <commuters>');
  });

  it('assigns its own training rows back to their fitted segments, through the definition file text', () => {
    const text = seg.definition().toJSON();
    const again = loadDefinition(text);
    const out = again.assign(records);
    expect(out.rows).toHaveLength(records.length);
    for (let i = 0; i < records.length; i++) {
      expect(out.rows[i].id).toBe(seg.ids[i]);
      expect(out.rows[i].segment).toBe(seg.assignment[i] + 1);
    }
  });

  it('compares with another segmentation of the same rows', () => {
    const other = s.agglomerate({ method: 'ward' }).cut({ k: 3 });
    const c = seg.compare(other);
    expect(c.adjustedRandIndex).toBeGreaterThan(0.5);
    expect(c.adjustedRandIndex).toBeLessThanOrEqual(1);
    expect(seg.compare(seg).adjustedRandIndex).toBe(1);
  });

  it('builds its views, each a self-contained page', () => {
    for (const view of [seg.cards(), seg.projection(), seg.silhouette().view(), s.compareK({ from: 2, to: 4, gap: false }).view()]) {
      const page = view.html();
      expect(page.startsWith('<!doctype html>')).toBe(true);
      expect(page).not.toMatch(/<script[^>]+src=/);
    }
    expect(() => s.agglomerate({ method: 'ward' }).heatmap()).not.toThrow();
  });

  it('a hierarchy cut gives a segmentation whose centres are the segment means', () => {
    const cut = s.agglomerate({ method: 'ward' }).cut({ k: 3 });
    const m = s.data.matrix;
    for (let seg3 = 0; seg3 < 3; seg3++) {
      const members = [...cut.assignment.keys()].filter((i) => cut.assignment[i] === seg3);
      const mean0 = members.reduce((a, i) => a + m.data[i * m.cols], 0) / members.length;
      expect(cut.centers[seg3][0]).toBeCloseTo(mean0, 12);
    }
    expect(() => cut.stability()).toThrow(/hierarchy/);
  });
});
