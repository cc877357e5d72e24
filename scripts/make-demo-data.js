// Writes the demo data in demo-data/ from a fixed seed: an invented regional transit operator's
// pass holders (training month and next month) and its stations. Run: node scripts/make-demo-data.js
// (needs dist/: npm run build). Same seed, same files, byte for byte.
//
// The pass holders come from five overlapping kinds of rider, none cleanly separable: weekday
// commuters, students, weekend and leisure riders, occasional riders, and long-distance regional
// commuters. Some values are missing, a few are outliers, and profile-only columns (home zone,
// age band, monthly spend) are kept apart from the features.
const fs = require('fs');
const path = require('path');
const { createRandom } = require('../dist/random');

const OUT = path.join(__dirname, '..', 'demo-data');
const random = createRandom('kinsort demo data v1');

/** @typedef {import('../src/random').Random} Random */
/** @typedef {Record<string, string | number | null>} Row a pass holder's row, by column */

/** @type {(x: number, lo: number, hi: number) => number} */
const clamp = (x, lo, hi) => Math.min(hi, Math.max(lo, x));
/** @type {(x: number, digits: number) => number} */
const round = (x, digits) => {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
};
/** @type {(r: Random, weights: number[]) => number} */
const pick = (r, weights) => {
  let u = r.next() * weights.reduce((a, b) => a + b, 0);
  for (let i = 0; i < weights.length; i++) {
    u -= weights[i];
    if (u < 0) return i;
  }
  return weights.length - 1;
};
/** @type {(r: Random, shape: number, scale: number) => number} */
const gamma = (r, shape, scale) => {
  // Marsaglia–Tsang, shape ≥ 1 (boosted below 1).
  if (shape < 1) return gamma(r, shape + 1, scale) * Math.pow(r.next(), 1 / shape);
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  for (;;) {
    let x, v;
    do {
      x = r.normal();
      v = 1 + c * x;
    } while (v <= 0);
    v = v * v * v;
    const u = r.next();
    if (u < 1 - 0.0331 * x ** 4 || Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) return d * v * scale;
  }
};
/** @type {(r: Random, a: number, b: number) => number} */
const beta = (r, a, b) => {
  const x = gamma(r, a, 1);
  return x / (x + gamma(r, b, 1));
};

// Kinds of rider: mixing weight and how each variable is drawn.
const KINDS = [
  {
    name: 'commuter',
    weight: 0.3,
    trips: [10, 1.0],
    peak: [8, 2.5],
    weekend: [1.2, 12],
    km: [2.2, 3.5],
    topups: [2, 0.6],
    tenure: [3, 14],
    fare: [0.82, 0.03, 0.05, 0.1],
    autopay: 0.7,
    zones: [0.35, 0.35, 0.2, 0.1],
    ages: [0.05, 0.3, 0.35, 0.25, 0.05],
  },
  {
    name: 'student',
    weight: 0.2,
    trips: [7, 1.1],
    peak: [4, 3],
    weekend: [2.5, 7],
    km: [2.5, 2.0],
    topups: [4, 0.9],
    tenure: [2, 8],
    fare: [0.15, 0.8, 0.0, 0.05],
    autopay: 0.25,
    zones: [0.5, 0.2, 0.2, 0.1],
    ages: [0.7, 0.25, 0.04, 0.01, 0.0],
  },
  {
    name: 'leisure',
    weight: 0.18,
    trips: [4, 1.0],
    peak: [1.5, 6],
    weekend: [5, 4],
    km: [2.5, 3.0],
    topups: [2.5, 0.8],
    tenure: [2.5, 12],
    fare: [0.55, 0.1, 0.25, 0.1],
    autopay: 0.35,
    zones: [0.3, 0.25, 0.3, 0.15],
    ages: [0.15, 0.25, 0.25, 0.2, 0.15],
  },
  {
    name: 'occasional',
    weight: 0.2,
    trips: [1.6, 1.2],
    peak: [2, 3],
    weekend: [2, 3],
    km: [2, 3.0],
    topups: [1.2, 0.7],
    tenure: [1.5, 10],
    fare: [0.6, 0.1, 0.2, 0.1],
    autopay: 0.15,
    zones: [0.25, 0.25, 0.25, 0.25],
    ages: [0.15, 0.2, 0.2, 0.25, 0.2],
  },
  {
    name: 'regional',
    weight: 0.12,
    trips: [8, 1.0],
    peak: [6, 2.5],
    weekend: [1.2, 10],
    km: [6, 4.0],
    topups: [2, 0.6],
    tenure: [4, 15],
    fare: [0.85, 0.02, 0.08, 0.05],
    autopay: 0.8,
    zones: [0.05, 0.1, 0.25, 0.6],
    ages: [0.03, 0.27, 0.4, 0.25, 0.05],
  },
];
const FARES = ['adult', 'student', 'senior', 'reduced'];
const ZONES = ['Central', 'Northbank', 'Eastfield', 'Outer Vale'];
const AGES = ['16-24', '25-39', '40-54', '55-66', '67+'];

