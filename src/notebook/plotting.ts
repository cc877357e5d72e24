// The plotly bundle, inlined from the installed package (no CDN, no network). Read once per
// process. While it runs, an AMD `define` on the page (notebook front ends load one) is set
// aside so the bundle sets window.Plotly instead of registering an anonymous module.
import * as fs from 'fs';
import * as path from 'path';

let bundle: string | undefined;
let version: string | undefined;

function readBundle(): string {
  if (bundle === undefined) {
    const file = require.resolve('plotly.js-dist-min');
    // Inside a <script>, only "</script" could end the element early; "<\/" means the same in JS.
    bundle = fs.readFileSync(file, 'utf8').replace(/<\/(script)/gi, '<\\/$1');
  }
  return bundle;
}

/** The installed plotting package's version, for naming a shared copy of the bundle. */
export function plottingVersion(): string {
  if (version === undefined) {
    const pkg = path.join(path.dirname(require.resolve('plotly.js-dist-min')), 'package.json');
    version = String((JSON.parse(fs.readFileSync(pkg, 'utf8')) as { version?: string }).version ?? 'unknown').replace(
      /[^0-9A-Za-z.-]/g,
      '',
    );
  }
  return version;
}

/** Three <script> elements that put window.Plotly on the page. */
export function plottingScript(): string {
  return (
    `<script>window.__kinsortDefine=window.define;window.define=undefined;</script>` +
    `<script>${readBundle()}</script>` +
    `<script>if(window.__kinsortDefine!==undefined){window.define=window.__kinsortDefine;}</script>`
  );
}
