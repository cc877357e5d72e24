// The three commands. Each takes its arguments and an output sink and returns the exit status;
// errors are thrown as KinsortError and worded by main.ts.
import { existsSync, statSync } from 'fs';
import { resolve } from 'path';
import { KinsortError, checkChoice } from '../core/errors';
import { saveText } from '../core/save-file';
import { forTerminal } from '../core/terminal-text';
import { silhouette } from '../assess/silhouette';
import { silhouetteSample } from '../assess/compare-k';
import { readCsvFile } from '../table';
import { SCALE_METHODS, MISSING_POLICIES } from '../prepare';
import { LINKAGE_METHODS } from '../methods/hierarchy';
import { study } from '../study/study';
import type { Segmentation } from '../study/segmentation';
import type { ProgressCallback } from '../core/progress';
import { loadDefinition } from '../study/definition-handle';
import { DEFINITION_METRICS } from '../segments/definition-types';
import { COVARIANCE_SHAPES } from '../methods/mixture';
import { DIALECT_NAMES } from '../engines/dialect';
import { exactPositionals, integerOption, listOption, optionalString, parseCommandArgs, requireString } from './args';
import { CSV_TARGETS, scoredCsv } from './csv-out';
import { ASSIGN_HELP, FIT_HELP, SQL_HELP } from './help';

export interface Io {
  out(text: string): void;
  err(text: string): void;
}

function writeFile(path: string, text: string, what: string): void {
  saveText(path, text, what);
}

/** The same file: the same absolute path, or (when both exist) the same device and inode (links). */
function sameFile(a: string, b: string): boolean {
  if (resolve(a) === resolve(b)) return true;
  if (!existsSync(a) || !existsSync(b)) return false;
  try {
    const sa = statSync(a);
    const sb = statSync(b);
    return sa.dev === sb.dev && sa.ino === sb.ino;
  } catch {
    return false;
  }
}

/** --out must not name one of the command's inputs: writing it would destroy what was read. */
export function refuseOverwritingInput(command: string, out: string, inputs: readonly (readonly [string, string])[]): void {
  for (const [what, path] of inputs) {
    if (sameFile(out, path)) {
      throw new KinsortError(`${command}: --out "${out}" is the ${what} this command reads; write to another file.`, 'bad-option');
    }
  }
}

/** Lines for the terminal: every line escaped (ids and names may hold control characters). */
function terminalLines(lines: readonly string[]): string {
  return lines.map(forTerminal).join('\n') + '\n';
}

/** Rows above which a hierarchy reports on standard error: its estimate first, then every 10%. */
const HIERARCHY_REPORT_ROWS = 10_000;

function hierarchyProgress(rows: number, io: Io): ProgressCallback | undefined {
  if (rows <= HIERARCHY_REPORT_ROWS) return undefined;
  let nextPercent = 10;
  return (event) => {
    if (event.done === 0 && event.detail) io.err(`kinsort fit: ${event.detail}\n`);
    const percent = Math.floor((100 * event.done) / event.total);
    if (percent >= nextPercent) {
      io.err(`kinsort fit: agglomerating, ${percent}% of merges done\n`);
      nextPercent = percent - (percent % 10) + 10;
    }
  };
}

/** Rows above which the summary silhouette uses a seeded sample, as compareK does. */
const SUMMARY_SILHOUETTE_ROWS = 10_000;

/** The summary's words for each method's headline figure. */
const OBJECTIVE_WORDS: ReadonlyMap<string, string> = new Map([
  ['withinSS', 'within-segment sum of squares'],
  ['cost', 'total distance to the medoids'],
  ['bic', 'BIC (lower is better)'],
]);

/** A choice given on the command line: the error names the command and the flag the user typed. */
function flagChoice<T extends string>(command: string, flag: string, value: unknown, allowed: readonly T[], what: string): T {
  try {
    return checkChoice(value, allowed, what);
  } catch (e) {
    if (!(e instanceof KinsortError)) throw e;
    const known =
      flag === 'metric' && !(allowed as readonly string[]).includes(String(value)) ? (METRIC_ELSEWHERE.get(String(value)) ?? '') : '';
    throw new KinsortError(`${command} --${flag}: ${e.message}${known}`, e.code);
  }
}

// Metrics the library has but a definition file cannot carry: say so, and where they do work.
// A Map: the user's word is looked up, and a plain object would answer "constructor" too.
const METRIC_ELSEWHERE: ReadonlyMap<string, string> = new Map([
  [
    'gower',
    " Gower k-medoids runs in the fluent layer (prepared.kmedoids({ k, metric: 'gower' })), but a definition file assigns new rows and writes SQL with the metrics above only.",
  ],
  ['cosine', ' A definition file assigns new rows and writes SQL with the metrics above only.'],
  ['correlation', ' A definition file assigns new rows and writes SQL with the metrics above only.'],
  ['chebyshev', ' A definition file assigns new rows and writes SQL with the metrics above only.'],
  ['minkowski', ' A definition file assigns new rows and writes SQL with the metrics above only.'],
]);

function refuse(message: string): never {
  throw new KinsortError(message, 'bad-option');
}

