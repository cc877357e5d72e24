import { describe, expect, it } from 'vitest';
import { allViews, handProjection, sampleData, sampleDissimilarity } from './gallery';
import { dendrogramView, heatmapView, kEvidenceView, profileCardsView, projectionView, screeView, silhouetteView } from '../../src/views';
import { makeDissimilarity } from '../../src/measure/condensed';
import { KinsortError } from '../../src/core/errors';
import { everyNth } from '../../src/views/common';
import { agglomerate } from '../../src/methods/hierarchy';

function build(hostile: boolean) {
  const v = allViews(hostile);
  return {
    v,
    views: [
      dendrogramView(v.tree, { k: 3 }),
      projectionView(v.projection, v.assignment, { ids: v.ids, loadings: true, hover: { trips: v.rows.map((r) => r[0]), fare: v.ids } }),
      screeView(v.projection),
      kEvidenceView(v.comparison),
      silhouetteView(v.sil, v.assignment, { ids: v.ids, names: { 1: v.profiles[0].title! } }),
      heatmapView(v.dissimilarity, { order: v.tree, assignment: v.assignment }),
      profileCardsView(v.profiles),
    ],
  };
}

describe('every view', () => {
  const { views } = build(false);
  it.each(views.map((view) => [view.kind, view]))(
    '%s has a title, a caption, a static stand-in and a complete offline page',
    (_kind, view) => {
      expect(view.title.length).toBeGreaterThan(5);
      expect(view.caption).toMatch(/\.$/);
      const fragment = view.fragment();
      expect(fragment).toContain('class="ks-static"');
      expect(view.svg()).toMatch(/^<svg[\s\S]*<\/svg>$/);
      const page = view.html();
      expect(page.startsWith('<!doctype html>')).toBe(true);
      // Offline: no external script, stylesheet or font.
      expect(page).not.toMatch(/<script[^>]+src=/i);
      expect(page).not.toMatch(/<link[^>]+href=/i);
      // Cards, silhouettes and dendrograms are plain HTML / SVG only; every other view also has a live chart.
      if (!['profile-cards', 'silhouette', 'dendrogram'].includes(view.kind)) {
        expect(page.split('window.__kinsortDefine=window.define').length - 1).toBe(1);
        expect(fragment).toContain('class="ks-live" hidden');
      }
    },
  );

  it('charts carry labelled axes in the static SVG', () => {
    const byKind = Object.fromEntries(views.map((v) => [v.kind, v.svg()]));
    expect(byKind.dendrogram).toContain('height (dissimilarity at which groups join)');
    expect(byKind.projection).toMatch(/principal component 1 \(46\.0% of variance\)/);
    expect(byKind.projection).toMatch(/principal component 2 \(31\.0% of variance\)/);
    expect(byKind.scree).toContain('share of variance');
    expect(byKind['k-evidence']).toMatch(/font-style="italic" fill="#[0-9a-f]{6}">k<\/text>/);
    expect(byKind.silhouette).toContain('silhouette width');
  });
});

describe('dendrogramView', () => {
  const v = allViews(false);
  it('draws one join per merge in ink, the cut as a line, numbered segment tabs, every leaf labelled beside it', () => {
    const svg = dendrogramView(v.tree, { k: 3, labelled: 100 }).svg();
    expect((svg.match(/<path d=/g) ?? []).length).toBe(v.rows.length - 1);
    expect(svg).toContain('cut: 3 segments');
    for (const s of ['1', '2', '3']) expect(svg).toMatch(new RegExp(`font-weight="700" fill="#[0-9a-f]{6}">${s}</text>`));
    for (const id of v.ids) expect(svg).toContain(`>${id}</text>`);
  });

  it('past the labelled limit draws the top of the tree down to numbered branches, and one branch on request', () => {
    const big = sampleData(450);
    const tree = { ...agglomerate(big.rows, { method: 'ward' }), labels: big.ids };
    const cut = agglomerate(big.rows, { method: 'ward' });
    const whole = { ...tree, cut: cut.cut.bind(cut) };
    const view = dendrogramView(whole, { k: 4, branches: 12 });
    const svg = view.svg();
    const marks = [...svg.matchAll(/<text[^>]*>branch (\d+) · (\d+) rows · segment \d</g)];
    expect(marks.map((m) => Number(m[1]))).toEqual(Array.from({ length: 12 }, (_, i) => i + 1));
    expect(marks.reduce((a, m) => a + Number(m[2]), 0)).toBe(450);
    expect(view.fragment()).toContain('dendrogram({ branch: j, k: 4 })');
    const first = Number(marks[0][2]);
    const one = dendrogramView(whole, { k: 4, branches: 12, branch: 1 }).svg();
    expect(one).toContain(`branch 1 of 12 (${first} rows)`);
    if (first <= 80) expect((one.match(/>PH-\d+<\/text>/g) ?? []).length).toBe(first);
  });

  it('refuses a k-means result and suggests the agglomerate step', () => {
    const kmeansLike = { kind: 'kmeans', k: 3, assignment: new Int32Array(3) };
    expect(() => dendrogramView(kmeansLike as never)).toThrow(KinsortError);
    expect(() => dendrogramView(kmeansLike as never)).toThrow(/agglomerate\(rows, \{ method: 'ward' \}\)/);
    expect(() => dendrogramView(v.tree, { k: 3, height: 2 })).toThrow(/either k or height/);
    expect(() => dendrogramView(v.tree, { kk: 3 } as never)).toThrow(/Did you mean "k"/);
  });
});

