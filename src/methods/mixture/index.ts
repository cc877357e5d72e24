// Gaussian mixtures fitted by EM.
export { gaussianMixture } from './gaussian-mixture';
export type { GaussianMixtureOptions } from './gaussian-mixture';
export type { GaussianMixtureResult } from './mixture-result';
export { COVARIANCE_SHAPES, parameterCount } from './covariance-shapes';
export type { CovarianceShape } from './covariance-shapes';
export type { MixtureStart } from './starts';
export { componentConstant, factorComponents, whitenedSquare } from './log-density';
