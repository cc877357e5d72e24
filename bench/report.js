'use strict';
// The bench's output: a plain-text table for people, JSON lines for machines.

/**
 * @typedef {object} CaseRow one side-by-side row (see makeRow in compare.js and memory.js)
 * @property {string} title
 * @property {number} n
 * @property {number} d
 * @property {string} tool
 * @property {number} kinsortMs
 * @property {number} peerMs
 * @property {number | null} ratio
 * @property {string} target
 * @property {string} status
 * @property {number | null} peakMB
 * @property {number} [peerPeakMB]
 * @property {string} [note]
 */
/**
 * @typedef {object} ScalingRow one tool's times at n, 2n and 4n (see scaling.js)
 * @property {string} title
 * @property {string} tool
 * @property {number[]} sizes
 * @property {number[]} ms
 * @property {number | null} growthPerDoubling
 */
/** @typedef {ReturnType<typeof import('./machine').describeMachine>} MachineRow */

/** @type {[string, (r: CaseRow) => string][]} */
const COLUMNS = [
  ['case', (r) => r.title],
  ['n × d', (r) => `${r.n.toLocaleString('en-US')} × ${r.d}`],
  ['kinsort ms', (r) => formatMs(r.kinsortMs)],
  ['peer', (r) => r.tool],
  ['peer ms', (r) => formatMs(r.peerMs)],
  ['kinsort ÷ peer', (r) => (Number.isFinite(r.ratio) ? `${/** @type {number} */ (r.ratio).toFixed(3)}×` : '—')],
  ['target', (r) => r.target],
  ['result', (r) => r.status],
  ['peak MB kinsort / peer', peakCell],
];

/** @param {CaseRow} r */
function peakCell(r) {
  /** @param {number | null | undefined} x */
  const mb = (x) => (Number.isFinite(x) ? /** @type {number} */ (x).toFixed(0) : '—');
  if (r.peerPeakMB !== undefined) return `${mb(r.peakMB)} / ${mb(r.peerPeakMB)}`;
  return Number.isFinite(r.peakMB) ? mb(r.peakMB) : '';
}

/** @param {number} ms */
function formatMs(ms) {
  if (!Number.isFinite(ms)) return '—';
  return ms >= 100 ? ms.toFixed(0) : ms.toFixed(ms >= 10 ? 1 : 2);
}

/**
 * @param {string[]} headers
 * @param {string[][]} rows
 */
function table(headers, rows) {
  const widths = headers.map((h, c) => Math.max(h.length, ...rows.map((row) => row[c].length)));
  /** @param {string[]} cells */
  const line = (cells) =>
    cells
      .map((cell, c) => cell.padEnd(widths[c]))
      .join(' | ')
      .trimEnd();
  return [line(headers), widths.map((w) => '-'.repeat(w)).join('-|-'), ...rows.map(line)].join('\n');
}

/**
 * The side-by-side table, with each row's note (skips, reasons) listed beneath.
 * @param {CaseRow[]} rows
 */
function caseTable(rows) {
  const body = table(
    COLUMNS.map(([h]) => h),
    rows.map((r) => COLUMNS.map(([, cell]) => cell(r))),
  );
  // The same note (e.g. a function not built yet) is listed once, not once per row.
  const notes = [...new Set(rows.filter((r) => r.note).map((r) => `  * ${r.title} / ${r.tool}: ${r.note}`))];
  return notes.length ? `${body}\n\nNotes:\n${notes.join('\n')}` : body;
}

/**
 * Growth per doubling of n: (t(4n) / t(n))^(1/2); about 2 for linear work, 4 for quadratic.
 * @param {ScalingRow[]} rows
 */
function scalingTable(rows) {
  return table(
    ['case', 'tool', 'n, 2n, 4n', 'ms at n, 2n, 4n', 'growth per doubling'],
    rows.map((r) => [
      r.title,
      r.tool,
      r.sizes.map((n) => n.toLocaleString('en-US')).join(', '),
      r.ms.map(formatMs).join(', '),
      Number.isFinite(r.growthPerDoubling) ? `${/** @type {number} */ (r.growthPerDoubling).toFixed(2)}×` : '—',
    ]),
  );
}

/** @param {MachineRow} m */
function machineText(m) {
  const lines = [
    `machine: ${m.cpus} cores (${m.cpuModel}), ${m.memoryGB} GB memory; node ${m.node}`,
    m.python
      ? `python ${m.python.python}: numpy ${m.python.numpy}, SciPy ${m.python.scipy}, scikit-learn ` +
        `${m.python.sklearn}; BLAS ${m.python.blasKernel}` +
        (m.python.threadpools ? `; thread pools: ${m.python.threadpools.map((p) => `${p.internal_api} ${p.num_threads}`).join(', ')}` : '')
      : `python peer: not run (${m.pythonMissing})`,
    `npm peers: ${Object.entries(m.npmPeers)
      .map(([k, v]) => `${k} ${v}`)
      .join(', ')}`,
    `mode: ${m.mode}; load average at start ${m.loadAverage.map((x) => x.toFixed(2)).join(' ')}`,
  ];
  return lines.join('\n');
}

module.exports = { caseTable, scalingTable, machineText, formatMs };
