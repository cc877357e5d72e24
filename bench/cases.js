'use strict';
// The bench cases: what each tool computes, on which size, and the target kinsort must meet.
// Every kinsort call goes through the functional core of dist/ (the stable contract of DESIGN.md).

const K = 8;
const RESTARTS = 5;
const SEED = 20261202;
const PCA_COMPONENTS = 5;
const MIXTURE_RESTARTS = 3;

/** @typedef {import('./data').Kinsort} Kinsort */
/** @typedef {ReturnType<Kinsort['createMatrix']>} Matrix */
/**
 * @typedef {object} Peer one tool kinsort is timed against: a python case, an npm call or an ml-hclust method
 * @property {string} tool
 * @property {string} [python]
 * @property {object} [params]
 * @property {object} [quickParams]
 * @property {(peers: import('./npm-peers').NpmPeers, rows: number[][]) => unknown} [npm]
 * @property {string} [hclust]
 * @property {number | null} ratioMax
 * @property {number} [repeats]
 */
/**
 * @typedef {object} MainCase
 * @property {string} id
 * @property {string} title
 * @property {{ n: number, d: number }} full
 * @property {{ n: number, d: number }} quick
 * @property {number} [spread]
 * @property {boolean} [warmUp]
 * @property {string} kinsortFunction
 * @property {(ks: Kinsort, m: Matrix, set: import('./compare').BenchSet) => unknown} kinsort
 * @property {Peer[]} peers
 */

/**
 * Cases timed side by side: kinsort against each peer on the same data, in the same run.
 * @type {MainCase[]}
 */
const MAIN_CASES = [
  {
    id: 'dissimilarity',
    title: 'dissimilarity, euclidean',
    full: { n: 10_000, d: 20 },
    quick: { n: 300, d: 20 },
    kinsortFunction: 'dissimilarity',
    kinsort: (ks, m) => ks.dissimilarity(m, { metric: 'euclidean' }),
    peers: [{ tool: 'SciPy pdist', python: 'dissimilarity', params: { metric: 'euclidean' }, ratioMax: 1.0 }],
  },
  {
    id: 'kmeans',
    title: `k-means, k = ${K}, ${RESTARTS} restarts`,
    full: { n: 100_000, d: 10 },
    quick: { n: 1_000, d: 10 },
    kinsortFunction: 'kmeans',
    kinsort: (ks, m) => ks.kmeans(m, { k: K, seed: SEED, restarts: RESTARTS }),
    peers: [
      {
        tool: `scikit-learn KMeans lloyd n_init=${RESTARTS}`,
        python: 'kmeans',
        params: { k: K, restarts: RESTARTS, seed: SEED },
        ratioMax: 1.0,
      },
      {
        tool: `ml-kmeans, best of ${RESTARTS} runs`,
        npm: (peers, rows) => peers.kmeansRestarts(rows, { k: K, restarts: RESTARTS, seed: SEED }),
        ratioMax: 0.1, // at least 10× faster
        repeats: 1,
      },
    ],
  },
  {
    // Not a target case: more segments than groups in the data, so segments overlap and the
    // iterations (and the bounds' skipping) do most of the work rather than the starts.
    id: 'kmeans-overlap',
    title: 'k-means, k = 30 over 8 groups, 3 restarts',
    full: { n: 50_000, d: 10 },
    quick: { n: 1_000, d: 10 },
    kinsortFunction: 'kmeans',
    kinsort: (ks, m) => ks.kmeans(m, { k: 30, seed: SEED, restarts: 3 }),
    peers: [
      {
        tool: 'scikit-learn KMeans lloyd n_init=3',
        python: 'kmeans',
        params: { k: 30, restarts: 3, seed: SEED },
        ratioMax: null, // no target set: reported for information
      },
    ],
  },
  {
    id: 'silhouette',
    title: 'silhouette, 8 segments',
    full: { n: 10_000, d: 10 },
    quick: { n: 300, d: 10 },
    kinsortFunction: 'silhouette',
    kinsort: (ks, m, set) => ks.silhouette(m, set.labels),
    peers: [{ tool: 'scikit-learn silhouette_score', python: 'silhouette', params: {}, ratioMax: 1.0 }],
  },
  {
    id: 'ward',
    title: 'Ward from vectors',
    full: { n: 8_000, d: 10 },
    quick: { n: 300, d: 10 },
    kinsortFunction: 'agglomerate',
    kinsort: (ks, m) => ks.agglomerate(m, { method: 'ward' }),
    peers: [
      { tool: 'SciPy linkage ward', python: 'ward', params: {}, ratioMax: 1.0 },
      { tool: 'ml-hclust agnes ward', hclust: 'ward', ratioMax: 0.01 },
    ],
  },
  {
    id: 'average',
    title: 'average linkage from vectors',
    full: { n: 5_000, d: 10 },
    quick: { n: 300, d: 10 },
    kinsortFunction: 'agglomerate',
    kinsort: (ks, m) => ks.agglomerate(m, { method: 'average' }),
    peers: [
      { tool: 'SciPy linkage average', python: 'average', params: {}, ratioMax: 1.2 },
      { tool: 'ml-hclust agnes average', hclust: 'average', ratioMax: 0.01 },
    ],
  },
  {
    // Deciding k on many rows: kinsort's compareK with its defaults (k-means with 10 restarts per k,
    // silhouette on a 10,000-row sample, Calinski–Harabasz, Davies–Bouldin, the gap statistic with
    // 20 reference sets, bootstrap stability with 20 resamples per k and prediction strength over
    // five halvings) against the sweep a Python
    // user writes by hand (the same measures without the gap statistic or stability). The blobs
    // overlap (spread 6 around centres drawn in [-10, 10]^10), so the fits at k above 8 have work to do.
    id: 'k-sweep',
    title: 'choosing k from 2 to 10 (compareK defaults: gap + stability)',
    full: { n: 100_000, d: 10 },
    quick: { n: 1_000, d: 10 },
    spread: 6,
    warmUp: false, // each run takes tens of seconds: JIT warm-up is lost in the noise
    kinsortFunction: 'compareK',
    // Quick mode (CI smoke) sweeps k = 2…4 only: it checks the wiring, not the speed.
    kinsort: (ks, m) => ks.compareK(m, { from: 2, to: m.rows >= 10_000 ? 10 : 4, seed: SEED }),
    peers: [
      {
        tool: 'scikit-learn KMeans n_init=10 per k + silhouette (10,000 sampled), CH, DB',
        python: 'k-sweep',
        params: { kFrom: 2, kTo: 10, restarts: 10, silhouetteRows: 10_000, seed: SEED },
        quickParams: { kFrom: 2, kTo: 4, restarts: 10, silhouetteRows: 10_000, seed: SEED },
        ratioMax: 0.6,
      },
    ],
  },
  {
    // Gaussian mixture by EM, full covariance: kinsort and scikit-learn start the same way
    // (k-means++ centres, each row to its nearest), run the same restarts and stop on the same
    // rule (the mean per-row log-likelihood gains at most 1e-3, scikit-learn's default tol).
    id: 'mixture',
    title: `Gaussian mixture, k = ${K}, full covariance, ${MIXTURE_RESTARTS} restarts`,
    full: { n: 100_000, d: 10 },
    quick: { n: 1_000, d: 10 },
    kinsortFunction: 'gaussianMixture',
    kinsort: (ks, m) =>
      ks.gaussianMixture(m, { k: K, covariance: 'full', seed: SEED, restarts: MIXTURE_RESTARTS, start: 'k-means++', tolerance: 1e-3 }),
    peers: [
      {
        tool: `scikit-learn GaussianMixture full, init k-means++, n_init=${MIXTURE_RESTARTS}`,
        python: 'mixture',
        params: { k: K, restarts: MIXTURE_RESTARTS, seed: SEED, tolerance: 1e-3 },
        ratioMax: 1.0,
      },
    ],
  },
  {
    id: 'pca',
    title: `PCA, ${PCA_COMPONENTS} components`,
    full: { n: 100_000, d: 20 },
    quick: { n: 1_000, d: 20 },
    kinsortFunction: 'project',
    kinsort: (ks, m) => ks.project(m, { components: PCA_COMPONENTS }),
    peers: [
      {
        tool: 'scikit-learn PCA full, fit_transform',
        python: 'pca',
        params: { components: PCA_COMPONENTS },
        ratioMax: null, // no target set: reported for information
      },
    ],
  },
];

