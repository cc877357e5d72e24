// One Lloyd iteration over a whole table as one aggregate SELECT. The rows are prepared by the
// stored preparation's own SQL (sql-features.ts, the layers the scoring SQL uses), then:
//   - the squared Euclidean distance to every current centre, and (after the first iteration) to
//     every previous centre, each summed in feature order exactly as the scoring SQL does;
//   - each row's nearest current and nearest previous centre, ties to the lower segment number
//     (the definition's own rule);
//   - grouped by the nearest current centre: the rows, the sum of their squared distances to it
//     (the within-segment sum of squares around the current centres), the sum of each feature's
//     difference from the current centre (the new centre is current + sum / rows: differences are
//     summed rather than raw values, so an offset far from zero costs no digits), and how many
//     rows have another nearest centre than under the previous centres (the rows that moved).
// Rows the definition cannot score (a cell assign refuses, or on PostgreSQL a feature beyond its
// bound) have no nearest centre: they form the group whose segment is NULL and are counted only.
import { KinsortError } from '../../core/errors';
import type { SqlDialect } from '../../engines/dialect';
import type { Preparation } from '../../prepare/types';
import { beyondColumn, featureColumn, PREFIX, preparedFeatureLayers, renderLayers, type Layer } from '../sql-features';

/** Output columns of the iteration's SELECT (one row per segment that has rows, plus NULL for unscored). */
export const STEP_COLUMNS = {
  segment: `${PREFIX}segment`,
  rows: `${PREFIX}rows`,
  within: `${PREFIX}within`,
  moved: `${PREFIX}moved`,
  difference: (j: number) => `${PREFIX}sum_${j + 1}`,
};

export interface LloydStepInput {
  readonly preparation: Preparation;
  readonly dims: number;
  /** The FROM clause (a quoted table, or the user's query as a subquery). */
  readonly from: string;
  readonly current: readonly (readonly number[])[];
  /** The centres of the iteration before, or null in the first iteration (no moved count). */
  readonly previous: readonly (readonly number[])[] | null;
}

export function lloydStepSql(d: SqlDialect, input: LloydStepInput): string {
  const { preparation, dims, from, current, previous } = input;
  const k = current.length;
  const q = (name: string) => d.quoteIdentifier(name);
  const f = (j: number) => featureColumn(j, d);
  const prepared = preparedFeatureLayers(preparation, d, dims, { first: [], later: [] });
  const bounded = Number.isFinite(d.featureBound);
  const features = Array.from({ length: dims }, (_, j) => f(j));
  const now = (c: number) => q(`${PREFIX}dn_${c + 1}`);
  const before = (c: number) => q(`${PREFIX}dp_${c + 1}`);
  const distanceTo = (center: readonly number[]) => {
    if (bounded && center.some((x) => Math.abs(x) > d.featureBound)) {
      throw new KinsortError(
        `refineInDatabase: a centre figure is beyond ${d.featureBound} in size, which ${d.title} cannot use without overflow.`,
        'not-supported',
      );
    }
    const sum = center.map((x, j) => d.square(`(${f(j)} - ${d.doubleLiteral(x)})`)).join(' + ');
    return bounded ? `CASE WHEN ${beyondColumn(d)} = 0 THEN ${sum} END` : sum;
  };
  const distances: Layer = {
    name: `${PREFIX}distances`,
    columns: [
      ...features,
      ...current.map((center, c) => `${distanceTo(center)} AS ${now(c)}`),
      ...(previous ?? []).map((center, c) => `${distanceTo(center)} AS ${before(c)}`),
    ],
  };
  const nowNames = current.map((_, c) => now(c));
  const beforeNames = (previous ?? []).map((_, c) => before(c));
  const least = q(`${PREFIX}least`);
  const leastBefore = q(`${PREFIX}least_before`);
  const nearest: Layer = {
    name: `${PREFIX}nearest`,
    columns: [
      ...features,
      ...nowNames,
      ...beforeNames,
      `${d.least(nowNames)} AS ${least}`,
      ...(previous ? [`${d.least(beforeNames)} AS ${leastBefore}`] : []),
    ],
  };
  const segment = q(`${PREFIX}s`);
  const segmentBefore = q(`${PREFIX}s_before`);
  const segments: Layer = {
    name: `${PREFIX}segments`,
    columns: [
      ...features,
      least,
      `${d.firstEqual(nowNames, least)} AS ${segment}`,
      ...(previous ? [`${d.firstEqual(beforeNames, leastBefore)} AS ${segmentBefore}`] : []),
    ],
  };
  // The current centre of the row's own segment, feature by feature.
  const own = (j: number) =>
    `CASE ${current.map((center, c) => `WHEN ${segment} = ${c + 1} THEN ${d.doubleLiteral(center[j])}`).join(' ')} END`;
  const final: Layer = {
    name: '',
    columns: [
      `${segment} AS ${q(STEP_COLUMNS.segment)}`,
      `count(*) AS ${q(STEP_COLUMNS.rows)}`,
      `sum(${least}) AS ${q(STEP_COLUMNS.within)}`,
      previous
        ? `sum(CASE WHEN ${segment} IS NULL OR ${segment} = ${segmentBefore} THEN 0 ELSE 1 END) AS ${q(STEP_COLUMNS.moved)}`
        : `count(*) - count(*) AS ${q(STEP_COLUMNS.moved)}`,
      ...features.map((x, j) => `sum(${x} - ${own(j)}) AS ${q(STEP_COLUMNS.difference(j))}`),
    ],
  };
  if (k < 1) throw new KinsortError('refineInDatabase: the definition has no segments.', 'bad-definition');
  return renderLayers([...prepared, distances, nearest, segments], final, from, d, `\nGROUP BY ${segment}`) + '\n';
}
