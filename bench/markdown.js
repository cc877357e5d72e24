#!/usr/bin/env node
'use strict';
// Turn the bench's JSON lines into the Markdown tables of BENCH.md:
//   node bench/markdown.js results.jsonl > tables.md
const fs = require('fs');
const { formatMs } = require('./report');

/**
 * @param {string[]} headers
 * @param {string[][]} rows
 */
function mdTable(headers, rows) {
  /** @param {string} cell */
  const esc = (cell) => String(cell).replace(/\|/g, '\\|');
  return [
    `| ${headers.map(esc).join(' | ')} |`,
    `|${headers.map(() => '---').join('|')}|`,
    ...rows.map((r) => `| ${r.map(esc).join(' | ')} |`),
  ].join('\n');
}

/** @param {number | null | undefined} x */
const mb = (x) => (Number.isFinite(x) ? /** @type {number} */ (x).toFixed(0) : '—');
/** @param {import('./report').CaseRow} r */
const ratio = (r) => (r.ratio === null || r.ratio === undefined ? '—' : `${r.ratio.toFixed(3)}×`);
/** @param {number | null | undefined} x */
const ms = (x) => (x === null || x === undefined ? '—' : formatMs(x));

/** @param {any[]} lines the bench's JSON lines, parsed (each has a `type`) */
function toMarkdown(lines) {
  /** @type {import('./report').MachineRow | undefined} */
  const machine = lines.find((l) => l.type === 'machine');
  /** @type {import('./report').CaseRow[]} */
  const cases = lines.filter((l) => l.type === 'case');
  /** @type {import('./report').ScalingRow[]} */
  const scaling = lines.filter((l) => l.type === 'scaling');
  const out = [];
  if (machine) {
    const py = machine.python;
    out.push(
      `Run of ${machine.date} (${machine.mode}); load average at start ${machine.loadAverage.map((x) => x.toFixed(1)).join(' ')}.`,
      '',
      `- ${machine.cpus} cores, ${machine.cpuModel}, ${machine.memoryGB} GB memory (${machine.availableMB} MB available at start)`,
      `- node ${machine.node}; npm peers ${Object.entries(machine.npmPeers)
        .map(([k, v]) => `${k} ${v}`)
        .join(', ')}`,
      py
        ? `- python ${py.python}, numpy ${py.numpy}, SciPy ${py.scipy}, scikit-learn ${py.sklearn}; BLAS ${py.blasKernel}` +
            (py.threadpools ? `; thread pools ${py.threadpools.map((p) => `${p.internal_api} × ${p.num_threads}`).join(', ')}` : '')
        : `- python peer not run: ${machine.pythonMissing}`,
      '',
    );
  }
  out.push(
    mdTable(
      ['case', 'n × d', 'kinsort ms', 'peer', 'peer ms', 'kinsort ÷ peer', 'target', 'result', 'peak MB kinsort / peer'],
      cases.map((r) => [
        r.title,
        `${r.n.toLocaleString('en-US')} × ${r.d}`,
        ms(r.kinsortMs),
        r.tool,
        ms(r.peerMs),
        ratio(r),
        r.target,
        r.status,
        r.peerPeakMB !== undefined ? `${mb(r.peakMB)} / ${mb(r.peerPeakMB)}` : Number.isFinite(r.peakMB) ? mb(r.peakMB) : '',
      ]),
    ),
  );
  const notes = [...new Set(cases.filter((r) => r.note).map((r) => `- ${r.title} / ${r.tool}: ${r.note}`))];
  if (notes.length) out.push('', ...notes);
  if (scaling.length) {
    out.push(
      '',
      mdTable(
        ['case', 'tool', 'n, 2n, 4n', 'ms at n, 2n, 4n', 'growth per doubling'],
        scaling.map((s) => [
          s.title,
          s.tool,
          s.sizes.map((n) => n.toLocaleString('en-US')).join(', '),
          s.ms.map(ms).join(', '),
          s.growthPerDoubling === null ? '—' : `${s.growthPerDoubling.toFixed(2)}×`,
        ]),
      ),
    );
  }
  return out.join('\n') + '\n';
}

if (require.main === module) {
  const file = process.argv[2];
  if (!file) {
    process.stderr.write('usage: node bench/markdown.js RESULTS.jsonl\n');
    process.exit(2);
  }
  const lines = fs
    .readFileSync(file, 'utf8')
    .trim()
    .split('\n')
    .map((l) => JSON.parse(l));
  process.stdout.write(toMarkdown(lines));
}

module.exports = { toMarkdown };
