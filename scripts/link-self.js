// Make `require('kinsort')` / `import … from 'kinsort'` resolve inside this repository (notebooks,
// demo, tests) exactly as in a user's project: node_modules/kinsort → the repository root.
const fs = require('fs');
const path = require('path');

const root = path.resolve(__dirname, '..');
const link = path.join(root, 'node_modules', 'kinsort');
fs.mkdirSync(path.dirname(link), { recursive: true });
try {
  const stat = fs.lstatSync(link);
  if (stat.isSymbolicLink() && path.resolve(path.dirname(link), fs.readlinkSync(link)) === root) process.exit(0);
  fs.rmSync(link, { recursive: true, force: true });
} catch {
  /* no link yet */
}
fs.symlinkSync('..', link, 'dir');