const FIT_OPTIONS = {
  id: { type: 'string' },
  use: { type: 'string' },
  keep: { type: 'string' },
  method: { type: 'string' },
  k: { type: 'string' },
  linkage: { type: 'string' },
  metric: { type: 'string' },
  scale: { type: 'string' },
  missing: { type: 'string' },
  log: { type: 'string' },
  seed: { type: 'string' },
  restarts: { type: 'string' },
  covariance: { type: 'string' },
  note: { type: 'string' },
  out: { type: 'string' },
  silhouette: { type: 'string' },
} as const;

const SILHOUETTE_CHOICES = ['sample', 'full'] as const;
/** The methods `kinsort fit` runs (each has its branch below). */
const FIT_METHODS = ['kmeans', 'kmedoids', 'hierarchy', 'mixture'] as const;

export function fitCommand(args: string[], io: Io): number {
  const c = 'fit';
  const { values, positionals } = parseCommandArgs(c, args, FIT_OPTIONS);
  if (values.help) return (io.out(FIT_HELP), 0);
  const [dataPath] = exactPositionals(positionals, ['DATA.csv'], c);
  const method = flagChoice(c, 'method', requireString(values, 'method', c), FIT_METHODS, 'method');
  const k = integerOption(requireString(values, 'k', c), 'k', c, 1)!;
  const out = requireString(values, 'out', c);
  const id = requireString(values, 'id', c);
  const use = listOption(requireString(values, 'use', c), 'use', c);
  const keep = values.keep === undefined ? undefined : listOption(optionalString(values, 'keep')!, 'keep', c);
  const log = values.log === undefined ? undefined : listOption(optionalString(values, 'log')!, 'log', c);
  const scale = values.scale === undefined ? undefined : flagChoice(c, 'scale', values.scale, SCALE_METHODS, 'scale');
  const missing =
    values.missing === undefined ? undefined : flagChoice(c, 'missing', values.missing, MISSING_POLICIES, 'missing-value policy');
  const metric = values.metric === undefined ? undefined : flagChoice(c, 'metric', values.metric, DEFINITION_METRICS, 'metric');
  if (values.linkage !== undefined && method !== 'hierarchy') {
    throw new KinsortError(`fit: --linkage applies to --method hierarchy only.`, 'bad-option');
  }
  if (values.restarts !== undefined && method !== 'kmeans' && method !== 'mixture') {
    throw new KinsortError(`fit: --restarts applies to --method kmeans and mixture only.`, 'bad-option');
  }
  if (values.covariance !== undefined && method !== 'mixture') {
    throw new KinsortError(`fit: --covariance applies to --method mixture only.`, 'bad-option');
  }
  if (method === 'mixture' && metric !== undefined) {
    throw new KinsortError(`fit: a mixture measures Mahalanobis distances to its components; drop --metric.`, 'bad-option');
  }
  const covariance =
    values.covariance === undefined ? undefined : flagChoice(c, 'covariance', values.covariance, COVARIANCE_SHAPES, 'covariance shape');
  const seed = integerOption(optionalString(values, 'seed'), 'seed', c, 0);
  const restarts = integerOption(optionalString(values, 'restarts'), 'restarts', c, 1);
  const silhouetteRows =
    values.silhouette === undefined ? 'sample' : flagChoice(c, 'silhouette', values.silhouette, SILHOUETTE_CHOICES, 'silhouette choice');
  refuseOverwritingInput(c, out, [['data file', dataPath]]);

  // The same fluent calls a notebook makes, so the command and a notebook write the same file.
  const prepared = study(readCsvFile(dataPath), { id, use, keep }).prepare({ log, scale, missing });
  const linkage = values.linkage === undefined ? 'ward' : flagChoice(c, 'linkage', values.linkage, LINKAGE_METHODS, 'linkage');
  const seg =
    method === 'kmeans'
      ? metric === undefined || metric === 'euclidean'
        ? prepared.kmeans({ k, seed, restarts })
        : refuse('fit: k-means works with euclidean distance only; drop --metric or use --method kmedoids.')
      : method === 'kmedoids'
        ? prepared.kmedoids({ k, metric })
        : method === 'mixture'
          ? prepared.mixture({ k, seed, restarts, covariance })
          : prepared.agglomerate({ method: linkage, metric, onProgress: hierarchyProgress(prepared.data.matrix.rows, io) }).cut({ k });
  const definition = seg.definition({ note: optionalString(values, 'note') });
  writeFile(out, definition.toJSON(), 'the definition');

  const report = prepared.report;
  const lines = [
    `kinsort fit: ${report.keptRows} of ${report.inputRows} rows, ${prepared.featureNames.length} prepared feature${prepared.featureNames.length === 1 ? '' : 's'}, ${method} with k = ${k}`,
  ];
  if (report.dropped.length > 0) {
    const shown = report.dropped
      .slice(0, 5)
      .map((d) => `${d.id} (${d.reason})`)
      .join('; ');
    lines.push(`dropped ${report.dropped.length} row(s): ${shown}${report.dropped.length > 5 ? '; …' : ''}`);
  }
  for (const imp of report.imputed) lines.push(`imputed ${imp.count} missing value(s) in ${imp.column} with ${imp.value}`);
  lines.push(`segment sizes: ${definition.definition.segments.map((s) => `${s.number}: ${s.size}`).join(', ')}`);
  lines.push(`${OBJECTIVE_WORDS.get(seg.objective.name) ?? seg.objective.name}: ${Number(seg.objective.value.toPrecision(6))}`);
  if (k >= 2 && k < seg.ids.length) {
    // The silhouette is measured in the space the fit used: k-means is always euclidean.
    const silhouetteMetric = method === 'kmeans' ? 'euclidean' : (metric ?? 'euclidean');
    lines.push(summarySilhouette(seg, silhouetteMetric, silhouetteRows === 'full', seed ?? 0));
  }
  lines.push(`definition written to ${out}`);
  io.out(terminalLines(lines));
  return 0;
}

