// The rules as people read them: for one segment, the rules that lead to it (a fragment a card
// can include), and for all segments a list with each rule's size and purity and how often the
// rules agree with the segmentation. Every string from data is escaped here.
import { escapeHtml } from './escape';
import { htmlSwatch } from './common';
import { makeView, type View } from './view';

export interface RulesLike {
  readonly k: number;
  readonly rules: readonly {
    readonly segment: number;
    readonly title?: string;
    readonly text: string;
    readonly size: number;
    readonly purity: number;
  }[];
  readonly agreement: { readonly overall: number; readonly bySegment: readonly number[] };
}

const pct = (v: number) => `${(100 * v).toFixed(0)}%`;

/**
 * Escaped HTML listing the rules that give segment `segment` (1..k): one line per rule, its rows
 * and purity, then the share of the segment the rules reach. For a card to include.
 */
export function segmentRulesHtml(result: RulesLike, segment: number): string {
  const mine = result.rules.filter((r) => r.segment === segment);
  const reach = result.agreement.bySegment[segment - 1] ?? 0;
  const items = mine.length
    ? mine
        .map(
          (r) =>
            `<li><span class="ks-rule">${escapeHtml(r.text)}</span> ` +
            `<span class="ks-rule-fact">${r.size.toLocaleString('en-US')} rows, ${pct(r.purity)} in this segment</span></li>`,
        )
        .join('')
    : '<li>No rule leads here: at this depth the rules give these rows to other segments.</li>';
  return (
    `<div class="ks-rules" data-segment="${segment}"><ul>${items}</ul>` +
    `<p class="ks-rule-fact">The rules give ${pct(reach)} of this segment’s rows to it.</p></div>`
  );
}

const RULES_CSS =
  '.kinsort-view .ks-rules ul{margin:2px 0 4px;padding-left:18px;font-size:13px}' +
  '.kinsort-view .ks-rules li{margin:3px 0}' +
  '.kinsort-view .ks-rules li .ks-rule-fact{display:block}' +
  '.kinsort-view .ks-rule{font-family:ui-monospace,SFMono-Regular,Menlo,monospace;font-size:12.5px}' +
  '.kinsort-view .ks-rule-fact{color:#5d6670;font-size:12px;margin:0}' +
  '.kinsort-view .ks-rules-segment{margin:10px 0 0;display:flex;gap:8px;align-items:center;font-size:14px;font-weight:600}';

/** All segments' rules, segment by segment, with the agreement figures. */
export function rulesView(result: RulesLike, options: { title?: string; notes?: readonly string[] } = {}): View {
  const blocks: string[] = [];
  for (let s = 1; s <= result.k; s++) {
    const title = result.rules.find((r) => r.segment === s && r.title)?.title;
    blocks.push(
      `<div class="ks-rules-segment">${htmlSwatch(s - 1)}<span>${escapeHtml(title ?? `Segment ${s}`)}</span></div>` +
        segmentRulesHtml(result, s),
    );
  }
  return makeView({
    kind: 'segment-rules',
    title: options.title ?? `Rules that say who is in each segment (${pct(result.agreement.overall)} agreement)`,
    caption:
      'A shallow classification tree (CART, Gini) fitted to the segments from the original columns, read out as one rule ' +
      'per leaf. Each rule gives its rows and the share of them in its segment; under each segment, the share of its ' +
      'rows the rules give to it. The rules describe the segments; they are not the segmentation itself.',
    still: `<style>${RULES_CSS}</style>${blocks.join('')}`,
    notes: options.notes,
  });
}
