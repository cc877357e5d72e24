// Kneedle (Satopää, Albrecht, Irwin & Raghavan 2011): the knee of a curve is where it departs most
// from the straight line joining its ends, after both axes are scaled to [0, 1]. A local maximum
// of that difference counts as a knee once the difference then falls below
// (local maximum − sensitivity × mean x step) before another local maximum is reached.
import { KinsortError, checkChoice } from '../core/errors';
import { checkNumber, checkOptions } from '../core/options';

export const KNEE_DIRECTIONS = ['decreasing', 'increasing'] as const;
export const KNEE_CURVES = ['convex', 'concave'] as const;

export interface FindKneeOptions {
  /** Whether the values fall or rise with x. Default 'decreasing' (a within-SS curve). */
  direction?: (typeof KNEE_DIRECTIONS)[number];
  /** Shape of the curve. Default 'convex' (a within-SS curve bends up). */
  curve?: (typeof KNEE_CURVES)[number];
  /** Kneedle's S: larger asks for a more pronounced knee. Default 1 (the paper's choice offline). */
  sensitivity?: number;
}

export interface KneeResult {
  /** The x at the knee, or null when the curve has none (too short, or too straight). */
  readonly knee: number | null;
  /** The difference curve, one value per point, in [−1, 1]. */
  readonly normalizedDifference: number[];
}

export function findKnee(xs: ArrayLike<number>, values: ArrayLike<number>, options?: FindKneeOptions): KneeResult {
  const where = 'findKnee';
  const opts = checkOptions(options, ['direction', 'curve', 'sensitivity'], where);
  const direction = checkChoice(opts.direction ?? 'decreasing', KNEE_DIRECTIONS, `${where} direction`);
  const curve = checkChoice(opts.curve ?? 'convex', KNEE_CURVES, `${where} curve`);
  const sensitivity = checkNumber(opts.sensitivity ?? 1, `${where}: sensitivity`, 0);
  if (!isArrayLike(xs) || !isArrayLike(values)) {
    throw new KinsortError(
      `${where}: give the x values and the curve values as two lists of numbers, e.g. findKnee([2, 3, 4], [90, 40, 35]).`,
      'bad-argument',
    );
  }
  const n = xs.length;
  if (values.length !== n) {
    throw new KinsortError(`${where}: ${n} x values but ${values.length} curve values; give one value per x.`, 'bad-input');
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(xs[i]) || !Number.isFinite(values[i])) {
      throw new KinsortError(`${where}: point ${i + 1} is (${xs[i]}, ${values[i]}); only finite numbers can be used.`, 'not-finite');
    }
    if (i > 0 && !(xs[i] > xs[i - 1])) {
      throw new KinsortError(`${where}: x values must increase; point ${i + 1} has x = ${xs[i]} after ${xs[i - 1]}.`, 'bad-input');
    }
  }
  if (n < 3) return { knee: null, normalizedDifference: Array.from({ length: n }, () => 0) };
  const x0 = xs[0];
  const xSpan = xs[n - 1] - x0;
  let yMin = Infinity;
  let yMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (values[i] < yMin) yMin = values[i];
    if (values[i] > yMax) yMax = values[i];
  }
  const ySpan = yMax - yMin;
  const difference: number[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const xn = (xs[i] - x0) / xSpan;
    const yn = ySpan > 0 ? (values[i] - yMin) / ySpan : 0;
    // Flip the curve so that its knee is a maximum of the difference, as for a rising concave curve.
    if (direction === 'increasing') difference[i] = curve === 'concave' ? yn - xn : xn - yn;
    else difference[i] = curve === 'convex' ? 1 - xn - yn : xn + yn - 1;
  }
  const meanStep = 1 / (n - 1); // x is scaled to [0, 1]
  let candidate = -1;
  let threshold = -Infinity;
  for (let i = 1; i < n; i++) {
    const isLocalMax = i < n - 1 && difference[i] > difference[i - 1] && difference[i] >= difference[i + 1];
    if (isLocalMax) {
      candidate = i;
      threshold = difference[i] - sensitivity * meanStep;
      continue;
    }
    if (candidate >= 0 && difference[i] < threshold) {
      return { knee: xs[candidate], normalizedDifference: difference };
    }
  }
  return { knee: null, normalizedDifference: difference };
}

function isArrayLike(value: unknown): value is ArrayLike<number> {
  return Array.isArray(value) || ArrayBuffer.isView(value);
}
