// The write-up of a segmentation as Markdown: what was done, the evidence, and one section per
// segment in the analyst's words with the figures that back them. Text only; the HTML page with
// the cards is built in views/.
import type { PreparationReport } from '../prepare';
import type { SegmentProfile, VariableDifference } from './profile';

export interface WriteUpContext {
  title: string;
  /** One sentence on how the segments were made. */
  method: string;
  /** Headline figures (within-SS or cost, average silhouette, stability …). */
  evidence: Record<string, unknown>;
  report: PreparationReport;
}

export const WRITE_UP_CAUTION =
  'Segments describe; they do not explain or predict. Segmenting people can feed unfair decisions: keep protected ' +
  'attributes out of the features unless there is a lawful reason, check segment outcomes for disparate impact, and ' +
  "follow your organisation's privacy rules before sharing ids.";

/**
 * Text from data made inert in Markdown: inline markup characters are backslash-escaped, HTML
 * is entity-escaped, and a line cannot start a heading, list or quote.
 */
export function markdownText(value: unknown): string {
  return String(value)
    .replace(/\r?\n/g, ' ')
    .replace(/[\\`*_[\]|~]/g, (c) => '\\' + c)
    .replace(/[<>&]/g, (c) => (c === '<' ? '&lt;' : c === '>' ? '&gt;' : '&amp;'))
    .replace(/^(\s*)([#+-])/, '$1\\$2')
    .replace(/^(\s*)(\d+)([.)])/, '$1$2\\$3');
}

// The evidence keys are code names (they are also the definition file's keys); a reader gets words.
const FIGURE_WORDS: Record<string, string> = {
  withinSS: 'Within-segment sum of squares',
  cost: 'Total distance to the medoids',
  averageSilhouette: 'Average silhouette',
  stabilityJaccard: 'Bootstrap stability (Jaccard), segment 1 first',
  tableRows: 'Rows of the whole table in a segment (refined in the database)',
  tableSizes: 'Rows of the whole table per segment, segment 1 first',
  tableUnscored: 'Rows of the whole table the definition cannot score (left out)',
  refineIterations: 'Lloyd iterations run in the database',
};

/** The reader's words for an evidence figure; an unknown key is shown as given. */
export function figureWords(name: string): string {
  return FIGURE_WORDS[name] ?? name;
}

export function formatFigure(value: unknown): string {
  if (typeof value === 'number') return Number.isInteger(value) ? String(value) : value.toPrecision(4);
  if (Array.isArray(value)) return value.map(formatFigure).join(', ');
  return String(value);
}

export function differenceSentence(d: VariableDifference): string {
  const name = d.level === undefined ? d.variable : `${d.variable} = ${d.level}`;
  const direction = d.difference >= 0 ? 'above' : 'below';
  const what =
    d.level === undefined
      ? `mean ${formatFigure(d.segmentMean)} against ${formatFigure(d.overallMean)} overall`
      : `${(100 * d.segmentMean).toFixed(0)}% against ${(100 * d.overallMean).toFixed(0)}% overall`;
  return `${name}: ${Math.abs(d.difference).toFixed(2)} sd ${direction} the whole (${what})`;
}

export function writeUpMarkdown(profiles: readonly SegmentProfile[], context: WriteUpContext): string {
  const lines: string[] = [];
  lines.push(`# ${markdownText(context.title)}`, '');
  lines.push(markdownText(context.method), '');
  const r = context.report;
  // Density segments add the noise rows as a last profile marked noise: never a numbered segment.
  const isNoise = (p: SegmentProfile) => (p as SegmentProfile & { noise?: boolean }).noise === true;
  const noiseRows = profiles.filter(isNoise).reduce((s, p) => s + p.size, 0);
  lines.push(
    `Rows: ${r.inputRows} in, ${r.keptRows} segmented` +
      (noiseRows ? ` (${noiseRows} of them in no segment: noise)` : '') +
      (r.dropped.length ? `, ${r.dropped.length} dropped for missing values (listed in the preparation report)` : '') +
      (r.imputed.length ? `; imputed: ${r.imputed.map((c) => `${markdownText(c.column)} (${c.count})`).join(', ')}` : '') +
      '.',
    '',
  );
  const figures = Object.entries(context.evidence);
  if (figures.length) {
    lines.push('## Evidence', '');
    for (const [name, value] of figures) lines.push(`- ${markdownText(figureWords(name))}: ${formatFigure(value)}`);
    lines.push('');
  }
  for (const p of profiles) {
    const heading = isNoise(p)
      ? markdownText(p.title ?? 'Noise: in no segment')
      : p.title
        ? `Segment ${p.segment}: ${markdownText(p.title)}`
        : `Segment ${p.segment}`;
    lines.push(`## ${heading}`, '');
    lines.push(
      `${p.size} rows (${(100 * p.share).toFixed(1)}% of all).` +
        (p.typical.id !== undefined ? ` Typical member: ${markdownText(p.typical.id)}.` : ''),
      '',
    );
    if (p.text) lines.push(markdownText(p.text), '');
    if (p.standout.length) {
      lines.push('What sets it apart:', '');
      for (const d of p.standout) lines.push(`- ${markdownText(differenceSentence(d))}`);
      lines.push('');
    }
    if (p.stability) lines.push(`Stability (bootstrap Jaccard): ${p.stability.jaccard.toFixed(2)}, ${p.stability.reading}.`, '');
  }
  lines.push('## Caution', '', WRITE_UP_CAUTION, '');
  return lines.join('\n');
}
