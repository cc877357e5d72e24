// Silhouette from a dissimilarity against R cluster 2.1.4: silhouette(pam(ruspini, 4)) on
// Euclidean distances (fixture by test/reference/gap_clusgap.R; Ruspini 1970 as R ships it).
// Average width 0.737 from memory; the fixture holds the value R computed.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/fixtures/gap_clusgap.json';
import { silhouette } from '../../src/assess';
import { dissimilarity } from '../../src/measure';

describe('R cluster::silhouette on pam(ruspini, 4)', () => {
  const ref = fixture.pamRuspini;
  const s = silhouette(dissimilarity(ref.rows, { metric: 'euclidean' }), ref.clustering);

  it('per-row widths and the average width match', () => {
    for (let i = 0; i < ref.widths.length; i++) expect(s.values[i]).toBeCloseTo(ref.widths[i], 12);
    expect(s.average).toBeCloseTo(ref.average, 12);
    expect(s.average).toBeCloseTo(ref.averageFromPam, 12);
  });

  it('neighbours match (R numbers segments 1..4, ours 0..3)', () => {
    expect(Array.from(s.neighbour, (c) => s.segmentLabels[c])).toEqual(ref.neighbour);
  });

  it('the same from the rows, streamed without a matrix', () => {
    expect(silhouette(ref.rows, ref.clustering).average).toBeCloseTo(ref.average, 12);
  });
});
