'use strict';
// The npm peers: ml-kmeans and ml-hclust. Both are ES modules, so they are loaded with a dynamic
// import() from this CommonJS harness. Their inputs (arrays of arrays) are built outside the timing.

const fs = require('fs');
const path = require('path');

// Their package.json is not in their "exports", so read it from the folder the module lives in.
/** @param {string} name */
function packageVersion(name) {
  const root = path.join(__dirname, '..', 'node_modules', name, 'package.json');
  return JSON.parse(fs.readFileSync(root, 'utf8')).version;
}

/**
 * @typedef {object} NpmPeers
 * @property {Record<string, string>} versions
 * @property {(rows: number[][], options: { k: number, restarts: number, seed: number }) => unknown} kmeansRestarts
 * @property {(rows: number[][], method: string) => unknown} agglomerate
 */

/** @type {NpmPeers | null} */
let loaded = null;
/** @returns {Promise<NpmPeers>} */
async function loadNpmPeers() {
  if (!loaded) {
    const [kmeansModule, hclustModule] = await Promise.all([import('ml-kmeans'), import('ml-hclust')]);
    loaded = {
      versions: {
        'ml-kmeans': packageVersion('ml-kmeans'),
        'ml-hclust': packageVersion('ml-hclust'),
      },
      /** k-means with `restarts` separate seeded runs (ml-kmeans has no restarts of its own), best kept. */
      kmeansRestarts(rows, { k, restarts, seed }) {
        /** @type {{ result: ReturnType<typeof kmeansModule.kmeans>, error: number } | null} */
        let best = null;
        for (let r = 0; r < restarts; r++) {
          const result = kmeansModule.kmeans(rows, k, { initialization: 'kmeans++', seed: seed + r });
          const error = withinSS(rows, result.clusters, result.centroids);
          if (!best || error < best.error) best = { result, error };
        }
        // restarts ≥ 1, so the loop has kept one
        return /** @type {NonNullable<typeof best>} */ (best).result;
      },
      agglomerate(rows, method) {
        // The method names are ml-hclust's own; the cases pass only 'ward' and 'average'.
        const agnesMethod = /** @type {import('ml-hclust').AgglomerationMethod} */ (method);
        return hclustModule.agnes(rows, { method: agnesMethod });
      },
    };
  }
  return loaded;
}

// Within-cluster sum of squares, to keep the best restart as scikit-learn and kinsort do.
/**
 * @param {number[][]} rows
 * @param {number[]} clusters
 * @param {number[][]} centroids
 */
function withinSS(rows, clusters, centroids) {
  let total = 0;
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i];
    const centre = centroids[clusters[i]];
    for (let j = 0; j < row.length; j++) {
      const diff = row[j] - centre[j];
      total += diff * diff;
    }
  }
  return total;
}

module.exports = { loadNpmPeers };
