// Make `require('kinsort')` / `import … from 'kinsort'` resolve inside this repository (notebooks,
// demo, tests) exactly as in a user's project: node_modules/kinsort → the repository root, and
// node_modules/.bin/kinsort → bin/kinsort.js so `npx kinsort` runs this checkout's command.
const fs = require('fs');
const path = require('path');

const root = path.resolve(__dirname, '..');

function link(at, target, type) {
  fs.mkdirSync(path.dirname(at), { recursive: true });
  try {
    const stat = fs.lstatSync(at);
    if (stat.isSymbolicLink() && fs.readlinkSync(at) === target) return;
    fs.rmSync(at, { recursive: true, force: true });
  } catch {
    /* nothing there yet */
  }
  fs.symlinkSync(target, at, type);
}

link(path.join(root, 'node_modules', 'kinsort'), '..', 'dir');
link(path.join(root, 'node_modules', '.bin', 'kinsort'), '../../bin/kinsort.js', 'file');
fs.chmodSync(path.join(root, 'bin', 'kinsort.js'), 0o755);
