// The work an agglomeration will take, said before it starts. Every route is quadratic in the
// rows: the nearest-neighbour chain and Prim's tree compare each row with the active clusters
// about twice over (Müllner 2011), so a 200,000-row Ward hierarchy is some 4e10 distance
// evaluations, minutes on two cores. The first progress event carries this sentence.

export interface AgglomerationWork {
  /** Rows (leaves). */
  readonly rows: number;
  /** Pair distances evaluated, roughly: n² (two passes over n(n-1)/2 pairs). */
  readonly distanceEvaluations: number;
  /** Multiply-adds, roughly: distance evaluations × coordinates (rows) or × 1 (a matrix). */
  readonly operations: number;
  /** The estimate in words. */
  readonly summary: string;
}

const sci = (x: number) => (x < 1e6 ? Math.round(x).toLocaleString('en-US') : x.toExponential(1).replace('e+', 'e'));

export function agglomerationWork(rows: number, coordinates: number, method: string): AgglomerationWork {
  const distanceEvaluations = rows * rows;
  const operations = distanceEvaluations * Math.max(1, coordinates);
  return {
    rows,
    distanceEvaluations,
    operations,
    summary:
      `${method} linkage on ${rows.toLocaleString('en-US')} rows: about ${sci(distanceEvaluations)} distance evaluations ` +
      `(${sci(operations)} multiply-adds); the work grows with the square of the rows` +
      (operations > 1e11 ? ', so expect minutes; a sample or k-means is far quicker' : ''),
  };
}
