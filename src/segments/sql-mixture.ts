// The highest-posterior rule as SQL layers (after the prepared features): the whitened
// differences z, the squared Mahalanobis distances q, the costs, the least cost, and the row's
// segment, distance, far flag and posterior probability — term for term the arithmetic of
// mixture-rule.ts, so that the SQL and assign agree on every row.
import type { SqlDialect } from '../engines/dialect';
import type { SegmentDefinition } from './definition-types';
import { COST_WITHOUT_PROBABILITY, EXP_ZERO_BELOW, mixtureFigures } from './mixture-rule';

export interface SqlLayer {
  name: string;
  columns: string[];
}

/**
 * `f(j)` names prepared feature j; `big`, when given, is the column that flags a row with a
 * feature beyond the dialect's bound (its distances become NULL, as for the other rules).
 */
export function mixtureLayers(
  definition: SegmentDefinition,
  d: SqlDialect,
  id: string,
  f: (j: number) => string,
  big: string | undefined,
  prefix: string,
): { layers: SqlLayer[]; final: SqlLayer } {
  const q = (name: string) => d.quoteIdentifier(`${prefix}${name}`);
  const dims = definition.features.length;
  const figures = mixtureFigures(definition.segments, dims);
  const k = figures.k;
  const z = (c: number, j: number) => q(`z_${c + 1}_${j + 1}`);
  const square = (c: number) => q(`q_${c + 1}`);
  const cost = (c: number) => q(`cost_${c + 1}`);
  const least = q('least');
  const segment = q('segment');
  const lit = (x: number) => d.doubleLiteral(x);

  // z_c,j = Σ_{l ≤ j, W ≠ 0} (f_l − μ_c,l) · W_c,jl, added in order of l.
  const whitened: SqlLayer = { name: `${prefix}whitened`, columns: [id] };
  for (let c = 0; c < k; c++) {
    for (let j = 0; j < dims; j++) {
      const terms: string[] = [];
      for (let l = 0; l <= j; l++) {
        const w = figures.whitening[c * dims * dims + j * dims + l];
        if (w === 0) continue;
        terms.push(d.mul(`(${d.sub(f(l), figures.means[c * dims + l])})`, w));
      }
      const sum = terms.length === 0 ? lit(0) : terms.join(' + ');
      whitened.columns.push(`${big === undefined ? sum : `CASE WHEN ${big} = 0 THEN ${sum} END`} AS ${z(c, j)}`);
    }
  }
  // q_c = Σ_j z_c,j², then cost_c = q_c · 0.5 − constant_c.
  const squares: SqlLayer = {
    name: `${prefix}squares`,
    columns: [
      id,
      ...Array.from(
        { length: k },
        (_, c) => `${Array.from({ length: dims }, (_, j) => d.square(`(${z(c, j)})`)).join(' + ')} AS ${square(c)}`,
      ),
    ],
  };
  const costs: SqlLayer = {
    name: `${prefix}costs`,
    columns: [
      id,
      ...Array.from({ length: k }, (_, c) => square(c)),
      ...Array.from({ length: k }, (_, c) => `${d.sub(`(${d.mul(square(c), 0.5)})`, figures.constant[c])} AS ${cost(c)}`),
    ],
  };
  const costNames = Array.from({ length: k }, (_, c) => cost(c));
  const leastLayer: SqlLayer = {
    name: `${prefix}lowest`,
    columns: [id, ...Array.from({ length: k }, (_, c) => square(c)), ...costNames, `${d.least(costNames)} AS ${least}`],
  };
  const chosen: SqlLayer = {
    name: `${prefix}chosen`,
    columns: [
      id,
      ...Array.from({ length: k }, (_, c) => square(c)),
      ...costNames,
      least,
      `${d.firstEqual(costNames, least)} AS ${segment}`,
    ],
  };
  const limit = (c: number) => lit(definition.segments[c].farBeyond * definition.segments[c].farBeyond);
  // e^(least − cost_c), 0 below EXP_ZERO_BELOW (as assign; PostgreSQL refuses an exp that underflows).
  const share = (c: number) =>
    `CASE WHEN ${least} - ${cost(c)} < ${lit(EXP_ZERO_BELOW)} THEN ${lit(0)} ELSE exp(${least} - ${cost(c)}) END`;
  const final: SqlLayer = {
    name: '',
    columns: [
      id,
      `${segment} AS ${d.quoteIdentifier('segment')}`,
      `CASE ${Array.from({ length: k }, (_, c) => `WHEN ${segment} = ${c + 1} THEN sqrt(${square(c)})`).join(' ')} END AS ${d.quoteIdentifier('distance')}`,
      `CASE WHEN ${least} IS NULL THEN NULL WHEN ${d.least(Array.from({ length: k }, (_, c) => `${square(c)} - ${limit(c)}`))} > ${lit(0)} THEN 1 ELSE 0 END AS ${d.quoteIdentifier('far')}`,
      `CASE WHEN ${least} < ${lit(COST_WITHOUT_PROBABILITY)} THEN ${lit(1)} / (${Array.from({ length: k }, (_, c) => share(c)).join(' + ')}) END AS ${d.quoteIdentifier('probability')}`,
    ],
  };
  return { layers: [whitened, squares, costs, leastLayer, chosen], final };
}
