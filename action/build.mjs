// Bundles the action's entry into one ES module file. Left out, and resolved
// by node from the action's node_modules at run time (action.yml installs the
// runtime dependencies first):
// - @resvg/resvg-js, a native addon (a .node binary per platform);
// - css-tree, which reads its JSON data files relative to its own modules;
// - opentype.js, which the engine loads with require();
// - the fonts of dejavu-fonts-ttf, found through require.resolve.
//
// usage: node action/build.mjs [--outfile PATH]
import { build } from 'esbuild';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const i = process.argv.indexOf('--outfile');
const outfile = i > 0 && process.argv[i + 1] ? resolve(process.argv[i + 1]) : resolve(root, 'action/dist/index.js');

await build({
  entryPoints: [resolve(root, 'action/main.ts')],
  outfile,
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'esm',
  external: ['@resvg/resvg-js', 'css-tree', 'opentype.js'],
  // Bundled CommonJS packages call require() for node built-ins.
  banner: { js: "import { createRequire as __plumblineCreateRequire } from 'node:module'; const require = __plumblineCreateRequire(import.meta.url);" },
  legalComments: 'linked',
  logLevel: 'warning',
  absWorkingDir: root,
});
console.log(`built ${outfile}`);
