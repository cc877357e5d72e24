// Ids pass through the command line unchanged: fit on a file, assign it, and the scored CSV holds the
// very id texts of the input (leading zeros, 20 digits, 1.0 vs 1) — the file joins back to its source.
// Data of our own making. CSV as RFC 4180 describes it.
import { mkdtempSync, readFileSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readTable } from '../../src/table';
import { buildDistIfMissing, cliIn } from './cli-runner';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-ids-'));

const kinsort = cliIn(dir);

beforeAll(() => {
  buildDistIfMissing();
}, 120_000);

describe('kinsort fit / assign keep ids exactly', () => {
  it('000001, 1.0 vs 1, 20-digit ids come back in the scored CSV as written', () => {
    const ids = ['000001', '000002', '1.0', '1', '12345678901234567890', '12345678901234567891', '1e3', '1000'];
    const text = 'id,x,y\n' + ids.map((id, i) => `${id},${i % 2 ? 9 - i * 0.1 : 1 + i * 0.1},${i % 2 ? 1 : 8}`).join('\n') + '\n';
    writeFileSync(join(dir, 'd.csv'), text);
    const fit = kinsort('fit', 'd.csv', '--id', 'id', '--use', 'x,y', '--method', 'kmeans', '--k', '2', '--out', 'def.json');
    expect(fit.stderr).toBe('');
    expect(fit.status).toBe(0);
    const assign = kinsort('assign', 'def.json', 'd.csv', '--out', 'scored.csv');
    expect(assign.status).toBe(0);
    const scored = readTable(readFileSync(join(dir, 'scored.csv'), 'utf8'));
    expect(scored.columns[0].values).toEqual(ids);
    expect(scored.columns[1].values.every((s) => s === '1' || s === '2')).toBe(true);
  });
});
