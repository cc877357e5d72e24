// The three commands. Each takes its arguments and an output sink and returns the exit status;
// errors are thrown as KinsortError and worded by main.ts.
import { writeFileSync } from 'fs';
import { KinsortError, checkChoice } from '../core/errors';
import { readCsvFile } from '../table';
import { SCALE_METHODS, MISSING_POLICIES } from '../prepare';
import { LINKAGE_METHODS } from '../methods/hierarchy';
import { study } from '../study/study';
import { loadDefinition } from '../segments/definition-handle';
import { DEFINITION_METHODS, DEFINITION_METRICS } from '../segments/definition-types';
import { DIALECT_NAMES } from '../engines/dialect';
import { exactPositionals, integerOption, listOption, optionalString, parseCommandArgs, requireString } from './args';
import { scoredCsv } from './csv-out';
import { ASSIGN_HELP, FIT_HELP, SQL_HELP } from './help';

export interface Io {
  out(text: string): void;
  err(text: string): void;
}

function writeFile(path: string, text: string, what: string): void {
  try {
    writeFileSync(path, text, 'utf8');
  } catch (e) {
    throw new KinsortError(`cannot write ${what} to "${path}" (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}).`, 'bad-input');
  }
}

/** The summary's words for each method's headline figure. */
const OBJECTIVE_WORDS: Record<string, string> = {
  withinSS: 'within-segment sum of squares',
  cost: 'total distance to the medoids',
};

/** A choice given on the command line: the error names the command and the flag the user typed. */
function flagChoice<T extends string>(command: string, flag: string, value: unknown, allowed: readonly T[], what: string): T {
  try {
    return checkChoice(value, allowed, what);
  } catch (e) {
    if (!(e instanceof KinsortError)) throw e;
    const known = flag === 'metric' && !(allowed as readonly string[]).includes(String(value)) ? METRIC_ELSEWHERE[String(value)] ?? '' : '';
    throw new KinsortError(`${command} --${flag}: ${e.message}${known}`, e.code);
  }
}

// Metrics the library has but a definition file cannot carry: say so, and where they do work.
const METRIC_ELSEWHERE: Record<string, string> = {
  gower:
    ' Gower k-medoids runs in the fluent layer (prepared.kmedoids({ k, metric: \'gower\' })), but a definition file assigns new rows and writes SQL with the metrics above only.',
  cosine: ' A definition file assigns new rows and writes SQL with the metrics above only.',
  correlation: ' A definition file assigns new rows and writes SQL with the metrics above only.',
  chebyshev: ' A definition file assigns new rows and writes SQL with the metrics above only.',
  minkowski: ' A definition file assigns new rows and writes SQL with the metrics above only.',
};

function refuse(message: string): never {
  throw new KinsortError(message, 'bad-option');
}

const FIT_OPTIONS = {
  id: { type: 'string' }, use: { type: 'string' }, keep: { type: 'string' }, method: { type: 'string' },
  k: { type: 'string' }, linkage: { type: 'string' }, metric: { type: 'string' }, scale: { type: 'string' },
  missing: { type: 'string' }, log: { type: 'string' }, seed: { type: 'string' }, restarts: { type: 'string' },
  note: { type: 'string' }, out: { type: 'string' },
} as const;

