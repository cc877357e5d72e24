// Hand-made inputs shaped like the method results, for the view tests and screenshots.
// Data of our own making: a seeded generator, three groups in four variables.
import { createRandom } from '../../src/random';
import { createMatrix, Matrix } from '../../src/core/matrix';
import { makeDissimilarity } from '../../src/measure/condensed';
import { agglomerate } from '../../src/methods/hierarchy';
import { silhouette } from '../../src/assess';
import { profileSegments } from '../../src/segments/profile';

export function sampleData(n = 90, seed = 11) {
  const rnd = createRandom(seed);
  const centres = [
    [0, 0, 1, 0],
    [4, 1, -1, 2],
    [1, 5, 0, -2],
  ];
  const rows: number[][] = [];
  const assignment: number[] = [];
  for (let i = 0; i < n; i++) {
    const s = i % 3;
    assignment.push(s);
    rows.push(centres[s].map((c) => c + rnd.normal()));
  }
  const ids = rows.map((_, i) => `PH-${String(1000 + i)}`);
  return { rows, assignment, ids };
}

/** A projection-shaped object: centred rows as scores on the first two variables (no rotation). */
export function handProjection(rows: number[][], names = ['trips', 'peak share', 'weekend share', 'tenure']) {
  const n = rows.length;
  const d = rows[0].length;
  const mean = Array.from({ length: d }, (_, j) => rows.reduce((a, r) => a + r[j], 0) / n);
  const scores = createMatrix(n, 2, Float64Array.from(rows.flatMap((r) => [r[0] - mean[0], r[1] - mean[1]])));
  const loadings: Matrix = createMatrix(d, 2, Float64Array.from([1, 0, 0, 1, 0.3, -0.2, -0.4, 0.5]));
  return {
    kind: 'projection' as const,
    scores,
    loadings,
    explainedVariance: [3, 2, 1, 0.5],
    explainedVarianceRatio: [0.46, 0.31, 0.15, 0.08],
    mean,
    components: 2,
    featureNames: names,
  };
}

export function sampleDissimilarity(rows: number[][], labels?: string[]) {
  const n = rows.length;
  const c = new Float64Array((n * (n - 1)) / 2);
  let t = 0;
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) c[t++] = Math.hypot(...rows[i].map((v, q) => v - rows[j][q]));
  return makeDissimilarity(n, c, 'euclidean', labels);
}

export function allViews(hostile = false) {
  const { rows, assignment, ids: plainIds } = sampleData();
  const bad = `<script>window.__pwned=1</script><img src=x onerror="window.__pwned=2">"'\``;
  const ids = hostile ? plainIds.map((id, i) => (i % 10 === 0 ? `${bad}${id}` : id)) : plainIds;
  const tree = agglomerate(rows, { method: 'ward' });
  const treeWithLabels = { ...tree, labels: ids, cut: tree.cut.bind(tree) };
  const sil = silhouette(rows, assignment);
  const profiles = profileSegments({
    assignment,
    features: rows,
    ids,
    used: {
      [hostile ? `trips ${bad}` : 'trips per week']: rows.map((r) => r[0]),
      'peak share': rows.map((r) => r[1]),
      'weekend share': rows.map((r) => r[2]),
      fare: rows.map((r, i) => (hostile && i % 5 === 0 ? bad : r[3] > 0.5 ? 'student' : i % 4 === 0 ? 'senior' : 'standard')),
    },
    keep: { tenure: rows.map((r) => Math.round(Math.abs(r[3]) * 100) / 10), zone: rows.map((_, i) => (i % 3 === 0 ? 'north' : 'south')) },
    stability: { jaccard: [0.91, 0.74, 0.52], reading: ['stable', 'doubtful', 'unstable'] },
    names: {
      1: { title: hostile ? bad : 'Daily commuters', text: hostile ? bad : 'Ride most weekdays, at peak times, on standard fares.' },
      2: { title: 'Weekend explorers', text: 'Fewer, longer trips; many at weekends.' },
    },
  });
  const comparison = {
    table: [2, 3, 4, 5, 6].map((k) => ({
      k,
      withinSS: 900 / k + (k === 3 ? -80 : 0),
      silhouette: k === 3 ? 0.61 : 0.45 - 0.02 * k,
      calinskiHarabasz: k === 3 ? 210 : 150 - k * 5,
      daviesBouldin: k === 3 ? 0.55 : 0.9 + 0.03 * k,
      gap: 0.5 + Math.min(k, 3) * 0.2 - (k > 3 ? 0.02 * k : 0),
      gapSE: 0.04,
      stabilityBySegment: Array.from({ length: k }, (_, s) => (k <= 3 ? 0.97 - 0.02 * s : 0.9 - 0.1 * s)),
      get stability() {
        return this.stabilityBySegment.reduce((a, b) => a + b, 0) / k;
      },
      get weakestStability() {
        return Math.min(...this.stabilityBySegment);
      },
    })),
    recommended: 3,
    headline: "k = 3 recommended: every segment stable, the gap statistic's pick, where the within-SS also bends",
    reasons: [
      'Silhouette, Calinski–Harabasz and Davies–Bouldin all favour k = 3.',
      'The gap statistic first reaches within one SE of the next k at k = 3.',
    ],
    byCriterion: { silhouette: 3, calinskiHarabasz: 3, daviesBouldin: 3, gap: 3, knee: 3, stability: 3 },
  };
  const projection = handProjection(rows);
  return {
    rows,
    assignment,
    ids,
    tree: treeWithLabels,
    sil,
    profiles,
    comparison,
    projection,
    dissimilarity: sampleDissimilarity(rows, ids),
  };
}
