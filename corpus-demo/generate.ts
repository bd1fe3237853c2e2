/**
 * Writes the demo figures to corpus-demo/figures/*.svg.
 * Run: node --import tsx corpus-demo/generate.ts
 */
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildFigures } from './build-figures.js';

const here = dirname(fileURLToPath(import.meta.url));
const outDir = join(here, 'figures');
mkdirSync(outDir, { recursive: true });
const figures = buildFigures();
const names = new Set(figures.map((f) => `${f.name}.svg`));
// Figures no longer built are removed so the folder matches the generator.
for (const old of readdirSync(outDir)) if (old.endsWith('.svg') && !names.has(old)) rmSync(join(outDir, old));
for (const f of figures) writeFileSync(join(outDir, `${f.name}.svg`), f.svg);
process.stdout.write(`wrote ${figures.length} figures to corpus-demo/figures\n`);
