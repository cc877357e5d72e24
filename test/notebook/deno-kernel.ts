// Register Deno's notebook kernel for a test: `deno jupyter --install` (the command a user runs)
// with its data folder redirected into a private prefix, so tests running side by side and the
// user's own Jupyter set-up never see each other's kernel specs. Returns the JUPYTER_PATH to use.
import { execFileSync } from 'child_process';
import * as fs from 'fs';
import * as path from 'path';

export function installDenoKernel(deno: string, prefix: string): string {
  const data = path.join(prefix, 'xdg');
  execFileSync(deno, ['jupyter', '--install', '--force'], {
    env: { ...process.env, XDG_DATA_HOME: data, DENO_NO_UPDATE_CHECK: '1' },
    stdio: 'ignore',
  });
  const spec = path.join(data, 'jupyter', 'kernels', 'deno', 'kernel.json');
  if (!fs.existsSync(spec)) throw new Error(`deno jupyter --install wrote no kernel spec at ${spec}`);
  return path.join(data, 'jupyter');
}
