// The variable-tree and rules views with hostile text in column names, levels and segment names:
// nothing from data reaches the page unescaped, and in headless Chromium no injected script runs.
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { describe, expect, it } from 'vitest';
import { chromium } from 'playwright-core';
import { variableTree } from '../../src/methods/variables';
import { fitRules } from '../../src/segments';
import { specFromCells } from '../../src/segments/rules-columns';
import { labelledTree } from '../../src/segments/rules-text';
import { correlationHeatmapView, rulesTreeView, rulesView, saveViewsPage, segmentRulesHtml, variableGroupsView } from '../../src/views';
import { createRandom } from '../../src/random';

const HOSTILE = `<img src=x onerror="window.__pwned=1">`;
const LEVEL = `</script><script>window.__pwned=2</script>`;

function build() {
  const rng = createRandom(8);
  const rows: number[][] = [];
  for (let i = 0; i < 80; i++) {
    const a = rng.normal();
    const b = rng.normal();
    rows.push([a, a + 0.3 * rng.normal(), b, b + 0.3 * rng.normal()]);
  }
  const names = [HOSTILE, 'trips & "fares"', `peak's`, 'x<y'];
  const tree = variableTree(rows, { names });
  const zone = rows.map((r) => (r[0] > 0 ? LEVEL : 'plain'));
  const target = Int32Array.from(rows.map((r) => (r[0] > 0 ? 0 : r[2] > 0 ? 1 : 2)));
  const specs = [
    specFromCells(HOSTILE, zone),
    specFromCells(
      'b',
      rows.map((r) => r[2]),
    ),
  ];
  const rules = fitRules(
    { specs, cells: [zone, rows.map((r) => r[2])], assignment: target, k: 3, titles: { 1: HOSTILE } },
    { depth: 2, minLeaf: 3 },
  );
  return { tree, rules };
}

describe('variable and rules views escape data', () => {
  const { tree, rules } = build();
  const views = [
    correlationHeatmapView(
      { names: tree.names, correlation: tree.correlation, order: tree.order },
      { assignment: tree.cut({ k: 2 }), notes: [`Left out: ${HOSTILE}`] },
    ),
    variableGroupsView(tree.groups({ k: 2 })),
    rulesView(rules),
    rulesTreeView(labelledTree(rules.tree.root, rules.columns), { names: { 1: HOSTILE } }),
  ];

  it('no raw markup from data in any fragment', () => {
    expect(rules.agreement.overall).toBe(1);
    for (const v of views) {
      const html = v.fragment();
      expect(html).not.toContain('<img');
      expect(html).not.toContain('<script>window');
    }
    const fragment = segmentRulesHtml(rules, 1);
    expect(fragment).not.toContain('<script>window');
    expect(fragment).toContain('&lt;/script&gt;');
  });

  it('in headless Chromium, nothing injected runs', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-varrules-'));
    const file = saveViewsPage(path.join(dir, 'page.html'), 'Variables and rules', views);
    const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
    try {
      const page = await browser.newPage();
      await page.goto('file://' + file, { timeout: 120_000 });
      await page.waitForTimeout(500);
      expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
      expect(await page.locator('.kinsort-view').count()).toBe(4);
    } finally {
      await browser.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  }, 120_000);
});