export function fitCommand(args: string[], io: Io): number {
  const c = 'fit';
  const { values, positionals } = parseCommandArgs(c, args, FIT_OPTIONS);
  if (values.help) return io.out(FIT_HELP), 0;
  const [dataPath] = exactPositionals(positionals, ['DATA.csv'], c);
  const method = flagChoice(c, 'method', requireString(values, 'method', c), DEFINITION_METHODS, 'method');
  const k = integerOption(requireString(values, 'k', c), 'k', c, 1)!;
  const out = requireString(values, 'out', c);
  const id = requireString(values, 'id', c);
  const use = listOption(requireString(values, 'use', c), 'use', c);
  const keep = values.keep === undefined ? undefined : listOption(optionalString(values, 'keep')!, 'keep', c);
  const log = values.log === undefined ? undefined : listOption(optionalString(values, 'log')!, 'log', c);
  const scale = values.scale === undefined ? undefined : flagChoice(c, 'scale', values.scale, SCALE_METHODS, 'scale');
  const missing = values.missing === undefined ? undefined : flagChoice(c, 'missing', values.missing, MISSING_POLICIES, 'missing-value policy');
  const metric = values.metric === undefined ? undefined : flagChoice(c, 'metric', values.metric, DEFINITION_METRICS, 'metric');
  if (values.linkage !== undefined && method !== 'hierarchy') {
    throw new KinsortError(`fit: --linkage applies to --method hierarchy only.`, 'bad-option');
  }
  if (values.restarts !== undefined && method !== 'kmeans') {
    throw new KinsortError(`fit: --restarts applies to --method kmeans only.`, 'bad-option');
  }
  const seed = integerOption(optionalString(values, 'seed'), 'seed', c, 0);
  const restarts = integerOption(optionalString(values, 'restarts'), 'restarts', c, 1);

  // The same fluent calls a notebook makes, so the command and a notebook write the same file.
  const prepared = study(readCsvFile(dataPath), { id, use, keep }).prepare({ log, scale, missing });
  const linkage = values.linkage === undefined ? 'ward' : flagChoice(c, 'linkage', values.linkage, LINKAGE_METHODS, 'linkage');
  const seg =
    method === 'kmeans'
      ? (metric === undefined || metric === 'euclidean'
          ? prepared.kmeans({ k, seed, restarts })
          : refuse('fit: k-means works with euclidean distance only; drop --metric or use --method kmedoids.'))
      : method === 'kmedoids'
        ? prepared.kmedoids({ k, metric })
        : prepared.agglomerate({ method: linkage, metric }).cut({ k });
  const definition = seg.definition({ note: optionalString(values, 'note') });
  writeFile(out, definition.toJSON(), 'the definition');

  const report = prepared.report;
  const lines = [
    `kinsort fit: ${report.keptRows} of ${report.inputRows} rows, ${prepared.featureNames.length} prepared feature${prepared.featureNames.length === 1 ? "" : "s"}, ${method} with k = ${k}`,
  ];
  if (report.dropped.length > 0) {
    const shown = report.dropped.slice(0, 5).map((d) => `${d.id} (${d.reason})`).join('; ');
    lines.push(`dropped ${report.dropped.length} row(s): ${shown}${report.dropped.length > 5 ? '; …' : ''}`);
  }
  for (const imp of report.imputed) lines.push(`imputed ${imp.count} missing value(s) in ${imp.column} with ${imp.value}`);
  lines.push(`segment sizes: ${definition.definition.segments.map((s) => `${s.number}: ${s.size}`).join(', ')}`);
  lines.push(`${OBJECTIVE_WORDS[seg.objective.name] ?? seg.objective.name}: ${Number(seg.objective.value.toPrecision(6))}`);
  if (k >= 2 && k < seg.ids.length) {
    // The silhouette is measured in the space the fit used: k-means is always euclidean.
    const silhouetteMetric = method === 'kmeans' ? 'euclidean' : (metric ?? 'euclidean');
    lines.push(`average silhouette (${silhouetteMetric}): ${Number(seg.silhouette().average.toPrecision(4))}`);
  }
  lines.push(`definition written to ${out}`);
  io.out(lines.join('\n') + '\n');
  return 0;
}

export function assignCommand(args: string[], io: Io): number {
  const c = 'assign';
  const { values, positionals } = parseCommandArgs(c, args, { out: { type: 'string' } });
  if (values.help) return io.out(ASSIGN_HELP), 0;
  const [defPath, dataPath] = exactPositionals(positionals, ['DEF.json', 'DATA.csv'], c);
  const handle = loadDefinition(defPath);
  // Read the file under the definition's stored schema (missing markers, decimal mark), never the defaults.
  const prep = handle.definition.preparation as { missingMarkers?: string[]; decimalMark?: '.' | ',' };
  const outcome = handle.assign(readCsvFile(dataPath, { missingMarkers: prep.missingMarkers, decimalMark: prep.decimalMark }));
  const idColumn = (handle.definition.preparation.idColumn as string | null) ?? 'row';
  const csv = scoredCsv(idColumn, outcome);
  const out = optionalString(values, 'out');
  // Without --out the CSV owns standard output; the summary goes to standard error.
  const say = out === undefined ? io.err : io.out;
  if (out === undefined) io.out(csv);
  else writeFile(out, csv, 'the scored rows');
  const r = outcome.report;
  const lines = [`kinsort assign: ${r.assignedRows} of ${r.inputRows} rows given a segment`];
  lines.push(...r.notes.filter((n) => !n.includes('"refused"')));
  for (const refused of r.refused) lines.push(`no segment for ${refused.id}: ${refused.reason}`);
  if (out !== undefined) lines.push(`scored rows written to ${out}`);
  say(lines.join('\n') + '\n');
  return 0;
}

export function sqlCommand(args: string[], io: Io): number {
  const c = 'sql';
  const { values, positionals } = parseCommandArgs(c, args, {
    table: { type: 'string' }, 'id-column': { type: 'string' }, dialect: { type: 'string' }, out: { type: 'string' },
  });
  if (values.help) return io.out(SQL_HELP), 0;
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
