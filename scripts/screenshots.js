#!/usr/bin/env node
// Remakes the view screenshots in docs/screenshots/ from the current code and the demo data:
// every view at 760 px (a notebook beside a side panel) and 1,400 px, with scripts on (the live
// chart) and off (the still that a saved, untrusted notebook shows).
//
// Usage: npm run build && node scripts/screenshots.js [--out docs/screenshots] [--only name,name]
const fs = require('fs');
const path = require('path');
const { chromium } = require('playwright-core');

const root = path.join(__dirname, '..');
const kinsort = require(path.join(root, 'dist', 'index.js'));
const { study, readCsvFile } = kinsort;

/**
 * @param {string} name
 * @param {string} fallback
 */
function argument(name, fallback) {
  const i = process.argv.indexOf(name);
  return i >= 0 && process.argv[i + 1] ? process.argv[i + 1] : fallback;
}
const outDir = path.resolve(argument('--out', path.join(root, 'docs', 'screenshots')));
const only = argument('--only', '') ? argument('--only', '').split(',') : null;
const { NAMES, segmentsByTrait } = require('./demo-names');
/** @param {string} f */
const data = (f) => path.join(root, 'demo-data', f);

// The demo recipe (scripts/demo.js), shortened: the same data, features and seeds.
function views() {
  const holders = study(readCsvFile(data('pass-holders.csv')), {
    id: 'holder_id',
    use: ['trips_per_week', 'peak_share', 'weekend_share', 'avg_trip_km', 'topups_per_month', 'tenure_months', 'fare_type', 'autopay'],
    keep: ['home_zone', 'age_band', 'monthly_spend'],
  }).prepare({ scale: 'robust', log: ['trips_per_week', 'avg_trip_km', 'topups_per_month', 'tenure_months'], missing: 'median' });
  const seg = holders.kmeans({ k: 5, seed: 11, restarts: 25 });
  // Named as the demo names them: by the trait each card shows, not by segment number.
  const numbers = segmentsByTrait(seg.profiles(), NAMES);
  NAMES.forEach((n, i) => seg.name(numbers[i], { title: n.title, text: n.text }));
  const stations = study(readCsvFile(data('stations.csv')), { id: 'station' }).prepare({
    scale: 'zscore',
    log: ['weekday_boardings', 'weekend_boardings', 'parking_spaces', 'bike_docks'],
  });
  const tree = stations.agglomerate({ method: 'ward' });
  const scored = seg.definition().assign(readCsvFile(data('pass-holders-next-month.csv')));
  return {
    'k-evidence': () => holders.compareK({ from: 2, to: 8, seed: 11, references: 10 }).view(),
    scree: () => kinsort.screeView(kinsort.project(holders.data.matrix, { components: 8 })),
    'profile-cards': () => seg.cards(),
    projection: () => seg.projection({ loadings: true }),
    silhouette: () => seg.silhouette().view(),
    dendrogram: () => tree.dendrogram({ k: 5 }),
    heatmap: () => tree.heatmap({ k: 5 }),
    drift: () => scored.drift().view(),
  };
}

async function main() {
  fs.mkdirSync(outDir, { recursive: true });
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
  try {
    for (const [name, make] of Object.entries(views())) {
      if (only && !only.includes(name)) continue;
      const html = make().html();
      for (const width of [760, 1400]) {
        for (const scripts of [true, false]) {
          const page = await browser.newPage({ viewport: { width, height: 900 }, javaScriptEnabled: scripts });
          await page.setContent(html, { waitUntil: 'load', timeout: 120000 });
          if (scripts && html.includes('ks-spec')) await page.waitForSelector('[data-drawn]', { timeout: 120000 });
          const file = path.join(outDir, `${name}-${width}${scripts ? '' : '-still'}.png`);
          await page.locator('figure.kinsort-view').screenshot({ path: file });
          await page.close();
          console.log(`  ${path.relative(root, file)}`);
        }
      }
    }
  } finally {
    await browser.close();
  }
}

main().catch((e) => {
  console.error(`screenshots: ${e && e.stack ? e.stack : e}`);
  process.exit(1);
});
