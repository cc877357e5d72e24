#!/usr/bin/env node
// npm run demo: the pass-holder analysis of notebooks/01-pass-holder-segments.ipynb without a
// notebook server. Reads demo-data/, writes out/demo/report.html (every view, the cards and the
// write-up, offline) and out/demo/pass-holder-segments.json (the definition), and says where.
// Same data, same seeds: the definition file is byte-identical from run to run.
//
// Usage: node scripts/demo.js [--out FOLDER]   (needs dist/: npm run build)
const fs = require('fs');
const path = require('path');

const root = path.join(__dirname, '..');
if (!fs.existsSync(path.join(root, 'dist', 'index.js'))) {
  console.error('kinsort demo: dist/ is missing; run "npm run build" first.');
  process.exit(2);
}
/** @type {typeof import('../src/index')} */
const kinsort = require(path.join(root, 'dist', 'index.js'));
const { study, readCsvFile, loadDefinition } = kinsort;
/** @type {typeof import('../src/internal')} */
const { plottingScript } = require(path.join(root, 'dist', 'internal.js'));

/**
 * @param {string} name
 * @param {string} fallback
 */
function argument(name, fallback) {
  const i = process.argv.indexOf(name);
  return i >= 0 && process.argv[i + 1] ? process.argv[i + 1] : fallback;
}
const outDir = path.resolve(argument('--out', path.join(root, 'out', 'demo')));
const dataDir = path.join(root, 'demo-data');

// The recipe, shared word for word with notebook 1 (see its Markdown cells for the reasons).
const SEED = 11;
const FEATURES = [
  'trips_per_week',
  'peak_share',
  'weekend_share',
  'avg_trip_km',
  'topups_per_month',
  'tenure_months',
  'fare_type',
  'autopay',
];
const PROFILE_ONLY = ['home_zone', 'age_band', 'monthly_spend'];
const SKEWED = ['trips_per_week', 'avg_trip_km', 'topups_per_month', 'tenure_months'];
const K = 5;

const { NAMES, segmentsByTrait } = require('./demo-names');

/**
 * @param {string} text
 * @param {string} start
 * @param {string} end
 */
function between(text, start, end) {
  const a = text.indexOf(start);
  const b = text.indexOf(end, a + start.length);
  if (a < 0 || b < 0) throw new Error(`kinsort demo: the write-up page changed shape (no ${start} … ${end}).`);
  return text.slice(a + start.length, b);
}

/**
 * The evidence for k and the k the demo fits, as one story: the recommendation and its rule, what
 * the other criteria say, and either agreement with the fitted k or the reason to depart from it.
 * @param {import('../src/index').CompareKResult} evidence
 * @param {number} k
 * @param {import('../src/index').StabilityResult} stability
 */
function evidenceInWords(evidence, k, stability) {
  const row = evidence.table.find((r) => r.k === k);
  const sentences = [`${evidence.headline}.`];
  const coarse = [
    ...new Set([evidence.byCriterion.silhouette, evidence.byCriterion.calinskiHarabasz, evidence.byCriterion.daviesBouldin]),
  ].sort((a, b) => a - b);
  if (coarse.some((c) => c !== evidence.recommended)) {
    sentences.push(
      `The silhouette, Calinski–Harabasz and Davies–Bouldin favour k = ${coarse.join(' or ')}: they reward the cleanest split, ` +
        `and the coarsest split is the cleanest; they do not say whether finer segments are real, which stability and the gap statistic do.`,
    );
  }
  const strength = evidence.byCriterion.predictionStrength;
  const atRecommended = evidence.table.find((r) => r.k === evidence.recommended);
  if (atRecommended && atRecommended.predictionStrength !== undefined && strength !== evidence.recommended) {
    sentences.push(
      `Prediction strength, which asks whether centres found on half the holders sort the other half alike, ` +
        (strength === undefined ? 'stays below 0.8 at every k' : `holds at 0.8 or more up to k = ${strength}`) +
        ` (${atRecommended.predictionStrength.toFixed(2)} at k = ${evidence.recommended}): the groups overlap, so half the rows place ` +
        `the boundaries less firmly, while on all rows every segment at k = ${evidence.recommended} keeps a bootstrap Jaccard of ` +
        // The demo's compareK keeps stability on (its default), so every row carries it.
        `${/** @type {number} */ (atRecommended.weakestStability).toFixed(2)} or more.`,
    );
  }
  if (evidence.recommended === k) {
    sentences.push(
      `We fit k = ${k}, as recommended: refitted with 25 restarts, every one of the ${k} segments comes back in 30 bootstrap resamples ` +
        `(Jaccard ${stability.jaccard.map((j) => j.toFixed(2)).join(', ')}).`,
    );
  } else {
    sentences.push(
      `We fit k = ${k}, not the recommended k = ${evidence.recommended}: ` +
        // Stability on (compareK's default): the casts only say so; undefined would compare false as before.
        (row && /** @type {number} */ (row.weakestStability) >= 0.75
          ? `every segment at k = ${k} is stable too (weakest Jaccard ${/** @type {number} */ (row.weakestStability).toFixed(2)}) and ${k} segments serve the operator's campaigns better.`
          : `this departs from the evidence and the segments should be read with care.`),
    );
  }
  if (row && row.silhouette < 0.25) {
    sentences.push(
      `At k = ${k} the average silhouette is ${row.silhouette.toFixed(2)}, below 0.25 (common practice: no substantial structure): ` +
        'the segments are reproducible but overlap, so rows near a boundary could belong to either side.',
    );
  }
  return sentences.join(' ');
}

