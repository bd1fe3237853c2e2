/**
 * Pie charts of the Kestrel Valley Water Co-operative annual report.
 * All names and numbers are invented.
 */
import { esc, num, shade, type Figure } from './svg-kit.js';

const DEG = Math.PI / 180;

/**
 * A tilted, extruded pie in office-suite style. The flat pie is turned away
 * from the viewer by `tilt`: a point at angle φ (clockwise from twelve
 * o'clock) on the rim lands at (cx + r·sin φ, cy − r·cos φ·cos tilt). The
 * side wall shows below the front half of the rim (φ from 90° to 270°), in a
 * darker shade of each wedge's colour.
 */
export function waterSources(): Figure {
  const data: [string, number, string][] = [
    ['Upland reservoirs', 46, '#4472c4'],
    ['River abstraction', 27, '#ed7d31'],
    ['Groundwater boreholes', 18, '#a5a5a5'],
    ['Recycling and transfers', 9, '#ffc000'],
  ];
  const W = 640, H = 400;
  const cx = 200, cy = 200, r = 165;
  const tilt = 60 * DEG;
  const ry = r * Math.cos(tilt);
  const depth = 34;
  const pt = (phi: number, drop = 0): [number, number] => [cx + r * Math.sin(phi * DEG), cy - ry * Math.cos(phi * DEG) + drop];
  const p = ([a, b]: [number, number]): string => `${num(a)},${num(b)}`;
  const total = data.reduce((s, d) => s + d[1], 0);
  const wedges: { a0: number; a1: number; color: string }[] = [];
  let a = 0;
  for (const [, v, color] of data) {
    const a1 = a + (v / total) * 360;
    wedges.push({ a0: a, a1, color });
    a = a1;
  }
  const font = 'font-family:Calibri, Arial, Helvetica, sans-serif';
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="UTF-8"?>`);
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="480pt" height="300pt" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Where our water came from in 2024: share of supply by source</title>`);
  out.push(`<g>`);
  out.push(`  <path d="M0,0 L${W},0 L${W},${H} L0,${H} Z" style="fill:#ffffff;stroke:none"/>`);
  out.push(`  <text x="${W / 2}" y="34" style="${font};font-size:18px;fill:#404040;text-anchor:middle">Where our water came from in 2024</text>`);
  out.push(`  <g>`);
  for (const w of wedges) {
    const s = Math.max(w.a0, 90);
    const e = Math.min(w.a1, 270);
    if (e <= s) continue;
    const large = e - s > 180 ? 1 : 0;
    out.push(
      `    <path d="M${p(pt(s))} A${num(r)},${num(ry)} 0 ${large} 1 ${p(pt(e))} L${p(pt(e, depth))} A${num(r)},${num(ry)} 0 ${large} 0 ${p(pt(s, depth))} Z" style="fill:${shade(w.color, 0.7)};stroke:#ffffff;stroke-width:0.75"/>`,
    );
  }
  out.push(`  </g>`);
  out.push(`  <g>`);
  for (const w of wedges) {
    const large = w.a1 - w.a0 > 180 ? 1 : 0;
    out.push(
      `    <path d="M${num(cx)},${num(cy)} L${p(pt(w.a0))} A${num(r)},${num(ry)} 0 ${large} 1 ${p(pt(w.a1))} Z" style="fill:${w.color};stroke:#ffffff;stroke-width:0.75"/>`,
    );
  }
  out.push(`  </g>`);
  out.push(`  <g>`);
  data.forEach(([name, v, color], k) => {
    const ly = 130 + k * 30;
    out.push(`    <path d="M398,${ly - 10} L410,${ly - 10} L410,${ly + 2} L398,${ly + 2} Z" style="fill:${color};stroke:none"/>`);
    out.push(`    <text x="418" y="${ly}" style="${font};font-size:13px;fill:#404040">${esc(name)} (${v}%)</text>`);
  });
  out.push(`  </g>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'water-sources', svg: out.join('\n') + '\n' };
}

/** A flat pie of twelve spending lines with a legend, written with a style sheet and classes. */
export function spendingBreakdown(): Figure {
  const data: [string, number][] = [
    ['Staff', 24.1],
    ['Energy', 15.8],
    ['Chemicals', 9.4],
    ['Maintenance', 11.2],
    ['Loan repayments', 10.6],
    ['IT systems', 4.3],
    ['Vehicles', 3.9],
    ['Insurance', 3.1],
    ['Billing and collection', 5.2],
    ['Laboratory', 2.8],
    ['Environmental levies', 4.7],
    ['Other', 4.9],
  ];
  const colors = ['#1f4e79', '#2e75b6', '#9dc3e6', '#c55a11', '#f4b183', '#548235', '#a9d18e', '#7030a0', '#b4a7d6', '#bf9000', '#ffd966', '#7f7f7f'];
  const W = 640, H = 420;
  const cx = 210, cy = 230, r = 160;
  const pt = (phi: number): string => `${num(cx + r * Math.sin(phi * DEG))} ${num(cy - r * Math.cos(phi * DEG))}`;
  const total = data.reduce((s, d) => s + d[1], 0);
  const css = [
    `text { font-family: Verdana, Geneva, sans-serif; fill: #333333; }`,
    `.title { font-size: 16px; font-weight: bold; }`,
    `.legend text { font-size: 12px; }`,
    `.wedge { stroke: #ffffff; stroke-width: 1; }`,
    ...colors.map((c, k) => `.s${k} { fill: ${c}; }`),
  ];
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Operating spending in 2024 by line of spending</title>`);
  out.push(`<style>`, ...css.map((c) => `  ${c}`), `</style>`);
  out.push(`<text class="title" x="${W / 2}" y="32" text-anchor="middle">Operating spending in 2024, by line of spending</text>`);
  out.push(`<g class="pie">`);
  let a = 0;
  data.forEach(([, v], k) => {
    const a1 = a + (v / total) * 360;
    const large = a1 - a > 180 ? 1 : 0;
    out.push(`  <path class="wedge s${k}" d="M${cx} ${cy} L${pt(a)} A${r} ${r} 0 ${large} 1 ${pt(a1)} Z"/>`);
    a = a1;
  });
  out.push(`</g>`);
  out.push(`<g class="legend" transform="translate(410,70)">`);
  data.forEach(([name, v], k) => {
    out.push(`  <g transform="translate(0,${k * 24})"><rect class="s${k}" width="14" height="14"/><text x="22" y="12">${esc(name)} (${v.toFixed(1)}%)</text></g>`);
  });
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'spending-breakdown', svg: out.join('\n') + '\n' };
}
