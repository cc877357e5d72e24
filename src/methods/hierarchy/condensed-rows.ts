// Row starts of the condensed layout: pair (a, b) with a < b sits at rowStart[a] + b. Saves the
// index arithmetic in the hot loops of the matrix algorithms.
export function condensedRowStarts(n: number): Float64Array {
  const starts = new Float64Array(n);
  for (let a = 0; a < n; a++) starts[a] = n * a - (a * (a + 1)) / 2 - a - 1;
  return starts;
}
