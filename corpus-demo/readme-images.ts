/**
 * Renders the before/after pictures shown in the README from the demo figures and
 * their redrawn versions in corpus-demo/expected/redrawn (plumbline's own renderer).
 * Run: node --import tsx corpus-demo/readme-images.ts
 */
import { readFileSync, mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { renderSvg, encodePng } from '../engine/raster/index.js';
import { writeFileAtomic } from '../engine/report/write-atomic.js';

const here = import.meta.dirname;
const out = resolve(here, '../docs/images');
mkdirSync(out, { recursive: true });

for (const name of ['reservoir-levels', 'water-sources', 'leak-detection']) {
  const before = renderSvg(readFileSync(resolve(here, 'figures', `${name}.svg`), 'utf8'), { width: 480, background: '#ffffff' });
  const after = renderSvg(readFileSync(resolve(here, 'expected/redrawn', `${name}.svg`), 'utf8'), { width: 480, background: '#ffffff' });
  const gap = 16;
  const width = before.width + gap + after.width;
  const height = Math.max(before.height, after.height);
  const rgba = new Uint8Array(width * height * 4).fill(255);
  const blit = (img: typeof before, x0: number): void => {
    for (let y = 0; y < img.height; y++) rgba.set(img.rgba.subarray(y * img.width * 4, (y + 1) * img.width * 4), (y * width + x0) * 4);
  };
  blit(before, 0);
  blit(after, before.width + gap);
  await writeFileAtomic(resolve(out, `${name}.png`), encodePng({ width, height, rgba }));
  console.log(`wrote docs/images/${name}.png`);
}
