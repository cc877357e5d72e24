// The squared Euclidean distance, the one home of its loop: one pair, and the blocked forms the
// k-means passes use (four pairs, two rows by four others, every row of a range to one centre).
// Every distance is summed in column order from 0 with a separate multiply and add, so a blocked
// form gives bit for bit the number the single-pair form gives (the WebAssembly kernels of
// k-means follow the same rule, and their tests compare against these loops).

/** Σ (a[ao + t] − b[bo + t])² over t < d, in column order. */
export function squaredDistance(a: Float64Array, ao: number, b: Float64Array, bo: number, d: number): number {
  let s = 0;
  for (let t = 0; t < d; t++) {
    const diff = a[ao + t] - b[bo + t];
    s += diff * diff;
  }
  return s;
}

/**
 * Four squared distances at once, between rows of `a` (from a0 … a3) and rows of `b` (from
 * b0 … b3), into out[0..3]: four independent sums keep the adder busy where one would wait on
 * it at every column, and each is still summed in column order (the same number as alone).
 */
export function fourDistances(
  a: Float64Array,
  a0: number,
  a1: number,
  a2: number,
  a3: number,
  b: Float64Array,
  b0: number,
  b1: number,
  b2: number,
  b3: number,
  d: number,
  out: Float64Array,
): void {
  // prettier-ignore
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0; // prettier-ignore
  for (let j = 0; j < d; j++) {
    let e = a[a0 + j] - b[b0 + j];
    s0 += e * e;
    e = a[a1 + j] - b[b1 + j];
    s1 += e * e;
    e = a[a2 + j] - b[b2 + j];
    s2 += e * e;
    e = a[a3 + j] - b[b3 + j];
    s3 += e * e;
  }
  out[0] = s0;
  out[1] = s1;
  out[2] = s2;
  out[3] = s3;
}

/**
 * Squared distances of the rows at a0 and a1 to the four rows of `others` from b0 on, into
 * out[0..3] and out[4..7]. Eight independent sums keep the adder busy and each loaded value
 * serves several pairs, while every distance is still summed in column order.
 */
export function twoByFour(
  rows: Float64Array,
  a0: number,
  a1: number,
  others: Float64Array,
  b0: number,
  d: number,
  out: Float64Array,
): void {
  const b1 = b0 + d;
  const b2 = b1 + d;
  const b3 = b2 + d;
  let s00 = 0, s01 = 0, s02 = 0, s03 = 0; // prettier-ignore
  let s10 = 0, s11 = 0, s12 = 0, s13 = 0; // prettier-ignore
  for (let j = 0; j < d; j++) {
    const x = rows[a0 + j];
    const y = rows[a1 + j];
    const v0 = others[b0 + j];
    const v1 = others[b1 + j];
    const v2 = others[b2 + j];
    const v3 = others[b3 + j];
    let e = x - v0;
    s00 += e * e;
    e = x - v1;
    s01 += e * e;
    e = x - v2;
    s02 += e * e;
    e = x - v3;
    s03 += e * e;
    e = y - v0;
    s10 += e * e;
    e = y - v1;
    s11 += e * e;
    e = y - v2;
    s12 += e * e;
    e = y - v3;
    s13 += e * e;
  }
  out[0] = s00;
  out[1] = s01;
  out[2] = s02;
  out[3] = s03;
  out[4] = s10;
  out[5] = s11;
  out[6] = s12;
  out[7] = s13;
}

const quad = new Float64Array(4);

/**
 * Squared distance of rows [lo, hi) (n × d, row-major) to the one point at `point[at..at + d)`,
 * into out[i], four rows at a time (fourDistances).
 */
export function distancesToPoint(
  rows: Float64Array,
  d: number,
  lo: number,
  hi: number,
  point: Float64Array,
  at: number,
  out: Float64Array,
): void {
  let i = lo;
  for (; i + 3 < hi; i += 4) {
    const b0 = i * d;
    fourDistances(rows, b0, b0 + d, b0 + 2 * d, b0 + 3 * d, point, at, at, at, at, d, quad);
    for (let q = 0; q < 4; q++) out[i + q] = quad[q];
  }
  for (; i < hi; i++) out[i] = squaredDistance(rows, i * d, point, at, d);
}