/**
 * ml-hclust is cubic in n and rebuilds its matrix each merge (about 3.5 s at n = 1,000 and 22 s at n = 2,000 here, so
 * ~20 min at n = 8,000). It runs only up to this size; above it the bench says so and why.
 */
const HCLUST_MAX_ROWS = { full: 2_000, quick: 200 }; // quick: the main cases take the skip path

/**
 * ml-hclust's own cases: kinsort against it at a size where it finishes.
 * @type {{ id: string, method: import('../src/index').LinkageMethod, full: { n: number, d: number }, quick: { n: number, d: number } }[]}
 */
const HCLUST_CASES = [
  { id: 'ward-small', method: 'ward', full: { n: 2_000, d: 10 }, quick: { n: 100, d: 10 } },
  { id: 'average-small', method: 'average', full: { n: 2_000, d: 10 }, quick: { n: 100, d: 10 } },
];

/** The memory case: Ward from vectors at n = 30,000, in its own process so peak RSS is its own. */
const MEMORY_CASE = {
  id: 'ward-memory',
  title: 'Ward from vectors, peak memory',
  full: { n: 30_000, d: 8 },
  quick: { n: 500, d: 8 },
  kinsortFunction: 'agglomerate',
  method: 'ward',
  maxMB: 2048,
  maxMs: 60_000,
};

/**
 * The larger-than-memory case: 20 million rows × 8 columns in Parquet, DuckDB capped at 600 MB and
 * 2 threads; the whole sample → refine → score → profile path in one child process.
 */
const DATABASE_CASE = {
  id: 'database-refine',
  title: 'Sample, refine in SQL, score, profile (Parquet, DuckDB capped)',
  full: { n: 20_000_000, d: 8 },
  quick: { n: 20_000, d: 8 },
  k: 8,
  sampleRows: 20_000,
  memoryLimit: '600MB',
  threads: 2,
  maxMs: 120_000,
  maxMB: 1024,
  /** Relative gap of the within-SS to in-memory Lloyd from the same start. */
  maxSSGap: 0.001,
  timeoutMs: 3_600_000,
};

/** Scaling: each main case at n, 2n and 4n (small n), giving the growth factor per doubling. */
/** @type {Record<string, { full: number, quick: number }>} */
const SCALING = {
  dissimilarity: { full: 1_000, quick: 100 },
  kmeans: { full: 25_000, quick: 250 }, // below this, fixed costs hide the growth
  silhouette: { full: 1_000, quick: 100 },
  ward: { full: 1_000, quick: 100 },
  average: { full: 1_000, quick: 100 },
  pca: { full: 25_000, quick: 200 },
};

module.exports = { MAIN_CASES, HCLUST_CASES, HCLUST_MAX_ROWS, MEMORY_CASE, DATABASE_CASE, SCALING, SEED };