/**
 * @param {Random} r
 * @param {string} id
 * @param {{ newFare?: boolean }} [options]
 */
function passHolder(r, id, options = {}) {
  const kind =
    KINDS[
      pick(
        r,
        KINDS.map((k) => k.weight),
      )
    ];
  const trips = gamma(r, kind.trips[0], kind.trips[1]);
  const fareIndex = pick(r, kind.fare);
  const row = {
    holder_id: id,
    trips_per_week: round(clamp(trips, 0.2, 40), 1),
    peak_share: round(beta(r, kind.peak[0], kind.peak[1]), 3),
    weekend_share: round(beta(r, kind.weekend[0], kind.weekend[1]), 3),
    avg_trip_km: round(gamma(r, kind.km[0], kind.km[1]), 1),
    topups_per_month: Math.round(gamma(r, kind.topups[0], kind.topups[1]) * 2) / 2,
    tenure_months: Math.max(1, Math.round(gamma(r, kind.tenure[0], kind.tenure[1]))),
    fare_type: options.newFare && r.next() < 0.03 ? 'youth' : FARES[fareIndex],
    autopay: r.next() < kind.autopay ? 'yes' : 'no',
    home_zone: ZONES[pick(r, kind.zones)],
    age_band: AGES[pick(r, kind.ages)],
    monthly_spend: 0,
  };
  row.monthly_spend = round(row.trips_per_week * 4.3 * (1.1 + 0.12 * row.avg_trip_km) * (fareIndex === 0 ? 1 : 0.6), 2);
  return row;
}

/**
 * @param {Random} r
 * @param {Row[]} rows
 */
function addNoise(r, rows) {
  // A few outliers: data-entry slips and one extreme heavy user per few hundred rows.
  for (const row of rows) {
    const u = r.next();
    if (u < 0.004) row.trips_per_week = round(60 + 30 * r.next(), 1);
    else if (u < 0.007) row.avg_trip_km = round(55 + 20 * r.next(), 1);
  }
  // Missing values, mostly in columns that come from a separate system.
  for (const row of rows) {
    if (r.next() < 0.02) row.avg_trip_km = null;
    if (r.next() < 0.015) row.topups_per_month = null;
    if (r.next() < 0.01) row.weekend_share = null;
    if (r.next() < 0.03) row.home_zone = null;
  }
}

/** @param {Row[]} rows */
function toCsv(rows) {
  const columns = Object.keys(rows[0]);
  /** @param {string | number | null | undefined} v */
  const cell = (v) => {
    if (v === null || v === undefined) return '';
    const s = String(v);
    return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
  };
  return [columns.join(','), ...rows.map((row) => columns.map((c) => cell(row[c])).join(','))].join('\n') + '\n';
}

// --- pass holders, this month and next -----------------------------------------------------
const holders = [];
for (let i = 0; i < 2000; i++) holders.push(passHolder(random, `PH-${String(10001 + i)}`));
addNoise(random, holders);

const nextRandom = random.fork('next month');
const next = [];
for (let i = 0; i < 300; i++) next.push(passHolder(nextRandom, `PH-${String(12001 + i)}`, { newFare: true }));
addNoise(nextRandom, next);