/** @param {unknown} s */
function escape(s) {
  return String(s).replace(
    /[&<>"']/g,
    (c) => /** @type {Record<string, string>} */ ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c],
  );
}

function main() {
  const started = Date.now();
  /** @param {string} line */
  const say = (line) => console.log(`  ${line}`);
  console.log('kinsort demo: segmenting the demo pass holders');

  const holders = study(readCsvFile(path.join(dataDir, 'pass-holders.csv')), {
    id: 'holder_id',
    use: FEATURES,
    keep: PROFILE_ONLY,
  }).prepare({ scale: 'robust', log: SKEWED, missing: 'median' });
  const imputed = holders.report.imputed.map((c) => `${c.count} ${c.column}`).join(', ');
  say(`${holders.report.keptRows} of ${holders.report.inputRows} rows prepared; filled with the median: ${imputed || 'none'}`);

  const evidence = holders.compareK({ from: 2, to: 8, seed: SEED, references: 10 });
  say(
    `evidence for k: ${evidence.headline}; fitted k = ${K}${evidence.recommended === K ? ' (as recommended)' : ' (the report says why)'}`,
  );

  const seg = holders.kmeans({ k: K, seed: SEED, restarts: 25 });
  const medoids = holders.kmedoids({ k: K, seed: SEED });
  const agreement = seg.compare(medoids).adjustedRandIndex;
  const stability = seg.stability({ resamples: 30 });
  const sil = seg.silhouette();
  say(`k-means sizes ${seg.sizes.join(' / ')}; average silhouette ${sil.average.toFixed(3)}; ARI with k-medoids ${agreement.toFixed(3)}`);
  say(`bootstrap stability (Jaccard) ${stability.jaccard.map((j) => j.toFixed(2)).join(' / ')}`);

  const numbers = segmentsByTrait(seg.profiles(), NAMES);
  NAMES.forEach((n, i) => seg.name(numbers[i], { title: n.title, text: n.text }));

  const stations = study(readCsvFile(path.join(dataDir, 'stations.csv')), { id: 'station' }).prepare({
    scale: 'zscore',
    log: ['weekday_boardings', 'weekend_boardings', 'parking_spaces', 'bike_docks'],
  });
  const tree = stations.agglomerate({ method: 'ward' });

  fs.mkdirSync(outDir, { recursive: true });
  const definitionFile = path.join(outDir, 'pass-holder-segments.json');
  seg.definition({ note: 'Demo pass holders, k-means k = 5 on robust-scaled features (scripts/demo.js).' }).save(definitionFile);

  // Next month's rows scored with the saved definition, as a colleague would, and their drift.
  const scored = loadDefinition(definitionFile).assign(readCsvFile(path.join(dataDir, 'pass-holders-next-month.csv')));
  const drift = scored.drift();
  const largest = [...drift.features].sort((a, b) => b.stabilityIndex - a.stabilityIndex)[0];
  say(
    `next month: ${drift.scoredRows} of ${drift.inputRows} rows scored; far from every segment ${(drift.far.newShare * 100).toFixed(1)} %; ` +
      `largest shift ${largest ? `${largest.feature} (stability index ${largest.stabilityIndex.toFixed(3)}, ${largest.reading})` : 'none'}`,
  );
  const driftSection =
    `<h2>Next month's pass holders</h2><p>The saved definition applied to next month's rows, unchanged: how the segments' ` +
    `shares moved, how many rows sit far from every segment, and how far each feature's distribution shifted.</p>` +
    drift.view().fragment();

  const title = 'Pass-holder segments (demo data)';
  const writeUp = seg.writeUp({ title }).html();
  const style = between(writeUp, '<style>', '</style>');
  const body = between(writeUp, '<body>', '</body>');
  const cardsAt = body.indexOf('<figure class="kinsort-view"');
  if (cardsAt < 0) throw new Error('kinsort demo: the write-up page holds no cards.');
  const why =
    `<p>${escape(evidenceInWords(evidence, K, stability))} k-medoids finds ` +
    `nearly the same split (adjusted Rand index ${escape(agreement.toFixed(2))}).</p>`;
  const views = [evidence.view(), seg.projection({ loadings: true }), sil.view()];
  const hierarchy =
    `<h2>Stations: a labelled hierarchy</h2><p>The 60 stations, Ward linkage on z-scored (and, for counts, logged) ` +
    `figures; cophenetic correlation ${escape(tree.copheneticCorrelation().toFixed(3))}.</p>` +
    tree.dendrogram({ k: 5, title: 'Stations by Ward linkage, cut into 5' }).fragment();
  const page =
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width">` +
    `<title>${escape(title)}</title><style>${style}</style>${plottingScript()}</head><body>` +
    body.slice(0, cardsAt) +
    `<h2>How many segments</h2>${why}` +
    views.map((v) => v.fragment()).join('') +
    `<h2>The segments</h2>` +
    body.slice(cardsAt) +
    driftSection +
    hierarchy +
    `</body></html>`;
  const reportFile = path.join(outDir, 'report.html');
  fs.writeFileSync(reportFile, page);

  console.log(`kinsort demo: done in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  console.log(`  report:     ${reportFile}`);
  console.log(`  definition: ${definitionFile}`);
  console.log(
    `  apply it:   npx kinsort assign ${path.relative(process.cwd(), definitionFile)} demo-data/pass-holders-next-month.csv --out scored.csv`,
  );
}

try {
  main();
} catch (e) {
  // Anything can be thrown; an Error is told by its message.
  const thrown = /** @type {any} */ (e);
  console.error(`kinsort demo: ${thrown && thrown.message ? thrown.message : thrown}`);
  process.exit(1);
}
