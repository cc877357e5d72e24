// Validity measures against scikit-learn 1.2 (Debian python3-sklearn): fixture made by
// test/reference/validity_sklearn.py on Fisher's iris (1936, as scikit-learn ships it) and on
// data and label vectors of our own making (seeded, stored in the fixture).
import { describe, expect, it } from 'vitest';
import fixture from '../reference/fixtures/validity_sklearn.json';
import {
  adjustedRandIndex,
  calinskiHarabasz,
  contingencyTable,
  daviesBouldin,
  normalizedMutualInfo,
  silhouette,
  MUTUAL_INFORMATION_AVERAGES,
} from '../../src/assess';

function expectClose(actual: ArrayLike<number>, expected: readonly number[], digits = 10): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expect(actual[i]).toBeCloseTo(expected[i], digits);
}

const cases = [
  { name: 'iris, sklearn KMeans k=3 labels (Fisher 1936 via scikit-learn)', rows: fixture.iris.rows, ref: fixture.iris },
  { name: 'blobs of our own making, true labels', rows: fixture.blobs.rows, ref: fixture.blobs },
  { name: 'blobs of our own making, random labels', rows: fixture.blobs.rows, ref: fixture.blobsRandomLabels },
  { name: 'blobs of our own making, one singleton segment', rows: fixture.blobs.rows, ref: fixture.blobsSingleton },
];

describe.each(cases)('scikit-learn 1.2 validity measures: $name', ({ rows, ref }) => {
  it('silhouette per row and mean match silhouette_samples / silhouette_score', () => {
    const s = silhouette(rows, ref.assignment);
    expectClose(s.values, ref.silhouetteValues);
    expect(s.average).toBeCloseTo(ref.silhouetteAverage, 10);
  });
  it('silhouette with the Manhattan metric matches silhouette_score(metric="manhattan")', () => {
    expect(silhouette(rows, ref.assignment, { metric: 'manhattan' }).average).toBeCloseTo(ref.silhouetteManhattanAverage, 10);
  });
  it('Calinski–Harabasz matches calinski_harabasz_score', () => {
    expect(calinskiHarabasz(rows, ref.assignment) / ref.calinskiHarabasz).toBeCloseTo(1, 11);
  });
  it('Davies–Bouldin matches davies_bouldin_score', () => {
    expect(daviesBouldin(rows, ref.assignment)).toBeCloseTo(ref.daviesBouldin, 10);
  });
});

describe('scikit-learn 1.2 agreement measures on label pairs of our own making', () => {
  it.each(fixture.labelPairs.map((p, i) => ({ ...p, i })))('pair $i: ARI, NMI (all four averages), contingency', (p) => {
    expect(adjustedRandIndex(p.a, p.b)).toBeCloseTo(p.ari, 12);
    for (const average of MUTUAL_INFORMATION_AVERAGES) {
      expect(normalizedMutualInfo(p.a, p.b, { average })).toBeCloseTo(p.nmi[average], 12);
    }
    expect(normalizedMutualInfo(p.a, p.b)).toBeCloseTo(p.nmi.arithmetic, 12);
    expect(contingencyTable(p.a, p.b).counts).toEqual(p.contingency);
  });
});
