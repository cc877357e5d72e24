// The groups of a cut of a variable tree as a table: each group's members, how much its first
// principal component explains, and which member stands for it (the smallest 1 − R² ratio).
import { escapeHtml } from './escape';
import { htmlSwatch } from './common';
import { makeView, type View } from './view';

export interface VariableGroupLike {
  readonly group: number;
  readonly firstComponentShare: number;
  readonly representative: string;
  readonly members: readonly {
    readonly name: string;
    readonly sharedWithOwn: number;
    readonly sharedWithNext: number;
    readonly nextGroup: number | null;
    readonly unexplainedRatio: number;
  }[];
}

const pct = (v: number) => `${(100 * v).toFixed(0)}%`;
const fixed = (v: number) => (Number.isFinite(v) ? v.toFixed(3) : '∞');

export function variableGroupsView(
  groups: readonly VariableGroupLike[],
  options: { title?: string; notes?: readonly string[] } = {},
): View {
  const k = groups.length;
  const rows: string[] = [];
  for (const g of groups) {
    g.members.forEach((m, i) => {
      const chosen = m.name === g.representative;
      rows.push(
        '<tr>' +
          (i === 0
            ? `<td rowspan="${g.members.length}" style="vertical-align:top">${htmlSwatch(g.group - 1)} ` +
              `<span style="font-size:12px">first component ${pct(g.firstComponentShare)}</span></td>`
            : '') +
          `<td style="text-align:left">${chosen ? '<strong>' : ''}${escapeHtml(m.name)}${chosen ? '</strong> ← keep' : ''}</td>` +
          `<td>${pct(m.sharedWithOwn)}</td><td>${m.nextGroup === null ? '—' : `${pct(m.sharedWithNext)} (group ${m.nextGroup})`}</td>` +
          `<td>${fixed(m.unexplainedRatio)}</td></tr>`,
      );
    });
  }
  const table =
    '<table class="ks-table"><thead><tr><th>Group</th><th style="text-align:left">Variable</th><th>shared with own group</th>' +
    '<th>shared with the next group</th><th>1 − R² ratio</th></tr></thead><tbody>' +
    rows.join('') +
    '</tbody></table>';
  return makeView({
    kind: 'variable-groups',
    title: options.title ?? `${k} groups of variables`,
    caption:
      'For each group: the share of its variance its first principal component explains, and for each variable the share ' +
      'of its variance it shares with its own group’s component and with the closest other group’s. The variable with the ' +
      'smallest ratio (1 − own) / (1 − next) stands for its group: marked “keep”.',
    still: table,
    notes: options.notes,
  });
}
