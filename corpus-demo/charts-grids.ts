/**
 * A heatmap and a scatter of the Kestrel Valley Water Co-operative annual
 * report. All names and numbers are invented; random parts come from fixed seeds.
 */
import { esc, linear, normalSource, num, randomSource, ticks, type Figure } from './svg-kit.js';

/** The classic rainbow ramp: blue → cyan → yellow → red, piecewise linear in RGB. */
function rainbow(t: number): string {
  const c = (v: number): number => Math.round(255 * Math.max(0, Math.min(1, v)));
  const r = c(1.5 - Math.abs(4 * t - 3));
  const g = c(1.5 - Math.abs(4 * t - 2));
  const b = c(1.5 - Math.abs(4 * t - 1));
  return `#${[r, g, b].map((v) => v.toString(16).padStart(2, '0')).join('')}`;
}

/** Mains pressure by district and hour, cells coloured on a rainbow ramp with a vector colour bar. */
export function pressureHeatmap(): Figure {
  const districts = ['Brackenford', 'Millhaven', 'Osric Falls', 'Tarn End', 'Wyle Bridge', 'Hollin Moor'];
  const base = [4.1, 3.6, 3.2, 2.9, 3.8, 2.7];
  const swing = [0.8, 1.0, 0.7, 0.9, 0.6, 0.8];
  const noise = normalSource(randomSource(20240611));
  const lo = 2, hi = 4.5;
  const value = (d: number, h: number): number => {
    const demand = 0.9 * Math.exp(-(((h - 8) / 1.5) ** 2)) + 0.7 * Math.exp(-(((h - 19) / 1.8) ** 2));
    const v = base[d]! - swing[d]! * demand + 0.06 * noise();
    return Math.round(Math.max(lo, Math.min(hi, v)) * 100) / 100;
  };
  const W = 700, H = 330;
  const px0 = 110, py0 = 60, cw = 20, ch = 32;
  const px1 = px0 + 24 * cw, py1 = py0 + districts.length * ch;
  const ramp = (v: number): string => rainbow((v - lo) / (hi - lo));
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Mean mains pressure by district and hour of day, 2024</title>`);
  out.push(`<text x="${(px0 + px1) / 2}" y="32" font-family="Tahoma, Verdana, sans-serif" font-size="16" fill="#202020" text-anchor="middle">Mean mains pressure by district and hour of day (bar)</text>`);
  out.push(`<g id="cells" transform="translate(${px0},${py0})" stroke="none">`);
  districts.forEach((_, d) => {
    out.push(`  <g transform="translate(0,${d * ch})">`);
    for (let h = 0; h < 24; h++) out.push(`    <rect x="${h * cw}" y="0" width="${cw}" height="${ch}" fill="${ramp(value(d, h))}"/>`);
    out.push(`  </g>`);
  });
  out.push(`</g>`);
  out.push(`<g font-family="Tahoma, Verdana, sans-serif" font-size="11" fill="#303030">`);
  districts.forEach((name, d) => out.push(`  <text x="${px0 - 8}" y="${num(py0 + (d + 0.5) * ch + 4)}" text-anchor="end">${esc(name)}</text>`));
  for (let h = 0; h < 24; h++) out.push(`  <text x="${num(px0 + (h + 0.5) * cw)}" y="${py1 + 16}" text-anchor="middle">${h}</text>`);
  out.push(`  <text x="${(px0 + px1) / 2}" y="${py1 + 36}" text-anchor="middle">Hour of day</text>`);
  out.push(`</g>`);
  // Colour bar: forty stacked strips, low values at the bottom.
  const bx = px1 + 24, bw = 16;
  const strips = 40;
  const sh = (py1 - py0) / strips;
  out.push(`<g id="colour-bar">`);
  for (let k = 0; k < strips; k++) {
    const v = lo + ((k + 0.5) / strips) * (hi - lo);
    out.push(`  <rect x="${bx}" y="${num(py1 - (k + 1) * sh)}" width="${bw}" height="${num(sh + 0.2)}" fill="${ramp(v)}"/>`);
  }
  out.push(`  <rect x="${bx}" y="${py0}" width="${bw}" height="${py1 - py0}" fill="none" stroke="#303030" stroke-width="0.8"/>`);
  const by = linear(lo, hi, py1, py0);
  out.push(`  <g font-family="Tahoma, Verdana, sans-serif" font-size="11" fill="#303030">`);
  for (const t of ticks(lo, hi, 0.5)) {
    out.push(`    <line x1="${bx + bw}" y1="${num(by(t))}" x2="${bx + bw + 4}" y2="${num(by(t))}" stroke="#303030" stroke-width="0.8"/>`);
    out.push(`    <text x="${bx + bw + 7}" y="${num(by(t) + 4)}">${t.toFixed(1)}</text>`);
  }
  out.push(`  </g>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'pressure-heatmap', svg: out.join('\n') + '\n' };
}

