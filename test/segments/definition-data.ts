// Data of our own making for the definition tests: invented transit pass holders, generated with
// a fixed seed. Four loose groups on trips, peak share and tenure, plus a fare type (categorical),
// autopay (binary) and a service band (ordinal).
import { createRandom } from '../../src/random';

export interface RiderRecord {
  rider: string;
  trips: number | null;
  peak: number | null;
  tenure: number | null;
  fare: string | null;
  autopay: string | null;
  band: string | null;
  postcode: string;
}

const FARES = ['standard', 'concession', 'student'];
const BANDS = ['low', 'mid', 'high'];

export function riders(n: number, seed: number, idPrefix = 'r'): RiderRecord[] {
  const rnd = createRandom(seed);
  const centres = [
    [2, 0.2, 1],
    [12, 0.8, 3],
    [6, 0.5, 8],
    [20, 0.3, 12],
  ];
  const out: RiderRecord[] = [];
  for (let i = 0; i < n; i++) {
    const c = centres[rnd.int(centres.length)];
    out.push({
      rider: `${idPrefix}${String(i + 1).padStart(4, '0')}`,
      trips: Math.max(0, Math.round((c[0] + rnd.normal() * 1.5) * 10) / 10),
      peak: Math.min(1, Math.max(0, Math.round((c[1] + rnd.normal() * 0.08) * 1000) / 1000)),
      tenure: Math.max(0, Math.round((c[2] + rnd.normal()) * 100) / 100),
      fare: FARES[rnd.int(FARES.length)],
      autopay: rnd.next() < 0.5 ? 'yes' : 'no',
      band: BANDS[rnd.int(BANDS.length)],
      postcode: `Z${rnd.int(90) + 10}`,
    });
  }
  return out;
}

/** Records → CSV text (empty cell for null; quotes doubled). */
export function toCsv(records: readonly object[]): string {
  const cols = Object.keys(records[0]);
  const cell = (v: unknown) => {
    if (v === null || v === undefined) return '';
    const s = String(v);
    return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
  };
  return [cols.join(','), ...records.map((r) => cols.map((c) => cell((r as Record<string, unknown>)[c])).join(','))].join('\n') + '\n';
}
