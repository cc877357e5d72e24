// Checks of the optional "trainingDistributions" key of a definition file (see
// training-distributions.ts): one entry per feature, increasing cuts, shares that sum to 1.
import { KinsortError } from '../core/errors';
import type { FeatureDistribution, TrainingDistributions } from './training-distributions';

function fail(where: string, message: string): never {
  throw new KinsortError(`${where}: ${message}`, 'bad-definition');
}

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

export function checkTrainingDistributions(raw: unknown, dims: number, where: string): TrainingDistributions {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) fail(where, 'expected an object with "features" and "farShare".');
  const d = raw as Record<string, unknown>;
  for (const key of Object.keys(d))
    if (key !== 'features' && key !== 'farShare') fail(where, `unknown key "${key}". Keys allowed here: features, farShare.`);
  if (!finite(d.farShare) || d.farShare < 0 || d.farShare > 1) fail(where, 'key "farShare" must be a share between 0 and 1.');
  if (!Array.isArray(d.features) || d.features.length !== dims) {
    fail(where, `key "features" must hold one entry per prepared feature (${dims}).`);
  }
  const features: FeatureDistribution[] = d.features.map((f: unknown, j: number) => {
    const at = `${where}.features[${j}]`;
    const e = (f ?? {}) as Record<string, unknown>;
    if (!Array.isArray(e.cuts) || !e.cuts.every(finite)) fail(at, 'key "cuts" must be an array of finite numbers.');
    if (!Array.isArray(e.shares) || !e.shares.every(finite)) fail(at, 'key "shares" must be an array of finite numbers.');
    const cuts = e.cuts as number[];
    const shares = e.shares as number[];
    for (let b = 1; b < cuts.length; b++)
      if (!(cuts[b] > cuts[b - 1])) fail(at, `cuts must increase (cut ${b + 1} is not above cut ${b}).`);
    if (shares.length !== cuts.length + 1) fail(at, `has ${shares.length} shares for ${cuts.length} cuts; expected ${cuts.length + 1}.`);
    const total = shares.reduce((a, b) => a + b, 0);
    if (shares.some((v) => v < 0) || Math.abs(total - 1) > 1e-9) fail(at, `shares must be ≥ 0 and sum to 1 (they sum to ${total}).`);
    return { cuts: cuts.slice(), shares: shares.slice() };
  });
  return { features, farShare: d.farShare };
}
