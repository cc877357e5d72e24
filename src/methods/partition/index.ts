// Partitioning methods: k-means (full batch and mini-batch) and k-medoids (PAM).
export { kmeans } from './kmeans';
export type { KmeansOptions, KmeansResult, KmeansStart } from './kmeans';
export { kmedoids } from './kmedoids';
export type { KmedoidsOptions, KmedoidsResult } from './kmedoids';
export { kmeansMiniBatch } from './minibatch';
export type { KmeansMiniBatchOptions } from './minibatch';
