// Command-line refusals of a bad choice name the command and the flag the user typed, and a
// metric the library has but a definition cannot carry (Gower) says where it does work.
import { resolve } from 'path';
import { describe, expect, it } from 'vitest';
import { run } from '../../src/cli/main';

const DATA = resolve(__dirname, '../../demo-data/pass-holders.csv');

function fit(extra: string[]): { status: number; err: string } {
  let err = '';
  const status = run(
    [
      'fit',
      DATA,
      '--id',
      'holder_id',
      '--use',
      'trips_per_week,peak_share',
      '--k',
      '3',
      '--out',
      '/nonexistent/never-written.json',
      ...extra,
    ],
    { out: () => undefined, err: (t) => void (err += t) },
  );
  return { status, err };
}

describe('kinsort fit: a bad choice names its flag', () => {
  it.each([
    [['--method', 'kmean'], 'fit --method: ', 'Did you mean "kmeans"?'],
    [['--method', 'kmeans', '--scale', 'z-score'], 'fit --scale: ', 'Did you mean "zscore"?'],
    [['--method', 'kmeans', '--missing', 'medain'], 'fit --missing: ', 'Did you mean "median"?'],
    [['--method', 'hierarchy', '--linkage', 'wards'], 'fit --linkage: ', 'Did you mean "ward"?'],
    [['--method', 'kmedoids', '--metric', 'manhatan'], 'fit --metric: ', 'Did you mean "manhattan"?'],
  ])('%j', (extra, flag, hint) => {
    const { status, err } = fit(extra);
    expect(status).toBe(2);
    expect(err.startsWith(`kinsort: ${flag}`)).toBe(true);
    expect(err).toContain(hint);
    expect(err.trim().split('\n')).toHaveLength(1);
  });

  it('--metric gower says the fluent layer has it and why a definition cannot carry it', () => {
    const { status, err } = fit(['--method', 'kmedoids', '--metric', 'gower']);
    expect(status).toBe(2);
    expect(err).toContain('fit --metric: ');
    expect(err).toContain("prepared.kmedoids({ k, metric: 'gower' })");
    expect(err).toContain('a definition file assigns new rows');
  });
});