// --- stations: invented names, labelled, for a readable dendrogram ---------------------------
const FIRST = [
  'Ash',
  'Bram',
  'Cor',
  'Dun',
  'Elm',
  'Fen',
  'Gal',
  'Hol',
  'Ives',
  'Kel',
  'Lark',
  'Mor',
  'Nether',
  'Oak',
  'Pell',
  'Quill',
  'Rook',
  'Sel',
  'Thorn',
  'Wex',
];
const SECOND = ['ford', 'bury', 'mead', 'wick', 'ham', 'ley', 'gate', 'stow', 'brook', 'field'];
const SUFFIX = ['', '', '', ' Quay', ' Junction', ' Park', ' Road', ' Cross'];
const STATION_KINDS = [
  {
    name: 'city core',
    count: 12,
    weekday: [9000, 0.35],
    weekendRatio: [0.55, 0.1],
    peak: [0.42, 0.05],
    transfer: [0.45, 0.1],
    parking: [0, 20],
    bikes: [40, 12],
    km: [1.2, 0.8],
    lines: [4, 1.2],
  },
  {
    name: 'inner residential',
    count: 16,
    weekday: [3200, 0.35],
    weekendRatio: [0.45, 0.08],
    peak: [0.55, 0.05],
    transfer: [0.15, 0.06],
    parking: [30, 25],
    bikes: [18, 8],
    km: [5, 1.8],
    lines: [2, 0.7],
  },
  {
    name: 'park and ride',
    count: 10,
    weekday: [2600, 0.3],
    weekendRatio: [0.25, 0.07],
    peak: [0.68, 0.05],
    transfer: [0.08, 0.04],
    parking: [450, 150],
    bikes: [6, 4],
    km: [16, 5],
    lines: [1.4, 0.5],
  },
  {
    name: 'leisure and events',
    count: 8,
    weekday: [1800, 0.45],
    weekendRatio: [1.3, 0.25],
    peak: [0.3, 0.06],
    transfer: [0.12, 0.05],
    parking: [120, 80],
    bikes: [25, 10],
    km: [7, 3],
    lines: [1.8, 0.6],
  },
  {
    name: 'rural halt',
    count: 14,
    weekday: [350, 0.5],
    weekendRatio: [0.5, 0.15],
    peak: [0.5, 0.08],
    transfer: [0.05, 0.03],
    parking: [25, 15],
    bikes: [2, 2],
    km: [28, 8],
    lines: [1, 0.3],
  },
];
const stationRandom = random.fork('stations');
const usedNames = new Set();
const stations = [];
for (const kind of STATION_KINDS) {
  for (let i = 0; i < kind.count; i++) {
    let name;
    do {
      name = FIRST[stationRandom.int(FIRST.length)] + SECOND[stationRandom.int(SECOND.length)] + SUFFIX[stationRandom.int(SUFFIX.length)];
    } while (usedNames.has(name));
    usedNames.add(name);
    const r = stationRandom;
    const weekday = kind.weekday[0] * Math.exp(kind.weekday[1] * r.normal());
    stations.push({
      station: name,
      weekday_boardings: Math.round(weekday),
      weekend_boardings: Math.round(weekday * clamp(kind.weekendRatio[0] + kind.weekendRatio[1] * r.normal(), 0.05, 3)),
      peak_share: round(clamp(kind.peak[0] + kind.peak[1] * r.normal(), 0.05, 0.95), 3),
      transfer_share: round(clamp(kind.transfer[0] + kind.transfer[1] * r.normal(), 0, 0.9), 3),
      parking_spaces: Math.max(0, Math.round(kind.parking[0] + kind.parking[1] * r.normal())),
      bike_docks: Math.max(0, Math.round(kind.bikes[0] + kind.bikes[1] * r.normal())),
      km_from_centre: round(Math.max(0.2, kind.km[0] + kind.km[1] * r.normal()), 1),
      lines_served: Math.max(1, Math.round(kind.lines[0] + kind.lines[1] * r.normal())),
    });
  }
}
// Shuffle so the file order does not give the kinds away.
random.fork('station order').shuffle(stations);

fs.mkdirSync(OUT, { recursive: true });
fs.writeFileSync(path.join(OUT, 'pass-holders.csv'), toCsv(holders));
fs.writeFileSync(path.join(OUT, 'pass-holders-next-month.csv'), toCsv(next));
fs.writeFileSync(path.join(OUT, 'stations.csv'), toCsv(stations));
console.log(`demo-data/: ${holders.length} pass holders, ${next.length} next month, ${stations.length} stations`);