describe('heatmapView', () => {
  it('refuses above the drawable size, saying what to do instead', () => {
    const n = 1501;
    const big = makeDissimilarity(n, new Float64Array((n * (n - 1)) / 2), 'euclidean');
    expect(() => heatmapView(big)).toThrow(/1,501 rows[\s\S]*sample[\s\S]*projectionView/);
  });
  it('draws a numbered strip per run of one segment along both edges', () => {
    const { rows, assignment } = sampleData(12);
    const d = sampleDissimilarity(rows);
    // Order rows by segment: three runs, so each segment colour appears on two strips.
    const order = [0, 3, 6, 9, 1, 4, 7, 10, 2, 5, 8, 11];
    const svg = heatmapView(d, { order, assignment }).svg();
    for (const colour of ['#1a6699', '#e6991a', '#993333']) expect(svg.split(`fill="${colour}"`).length - 1).toBe(2);
    expect(() => heatmapView(d, { assignment: [0, 1] })).toThrow(/2 entries/);
  });
  it('refuses an order that is not a permutation', () => {
    const d = sampleDissimilarity(sampleData(6).rows);
    expect(() => heatmapView(d, { order: [0, 1, 2, 3, 4, 4] })).toThrow(/each of the 6 rows once/);
  });
  it('embeds the cells as one PNG image, rows in the given order', () => {
    const d = sampleDissimilarity(sampleData(12).rows);
    const svg = heatmapView(d, { order: [11, 10, 9, 8, 7, 6, 5, 4, 3, 2, 1, 0] }).svg();
    const png = Buffer.from(svg.match(/base64,([A-Za-z0-9+/=]+)/)![1], 'base64');
    expect(png.subarray(1, 4).toString()).toBe('PNG');
    expect(png.readUInt32BE(16)).toBe(12); // IHDR width
    expect(png.readUInt32BE(20)).toBe(12); // IHDR height
  });
});

describe('projectionView and screeView', () => {
  const { rows, assignment } = sampleData(30);
  it('refuses a one-component projection and a non-projection', () => {
    const p = handProjection(rows);
    const one = { ...p, scores: { ...p.scores, cols: 1, data: new Float64Array(30) } };
    expect(() => projectionView(one, assignment)).toThrow(/components: 2/);
    expect(() => screeView({ kind: 'kmeans' } as never)).toThrow(/project\(rows, \{ components \}\)/);
    expect(() => projectionView(p, assignment.slice(1))).toThrow(/29 entries/);
  });
  it('marks one centre per segment and draws one arrow per feature', () => {
    const svg = projectionView(handProjection(rows), assignment, { loadings: true }).svg();
    expect((svg.match(/r="10"/g) ?? []).length).toBe(3);
    for (const name of ['trips', 'peak share', 'weekend share', 'tenure']) expect(svg).toContain(`>${name}</text>`);
  });
});

describe('escaping: hostile strings from data never become markup', () => {
  const { views } = build(true);
  it.each(views.map((view) => [view.kind, view]))('%s', (_kind, view) => {
    for (const text of [view.fragment(), view.svg()]) {
      expect(text).not.toContain('<script>window.__pwned');
      expect(text).not.toMatch(/<img/i);
      // Only our own constant scripts: the JSON spec and the draw script, never one from data.
      const scripts = text.match(/<script[^>]*>/g) ?? [];
      expect(scripts.every((s) => s === '<script>' || s === '<script type="application/json" class="ks-spec">')).toBe(true);
      expect(scripts.length).toBeLessThanOrEqual(2);
      // No inline event handler attribute anywhere.
      expect(text).not.toMatch(/<[^>]+\son[a-z]+\s*=/i);
    }
  });
  it('the cards show the hostile title as text', () => {
    const cards = views.find((v) => v.kind === 'profile-cards')!.fragment();
    expect(cards).toContain('&lt;script&gt;window.__pwned=1&lt;/script&gt;&lt;img src=x onerror=&quot;');
  });
});

describe('notes on thinned pictures', () => {
  it('say which rows or labels are drawn in plain English ordinals', () => {
    expect([2, 3, 4, 11, 12, 13, 21, 22, 23, 101].map(everyNth)).toEqual([
      'every second', 'every third', 'every 4th', 'every 11th', 'every 12th', 'every 13th', 'every 21st', 'every 22nd', 'every 23rd', 'every 101st',
    ]); // prettier-ignore
  });
});
