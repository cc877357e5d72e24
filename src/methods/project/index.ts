export { project, projectNew } from './pca';
export type { Projection, ProjectOptions } from './pca';
export { symmetricEigen } from './eigen';
export type { SymmetricEigen } from './eigen';
