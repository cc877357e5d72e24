// Running the built command line from tests: one runner and one "build dist/ if missing" step for
// every CLI test file (node bin/kinsort.js, in a folder of the test's own).
import { execFileSync, spawnSync } from 'child_process';
import { existsSync } from 'fs';
import { join, resolve } from 'path';

export const REPO_ROOT = resolve(__dirname, '../..');
const BIN = join(REPO_ROOT, 'bin/kinsort.js');

export interface CliResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** `kinsort ARGS…` run in `cwd`; `timeout` (ms) turns a hang into a failure rather than a wait. */
export function cliIn(cwd: string, options: { timeout?: number } = {}): (...args: string[]) => CliResult {
  return (...args) => {
    const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: 'utf8', ...options });
    return { status: r.status, stdout: r.stdout, stderr: r.stderr };
  };
}

/** The CLI runs from dist/: build it when a test file runs before `npm test`'s build. */
export function buildDistIfMissing(): void {
  if (existsSync(join(REPO_ROOT, 'dist/cli/main.js'))) return;
  try {
    execFileSync(process.execPath, [join(REPO_ROOT, 'node_modules/typescript/bin/tsc'), '-p', join(REPO_ROOT, 'tsconfig.build.json')], {
      stdio: 'ignore',
    });
  } catch {
    /* type errors elsewhere still emit JavaScript */
  }
}