/**
 * Three thousand meter readings drawn as opaque `<use>` markers: floor area
 * against a year's consumption. Exported without a title or description.
 */
export function meterReadings(): Figure {
  const uniform = randomSource(7051);
  const normal = normalSource(uniform);
  const points: [number, number][] = [];
  // Floor areas are log-normal around 95 m²; readings outside the axes are drawn again.
  while (points.length < 3000) {
    const area = 95 * Math.exp(0.32 * normal());
    const use = 18 + 0.92 * area + 24 * normal();
    if (area > 40 && area < 240 && use > 0 && use < 300) points.push([area, use]);
  }
  const W = 432, H = 324;
  const px0 = 56, px1 = 414, py0 = 34, py1 = 280;
  const x = linear(40, 240, px0, px1);
  const y = linear(0, 300, py1, py0);
  const font = `font-family:'DejaVu Sans', Verdana, sans-serif;fill:#1a1a1a`;
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="utf-8" standalone="no"?>`);
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" version="1.1" width="${W}pt" height="${H}pt" viewBox="0 0 ${W} ${H}">`);
  out.push(`<defs>`);
  out.push(`  <path id="tick-x" d="M0 0 L0 3.5" style="stroke:#1a1a1a;stroke-width:0.8"/>`);
  out.push(`  <path id="tick-y" d="M0 0 L-3.5 0" style="stroke:#1a1a1a;stroke-width:0.8"/>`);
  out.push(`  <path id="dot" d="M0 -2.5 A2.5 2.5 0 1 1 0 2.5 A2.5 2.5 0 1 1 0 -2.5 Z"/>`);
  out.push(`</defs>`);
  out.push(`<g id="figure">`);
  out.push(`  <path d="M0 0 L${W} 0 L${W} ${H} L0 ${H} Z" style="fill:#ffffff"/>`);
  out.push(`  <text x="${(px0 + px1) / 2}" y="20" style="${font};font-size:11px;text-anchor:middle">Meter readings 2024: yearly consumption against floor area</text>`);
  out.push(`  <g id="points" style="fill:#2b6cb0;stroke:#1d4f86;stroke-width:0.4">`);
  for (const [a, u] of points) out.push(`    <use xlink:href="#dot" x="${num(x(a))}" y="${num(y(u))}"/>`);
  out.push(`  </g>`);
  out.push(`  <path d="M${px0} ${py0} L${px0} ${py1} L${px1} ${py1}" style="fill:none;stroke:#1a1a1a;stroke-width:0.8"/>`);
  for (const t of ticks(40, 240, 40)) {
    out.push(`  <use xlink:href="#tick-x" x="${num(x(t))}" y="${py1}"/>`);
    out.push(`  <text x="${num(x(t))}" y="${py1 + 14}" style="${font};font-size:9px;text-anchor:middle">${t}</text>`);
  }
  for (const t of ticks(0, 300, 50)) {
    out.push(`  <use xlink:href="#tick-y" x="${px0}" y="${num(y(t))}"/>`);
    out.push(`  <text x="${px0 - 6}" y="${num(y(t) + 3.2)}" style="${font};font-size:9px;text-anchor:end">${t}</text>`);
  }
  out.push(`  <text x="${(px0 + px1) / 2}" y="${py1 + 30}" style="${font};font-size:9px;text-anchor:middle">Floor area (m²)</text>`);
  out.push(`  <text x="16" y="${(py0 + py1) / 2}" transform="rotate(-90 16 ${(py0 + py1) / 2})" style="${font};font-size:9px;text-anchor:middle">Consumption (m³ per year)</text>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'meter-readings', svg: out.join('\n') + '\n' };
}
