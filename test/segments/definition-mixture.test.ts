// The highest-posterior rule of a mixture definition: built from a fluent mixture, it reproduces
// every training row's segment, scores new rows in memory with their posterior probability, the
// file reads back byte for byte, and tampering is refused naming the field.
import { describe, expect, it } from 'vitest';
import { loadDefinition, study } from '../../src';
import { refusal } from '../reliability/helpers';
import { riders } from './definition-data';

const records = riders(160, 23);
const prepared = study(records, {
  id: 'rider',
  use: ['trips', 'peak', 'tenure', 'band'],
  keep: ['postcode'],
  ordinalLevels: { band: ['low', 'mid', 'high'] },
}).prepare({
  missing: 'median',
});
const seg = prepared.mixture({ k: 3, seed: 2, restarts: 3 });
const def = seg.definition();
const text = def.toJSON();

type Json = Record<string, any>;
function edited(edit: (d: Json) => void): string {
  const d = JSON.parse(text);
  edit(d);
  return JSON.stringify(d);
}

describe('mixture definitions', () => {
  it('store the rule, the weights and the lower-triangle factors; the rule reproduces every training row', () => {
    const d = JSON.parse(text);
    expect(d.rule).toBe('highest-posterior');
    expect(d.metric).toBe('mahalanobis');
    expect(d.method.name).toBe('mixture');
    const dims = d.features.length;
    for (const s of d.segments) {
      expect(s.whitening).toHaveLength(dims);
      s.whitening.forEach((row: number[], j: number) => expect(row).toHaveLength(j + 1));
    }
    expect(d.segments.reduce((a: number, s: Json) => a + s.weight, 0)).toBeCloseTo(1, 12);
    expect(d.training.reproducedRows).toBe(d.training.rows);
    expect(loadDefinition(text).toJSON()).toBe(text);
  });

  it('assign gives the training rows their segments, with the posterior probabilities of the fit', () => {
    const out = def.assign(records);
    const table = seg.membership();
    expect(out.rows).toHaveLength(records.length);
    for (const [i, row] of out.rows.entries()) {
      expect(row.segment).toBe(seg.segments[i]);
      expect(row.probability).toBeCloseTo(table.top[i], 9);
      expect(row.distance).toBeGreaterThanOrEqual(0);
    }
  });

  it('the probabilities agree with the Gaussian densities written out by hand', () => {
    // The stored rule against the textbook formula with Σ⁻¹ = Wᵀ W: same segment and probability.
    const d = JSON.parse(text);
    const dims = d.features.length;
    const x = Array.from(seg.data.matrix.data.subarray(0, dims));
    const dens = d.segments.map((s: Json) => {
      const W: number[][] = s.whitening;
      const diff = x.map((v, j) => v - s.center[j]);
      let q = 0;
      let logDet = 0;
      for (let j = 0; j < dims; j++) {
        let z = 0;
        for (let l = 0; l <= j; l++) z += W[j][l] * diff[l];
        q += z * z;
        logDet += Math.log(W[j][j]);
      }
      return (s.weight * Math.exp(logDet - 0.5 * q)) / Math.pow(2 * Math.PI, dims / 2);
    });
    const total = dens.reduce((a: number, b: number) => a + b, 0);
    const best = dens.indexOf(Math.max(...dens));
    const row = def.assign(records.slice(0, 1)).rows[0];
    expect(row.segment).toBe(best + 1);
    expect(row.probability).toBeCloseTo(dens[best] / total, 12);
  });

  it('refuses tampering, naming the field', () => {
    refusal(() => loadDefinition(edited((d) => (d.segments[1].weight = -0.2))), 'segments[1]', '"weight"');
    refusal(() => loadDefinition(edited((d) => (d.segments[0].weight = d.segments[0].weight / 2))), 'weight', 'add up to');
    refusal(() => loadDefinition(edited((d) => (d.segments[0].whitening[1][1] = 0))), 'segments[0].whitening[1]', 'positive definite');
    refusal(() => loadDefinition(edited((d) => (d.segments[2].whitening[2][0] = 'x'))), 'segments[2].whitening[2]', 'finite');
    refusal(() => loadDefinition(edited((d) => d.segments[0].whitening[1].push(0))), 'segments[0].whitening[1]', 'lower triangle');
    refusal(() => loadDefinition(edited((d) => d.segments[0].whitening.pop())), 'segments[0]', '"whitening"', 'rows');
    refusal(() => loadDefinition(edited((d) => delete d.segments[1].whitening)), 'segments[1]', '"whitening"');
    refusal(() => loadDefinition(edited((d) => delete d.segments[1].weight)), 'segments[1]', '"weight"');
    refusal(() => loadDefinition(edited((d) => (d.metric = 'euclidean'))), 'metric', 'mahalanobis');
    refusal(() => loadDefinition(edited((d) => (d.rule = 'nearest-center'))), 'metric');
    refusal(
      () =>
        loadDefinition(
          edited((d) => {
            d.rule = 'nearest-center';
            d.metric = 'euclidean';
          }),
        ),
      'segments[0]',
      'only highest-posterior',
    );
    refusal(() => loadDefinition(edited((d) => (d.segments[0].center[0] = null))), 'segments[0].center');
  });
});

describe('the fluent mixture', () => {
  it('gives a segmentation with memberships, uncertain rows marked in the projection, cards, rules and stability', () => {
    const table = seg.membership();
    expect(table.probabilities).toHaveLength(records.length * 3);
    expect(table.of(records[0].rider)).toHaveLength(3);
    const projection = seg.projection().html();
    const uncertain = Array.from(table.uncertain).filter((u) => u === 1).length;
    if (uncertain > 0) expect(projection).toContain('Open rings');
    expect(seg.cards().html()).toContain('<svg');
    expect(seg.profiles()[0].rule?.name).toBe('highest-posterior');
    expect(seg.rules().agreement.overall).toBeGreaterThan(0.5);
    const stability = seg.stability({ resamples: 4, seed: 1 });
    expect(stability.jaccard).toHaveLength(3);
    expect(seg.describeMethod()).toContain('Gaussian mixture');
    expect(() => prepared.kmeans({ k: 3 }).membership()).toThrow(/probabilities/);
  });
});
