/**
 * Reader benchmark: the 50,000-circle scatter (~5 MB) read by plumbline's
 * reader and by svgson.parseSync in the same run; prints the ratio.
 * Also times the whole understanding step (scene + classify) on the same file.
 */
import { parseSync } from 'svgson';
import { parseXml } from '../engine/read/parse-xml.js';
import { analyzeSvg } from '../engine/audit/analyze.js';
import { makeLargeScatter } from './make-scatter.js';
import { median, timeIt } from './timing.js';

export function runReadBench(rounds = 15): { reader: number; svgson: number; ratio: number; analyze: number } {
  const svg = makeLargeScatter();
  // Warm both up once.
  parseXml(svg);
  parseSync(svg);
  const reader: number[] = [];
  const svgson: number[] = [];
  for (let k = 0; k < rounds; k++) {
    reader.push(timeIt(() => parseXml(svg)));
    svgson.push(timeIt(() => parseSync(svg)));
  }
  const analyze = median([0, 1, 2].map(() => timeIt(() => analyzeSvg(svg))));
  const r = median(reader);
  const s = median(svgson);
  return { reader: r, svgson: s, ratio: s / r, analyze };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const r = runReadBench();
  console.log(`read 50k-circle scatter (${(makeLargeScatter().length / 1e6).toFixed(1)} MB): plumbline ${r.reader.toFixed(0)} ms, svgson.parseSync ${r.svgson.toFixed(0)} ms, ratio ${r.ratio.toFixed(2)}x (goal >= 5)`);
  console.log(`scene + classify of the same file: ${r.analyze.toFixed(0)} ms`);
}
