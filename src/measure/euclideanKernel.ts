// The euclidean / squared euclidean pair kernel over all pairs of a row range.

/**
 * Euclidean or squared euclidean, summing squared differences directly (as SciPy does) so
 * precision near 0 is kept and identical rows give exactly 0. Rows are taken two at a time
 * against four later rows: eight independent sums keep the floating-point adder busy (one
 * running sum waits on itself) and each loaded value serves several pairs, while every pair is
 * still summed in column order. Writes the pairs of rows iFrom..iTo−1 only, so several threads
 * can share one output. Self-contained (no imports): its source is also run inside a worker.
 */
export function squaredDifferencesRows(
  data: Float64Array,
  n: number,
  d: number,
  out: Float64Array,
  root: boolean,
  iFrom: number,
  iTo: number,
): void {
  // Rows come in pairs (i, i+1): iFrom must be even.
  for (let i = iFrom; i < iTo && i + 1 < n; i += 2) {
    const a0 = i * d;
    const a1 = a0 + d;
    // Starts of rows i and i+1 in the condensed array: n·i − i(i+1)/2.
    let k0 = n * i - (i * (i + 1)) / 2;
    let k1 = k0 + (n - i - 1);
    out[k0++] = finish(pairSum(data, a0, a1, d), root);
    let j = i + 2;
    for (; j + 3 < n; j += 4) {
      const b0 = j * d;
      const b1 = b0 + d;
      const b2 = b1 + d;
      const b3 = b2 + d;
      let s00 = 0, s01 = 0, s02 = 0, s03 = 0; // prettier-ignore
      let s10 = 0, s11 = 0, s12 = 0, s13 = 0; // prettier-ignore
      for (let t = 0; t < d; t++) {
        const x = data[a0 + t];
        const y = data[a1 + t];
        const v0 = data[b0 + t];
        const v1 = data[b1 + t];
        const v2 = data[b2 + t];
        const v3 = data[b3 + t];
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
      if (root) {
        out[k0] = Math.sqrt(s00);
        out[k0 + 1] = Math.sqrt(s01);
        out[k0 + 2] = Math.sqrt(s02);
        out[k0 + 3] = Math.sqrt(s03);
        out[k1] = Math.sqrt(s10);
        out[k1 + 1] = Math.sqrt(s11);
        out[k1 + 2] = Math.sqrt(s12);
        out[k1 + 3] = Math.sqrt(s13);
      } else {
        out[k0] = s00;
        out[k0 + 1] = s01;
        out[k0 + 2] = s02;
        out[k0 + 3] = s03;
        out[k1] = s10;
        out[k1 + 1] = s11;
        out[k1 + 2] = s12;
        out[k1 + 3] = s13;
      }
      k0 += 4;
      k1 += 4;
    }
    for (; j < n; j++) {
      const bj = j * d;
      out[k0++] = finish(pairSum(data, a0, bj, d), root);
      out[k1++] = finish(pairSum(data, a1, bj, d), root);
    }
  }
}

export function pairSum(data: Float64Array, a: number, b: number, d: number): number {
  let s = 0;
  for (let t = 0; t < d; t++) {
    const e = data[a + t] - data[b + t];
    s += e * e;
  }
  return s;
}

export function finish(sum: number, root: boolean): number {
  return root ? Math.sqrt(sum) : sum;
}
