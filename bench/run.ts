/** `npm run bench`: every benchmark, each printing ratios against a baseline measured in the same run. */
import { runReadBench } from './read.js';

const r = runReadBench();
console.log(`[read] plumbline reader ${r.reader.toFixed(0)} ms vs svgson.parseSync ${r.svgson.toFixed(0)} ms on the 50k-circle scatter: ${r.ratio.toFixed(2)}x faster (goal >= 5x)`);
console.log(`[classify] scene + classify of the 50k-circle scatter: ${r.analyze.toFixed(0)} ms`);
for (const extra of ['./diff.js', './audit.js']) {
  try {
    const mod = (await import(extra)) as { run?: () => Promise<void> };
    if (mod.run) await mod.run();
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ERR_MODULE_NOT_FOUND') throw err;
  }
}
