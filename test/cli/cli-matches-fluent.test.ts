// `kinsort fit` and the same calls in a notebook must write the same definition, byte for byte:
// a pipeline and an analyst then hand on interchangeable files. Data of our own making.
import { spawnSync, execFileSync } from 'child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join, resolve } from 'path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readCsvFile } from '../../src/table';
import { study } from '../../src/study';
import { riders, toCsv } from '../segments/definition-data';

const root = resolve(__dirname, '../..');
const dir = mkdtempSync(join(tmpdir(), 'kinsort-cli-fluent-'));
const train = join(dir, 'train.csv');

function fit(...args: string[]): string {
  const out = join(dir, `def-${args.join('-').replace(/[^a-z0-9]+/gi, '_')}.json`);
  const r = spawnSync(
    process.execPath,
    [
      join(root, 'bin/kinsort.js'),
      'fit',
      train,
      '--id',
      'rider',
      '--use',
      'trips,peak,tenure,fare',
      '--keep',
      'postcode',
      '--scale',
      'robust',
      ...args,
      '--out',
      out,
    ],
    { encoding: 'utf8' },
  );
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  return readFileSync(out, 'utf8');
}

beforeAll(() => {
  if (!existsSync(join(root, 'dist/cli/main.js'))) {
    execFileSync(process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', join(root, 'tsconfig.build.json')], {
      stdio: 'ignore',
    });
  }
  writeFileSync(train, toCsv(riders(120, 21)));
}, 120_000);

describe('kinsort fit writes what the fluent layer writes', () => {
  const prepared = () =>
    study(readCsvFile(train), { id: 'rider', use: ['trips', 'peak', 'tenure', 'fare'], keep: ['postcode'] }).prepare({ scale: 'robust' });

  it('k-means', () => {
    expect(fit('--method', 'kmeans', '--k', '3', '--seed', '5', '--restarts', '4')).toBe(
      prepared().kmeans({ k: 3, seed: 5, restarts: 4 }).definition().toJSON(),
    );
  });

  it('k-medoids', () => {
    expect(fit('--method', 'kmedoids', '--k', '3', '--metric', 'manhattan')).toBe(
      prepared().kmedoids({ k: 3, metric: 'manhattan' }).definition().toJSON(),
    );
  });

  it('a hierarchy cut', () => {
    expect(fit('--method', 'hierarchy', '--k', '4', '--linkage', 'average')).toBe(
      prepared().agglomerate({ method: 'average' }).cut({ k: 4 }).definition().toJSON(),
    );
  });

  it('a Gaussian mixture', () => {
    expect(fit('--method', 'mixture', '--k', '3', '--covariance', 'diagonal', '--seed', '2', '--restarts', '2')).toBe(
      prepared().mixture({ k: 3, covariance: 'diagonal', seed: 2, restarts: 2 }).definition().toJSON(),
    );
  });
});
