// Where EM starts: hard memberships from k-means++ centres (each row to its nearest seed), or from
// a k-means fit (one Lloyd run from k-means++ seeds). The first M-step turns them into weights,
// means and covariances.
import type { Matrix } from '../../core/matrix';
import type { Random } from '../../random';
import { kmeans } from '../partition';
import { seedPlusPlus } from '../partition/seeding';
import { distancesToPoint } from '../../measure/squared-distance';

export type MixtureStart = 'k-means++' | 'k-means';
export const MIXTURE_STARTS: readonly MixtureStart[] = ['k-means++', 'k-means'];

/** One-hot memberships (n × k) for the start's segments. */
export function startingMembership(m: Matrix, k: number, start: MixtureStart, random: Random): Float64Array {
  const { rows: n, cols: d, data } = m;
  let segment: Int32Array;
  if (start === 'k-means') {
    segment = kmeans(m, { k, seed: random.uint32(), restarts: 1, refine: false }).assignment;
  } else {
    const centres = new Float64Array(k * d);
    seedPlusPlus(data, n, d, k, random, centres);
    segment = new Int32Array(n);
    const best = new Float64Array(n).fill(Infinity);
    const dist = new Float64Array(n);
    for (let c = 0; c < k; c++) {
      distancesToPoint(data, d, 0, n, centres, c * d, dist);
      for (let i = 0; i < n; i++) {
        if (dist[i] < best[i]) {
          best[i] = dist[i];
          segment[i] = c;
        }
      }
    }
  }
  const resp = new Float64Array(n * k);
  for (let i = 0; i < n; i++) resp[i * k + segment[i]] = 1;
  return resp;
}
