// The fluent mixture step: a Gaussian mixture on the prepared rows, handed over as a Segmentation
// whose definition stores the highest-posterior rule.
import { checkNumber, checkOptions } from '../core/options';
import type { ProgressCallback } from '../core/progress';
import { gaussianMixture, type GaussianMixtureOptions } from '../methods/mixture';
import type { PreparedData } from '../prepare';
import { UNCERTAIN_BELOW } from './mixture-parts';
import { Segmentation } from './segmentation';

export interface StudyMixtureOptions extends Omit<GaussianMixtureOptions, 'onProgress'> {
  /** Rows whose highest membership probability is below this are shown as uncertain (default 0.8). */
  uncertainBelow?: number;
  onProgress?: ProgressCallback;
}

const OPTIONS = [
  'k',
  'covariance',
  'seed',
  'restarts',
  'start',
  'maxIterations',
  'tolerance',
  'varianceFloor',
  'uncertainBelow',
  'onProgress',
];

/** Fluent default: 5 restarts (the functional core's default is 1). */
export const STUDY_MIXTURE_RESTARTS = 5;

export function fitMixture(data: PreparedData, options: StudyMixtureOptions, onProgress: ProgressCallback | undefined): Segmentation {
  const opts = checkOptions(options, OPTIONS, 'mixture');
  const uncertainBelow = checkNumber(opts.uncertainBelow ?? UNCERTAIN_BELOW, 'mixture: uncertainBelow', 0, 1);
  const { uncertainBelow: _drop, onProgress: _given, ...core } = opts;
  const fit = gaussianMixture(data.matrix, { ...core, restarts: core.restarts ?? STUDY_MIXTURE_RESTARTS, onProgress });
  const notes: string[] = [];
  if (!fit.converged) notes.push(`EM stopped at maxIterations (${fit.iterations}) before the log-likelihood settled; raise maxIterations.`);
  const options_: Record<string, unknown> = {
    k: fit.k,
    covariance: fit.covariance,
    seed: core.seed ?? 0,
    restarts: fit.restartsRun,
    start: fit.start,
    varianceFloor: fit.varianceFloor,
  };
  if (core.maxIterations !== undefined) options_.maxIterations = core.maxIterations;
  if (core.tolerance !== undefined) options_.tolerance = core.tolerance;
  return new Segmentation({
    method: 'mixture',
    options: options_,
    assignment: fit.assignment,
    centers: fit.means,
    fit,
    objective: { name: 'bic', value: fit.bic },
    data,
    notes,
    mixture: {
      covariance: fit.covariance,
      weights: fit.weights,
      covariances: fit.covariances,
      membership: fit.membership,
      uncertainBelow,
    },
  });
}