/**
 * The summary's silhouette line. The silhouette costs n² distances (6 minutes at 200,000 rows),
 * so above 10,000 rows it is measured on a seeded sample of 10,000, as compareK does, and the
 * line says so; --silhouette full measures every row.
 */
function summarySilhouette(seg: Segmentation, metric: 'euclidean' | 'manhattan' | 'sqeuclidean', full: boolean, seed: number): string {
  const n = seg.ids.length;
  if (full || n <= SUMMARY_SILHOUETTE_ROWS) {
    return `average silhouette (${metric}): ${Number(seg.silhouette().average.toPrecision(4))}`;
  }
  const sample = silhouetteSample(seg.data.matrix, SUMMARY_SILHOUETTE_ROWS, seed)!;
  const labels = Int32Array.from(sample.indices, (i) => seg.assignment[i]);
  const where = `${metric}, on a seeded sample of ${SUMMARY_SILHOUETTE_ROWS.toLocaleString('en-US')} of ${n.toLocaleString('en-US')} rows; --silhouette full for all`;
  // A segment of a handful of rows may miss the sample entirely; one segment has no silhouette.
  if (new Set(labels).size < 2) return `average silhouette (${where}): not measured, the sample holds one segment only`;
  return `average silhouette (${where}): ${Number(silhouette(sample.rows, labels, { metric }).average.toPrecision(4))}`;
}

export function assignCommand(args: string[], io: Io): number {
  const c = 'assign';
  const { values, positionals } = parseCommandArgs(c, args, { out: { type: 'string' }, for: { type: 'string' } });
  if (values.help) return (io.out(ASSIGN_HELP), 0);
  const [defPath, dataPath] = exactPositionals(positionals, ['DEF.json', 'DATA.csv'], c);
  const out = optionalString(values, 'out');
  const target = values.for === undefined ? 'spreadsheet' : flagChoice(c, 'for', values.for, CSV_TARGETS, 'output target');
  if (out !== undefined)
    refuseOverwritingInput(c, out, [
      ['definition file', defPath],
      ['data file', dataPath],
    ]);
  const handle = loadDefinition(defPath);
  // Read the file under the definition's stored schema (missing markers, decimal mark), never the defaults.
  const prep = handle.definition.preparation as { missingMarkers?: string[]; decimalMark?: '.' | ',' };
  const outcome = handle.assign(readCsvFile(dataPath, { missingMarkers: prep.missingMarkers, decimalMark: prep.decimalMark }));
  const idColumn = (handle.definition.preparation.idColumn as string | null) ?? 'row';
  const csv = scoredCsv(idColumn, outcome, target);
  // Without --out the CSV owns standard output; the summary goes to standard error.
  const say = out === undefined ? io.err : io.out;
  if (out === undefined) io.out(csv);
  else writeFile(out, csv, 'the scored rows');
  const r = outcome.report;
  const lines = [`kinsort assign: ${r.assignedRows} of ${r.inputRows} rows given a segment`];
  lines.push(...r.notes.filter((n) => !n.includes('"refused"')));
  for (const refused of r.refused) lines.push(`no segment for ${refused.id}: ${refused.reason}`);
  if (out !== undefined) lines.push(`scored rows written to ${out}`);
  say(terminalLines(lines));
  return 0;
}

export function sqlCommand(args: string[], io: Io): number {
  const c = 'sql';
  const { values, positionals } = parseCommandArgs(c, args, {
    table: { type: 'string' },
    'id-column': { type: 'string' },
    dialect: { type: 'string' },
    out: { type: 'string' },
  });
  if (values.help) return (io.out(SQL_HELP), 0);
  const [defPath] = exactPositionals(positionals, ['DEF.json'], c);
  const table = requireString(values, 'table', c);
  const given = optionalString(values, 'dialect');
  const dialect = given === undefined ? 'duckdb' : flagChoice(c, 'dialect', given, DIALECT_NAMES, 'SQL dialect');
  const sql = loadDefinition(defPath).toSql({ table, dialect, idColumn: optionalString(values, 'id-column') });
  const out = optionalString(values, 'out');
  if (out === undefined) io.out(sql);
  else {
    writeFile(out, sql, 'the SQL');
    io.out(`SQL written to ${out}\n`);
  }
  return 0;
}
