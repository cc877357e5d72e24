// A user calling a step on the wrong object (a study not yet prepared, a tree not yet cut, a
// segmentation asked for its dendrogram) gets a KinsortError naming the call to make instead,
// not "x.kmeans is not a function".
import { describe, expect, it } from 'vitest';
import { study, KinsortError } from '../../src';

const records = Array.from({ length: 12 }, (_, i) => ({ id: `r${i + 1}`, a: (i % 3) * 5 + i * 0.1, b: (i % 2) * 3 - i * 0.05 }));

function thrown(fn: () => unknown): KinsortError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(KinsortError);
    return e as KinsortError;
  }
  throw new Error('expected a KinsortError, nothing was thrown');
}

// Past the compiler (plain JavaScript, or an `any`), the marker members are callable and throw.
const loose = (x: unknown) => x as Record<string, (...args: unknown[]) => unknown>;

describe('calls asked of the wrong kind of object', () => {
  it('a study not yet prepared says to call .prepare() first, for every method', () => {
    const s = study(records, { id: 'id' });
    for (const name of ['kmeans', 'kmedoids', 'agglomerate', 'compareK', 'dissimilarity', 'project']) {
      const e = thrown(() => loose(s)[name]({ k: 2 }));
      expect(e.message).toContain(`${name}: this study is not prepared yet`);
      expect(e.message).toContain('.prepare(');
    }
    // The guards do not hide the real thing once prepared.
    expect(s.prepare().kmeans({ k: 2, seed: 1 }).k).toBe(2);
  });

  it('an uncut hierarchy says to cut it first, naming both kinds of cut', () => {
    const tree = study(records, { id: 'id' }).prepare().agglomerate({ method: 'ward' });
    for (const name of ['cards', 'projection', 'silhouette', 'name', 'definition', 'writeUp', 'members']) {
      const e = thrown(() => loose(tree)[name](1));
      expect(e.message).toContain(`${name}: a hierarchy is a tree of 12 rows`);
      expect(e.message).toContain(`tree.cut({ k: 4 }).${name}(`);
      expect(e.message).toContain('tree.cut({ height');
    }
    expect(tree.cut({ k: 3 }).cards().kind).toBeTruthy();
  });

  it('a segmentation asked for hierarchy views names the hierarchy call, with its own k', () => {
    const prepared = study(records, { id: 'id' }).prepare();
    const km = prepared.kmeans({ k: 3, seed: 2 });
    const e = thrown(() => loose(km).dendrogram({ k: 3 }));
    expect(e.message).toContain('this is a kmeans segmentation (k = 3)');
    expect(e.message).toContain("prepared.agglomerate({ method: 'ward' })");
    expect(e.message).toContain('tree.dendrogram({ k: 3 })');
    const cut = prepared.agglomerate({ method: 'average' }).cut({ k: 2 });
    const e2 = thrown(() => loose(cut).heatmap());
    expect(e2.message).toContain('cut from a hierarchy (k = 2)');
    expect(e2.message).toContain('tree.heatmap(');
  });

  it('the guards stay out of the way: not enumerable, not own properties of results', () => {
    const s = study(records, { id: 'id' });
    expect(Object.keys(s)).not.toContain('kmeans');
    const seg = s.prepare().kmeans({ k: 2, seed: 1 });
    expect(Object.keys(seg)).not.toContain('dendrogram');
    expect(JSON.stringify(Object.keys(seg))).not.toContain('cut');
  });
});
