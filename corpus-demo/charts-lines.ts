/**
 * Line charts of the Kestrel Valley Water Co-operative annual report.
 * All names and numbers are invented.
 */
import { esc, linear, num, ticks, type Figure } from './svg-kit.js';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/**
 * A plotting-library style export: pt size on the root with a pt viewBox,
 * ticks and point markers drawn with `<use>`, a grey plot background and a
 * dark gridline at every tick.
 */
export function reservoirLevels(): Figure {
  const series = [
    { name: 'Brackenford', color: '#0072b2', marker: 'mk-circle', values: [92, 95, 97, 94, 88, 80, 71, 64, 62, 70, 81, 89] },
    { name: 'Millhaven', color: '#e69f00', marker: 'mk-square', values: [85, 88, 90, 89, 84, 76, 68, 60, 57, 63, 72, 80] },
    { name: 'Tarn End', color: '#000000', marker: 'mk-diamond', values: [78, 82, 86, 87, 83, 77, 70, 65, 61, 66, 71, 75] },
  ];
  const W = 432, H = 300;
  const px0 = 48, px1 = 330, py0 = 36, py1 = 256;
  const y = linear(50, 100, py1, py0);
  const step = (px1 - px0) / MONTHS.length;
  const x = (k: number): number => px0 + (k + 0.5) * step;
  const font = `font-family:'DejaVu Sans', Verdana, sans-serif;fill:#262626`;
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="utf-8" standalone="no"?>`);
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" version="1.1" width="${W}pt" height="${H}pt" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Reservoir storage as a share of capacity, month by month, 2024</title>`);
  out.push(`<defs>`);
  out.push(`  <path id="tick-x" d="M0 0 L0 3.5" style="stroke:#262626;stroke-width:0.8"/>`);
  out.push(`  <path id="tick-y" d="M0 0 L-3.5 0" style="stroke:#262626;stroke-width:0.8"/>`);
  out.push(`  <circle id="mk-circle" cx="0" cy="0" r="2.6"/>`);
  out.push(`  <path id="mk-square" d="M-2.3 -2.3 L2.3 -2.3 L2.3 2.3 L-2.3 2.3 Z"/>`);
  out.push(`  <path id="mk-diamond" d="M0 -3.2 L3.2 0 L0 3.2 L-3.2 0 Z"/>`);
  out.push(`</defs>`);
  out.push(`<g id="figure">`);
  out.push(`  <path d="M0 0 L${W} 0 L${W} ${H} L0 ${H} Z" style="fill:#ffffff"/>`);
  out.push(`  <text x="${(px0 + px1) / 2}" y="22" style="${font};font-size:12px;text-anchor:middle">Reservoir storage, % of capacity, 2024</text>`);
  out.push(`  <g id="axes">`);
  out.push(`    <path d="M${px0} ${py1} L${px1} ${py1} L${px1} ${py0} L${px0} ${py0} Z" style="fill:#c8c8c8;stroke:none"/>`);
  out.push(`    <g id="grid" style="fill:none;stroke:#2e2e2e;stroke-width:1.1">`);
  MONTHS.forEach((_, k) => out.push(`      <path d="M${num(x(k))} ${py1} L${num(x(k))} ${py0}"/>`));
  for (const t of ticks(50, 100, 10)) out.push(`      <path d="M${px0} ${num(y(t))} L${px1} ${num(y(t))}"/>`);
  out.push(`    </g>`);
  out.push(`    <g id="x-ticks">`);
  MONTHS.forEach((m, k) => {
    out.push(`      <use xlink:href="#tick-x" x="${num(x(k))}" y="${py1}"/>`);
    out.push(`      <text x="${num(x(k))}" y="${py1 + 14}" style="${font};font-size:9px;text-anchor:middle">${m}</text>`);
  });
  out.push(`    </g>`);
  out.push(`    <g id="y-ticks">`);
  for (const t of ticks(50, 100, 10)) {
    out.push(`      <use xlink:href="#tick-y" x="${px0}" y="${num(y(t))}"/>`);
    out.push(`      <text x="${px0 - 6}" y="${num(y(t) + 3.2)}" style="${font};font-size:9px;text-anchor:end">${t}</text>`);
  }
  out.push(`      <text x="14" y="${(py0 + py1) / 2}" transform="rotate(-90 14 ${(py0 + py1) / 2})" style="${font};font-size:9px;text-anchor:middle">Storage (% of capacity)</text>`);
  out.push(`    </g>`);
  for (const s of series) {
    const d = s.values.map((v, k) => `${k === 0 ? 'M' : 'L'}${num(x(k))} ${num(y(v))}`).join(' ');
    out.push(`    <g id="line-${s.name.toLowerCase().replace(/\s+/g, '-')}">`);
    out.push(`      <path d="${d}" style="fill:none;stroke:${s.color};stroke-width:1.5;stroke-linecap:square"/>`);
    out.push(`      <g style="fill:${s.color};stroke:${s.color};stroke-width:0.5">`);
    s.values.forEach((v, k) => out.push(`        <use xlink:href="#${s.marker}" x="${num(x(k))}" y="${num(y(v))}"/>`));
    out.push(`      </g>`);
    out.push(`    </g>`);
  }
  out.push(`  </g>`);
  out.push(`  <g id="legend">`);
  out.push(`    <path d="M338 ${py0} L426 ${py0} L426 ${py0 + 62} L338 ${py0 + 62} Z" style="fill:#ffffff;stroke:#cccccc;stroke-width:0.8"/>`);
  series.forEach((s, j) => {
    const ly = py0 + 14 + j * 18;
    out.push(`    <path d="M344 ${ly} L364 ${ly}" style="fill:none;stroke:${s.color};stroke-width:1.5"/>`);
    out.push(`    <use xlink:href="#${s.marker}" x="354" y="${ly}" style="fill:${s.color};stroke:${s.color};stroke-width:0.5"/>`);
    out.push(`    <text x="370" y="${ly + 3.2}" style="${font};font-size:9px;text-anchor:start">${esc(s.name)}</text>`);
  });
  out.push(`  </g>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'reservoir-levels', svg: out.join('\n') + '\n' };
}

/** A style sheet with classes: light horizontal grid, no frame, one line, title and description. */
export function rainfallMonthly(): Figure {
  const rain = [112, 86, 94, 61, 58, 49, 55, 72, 80, 118, 131, 124];
  const W = 640, H = 400;
  const ox = 64, oy = 60, iw = 548, ih = 290;
  const y = linear(0, 140, ih, 0);
  const step = iw / MONTHS.length;
  const x = (k: number): number => (k + 0.5) * step;
  const css = [
    `svg { font-family: ${'Arial, Helvetica, sans-serif'}; }`,
    `.title { font-size: 17px; font-weight: bold; fill: #1a1a1a; }`,
    `.subtitle { font-size: 12px; fill: #4d4d4d; }`,
    `.grid line { stroke: #ebebeb; stroke-width: 1; }`,
    `.baseline { stroke: #7a7a7a; stroke-width: 1; }`,
    `.tick { font-size: 12px; fill: #4d4d4d; }`,
    `.tick.y { text-anchor: end; }`,
    `.tick.x { text-anchor: middle; }`,
    `.rain { fill: none; stroke: #1f5f99; stroke-width: 2.5; stroke-linejoin: round; }`,
    `.dot { fill: #1f5f99; }`,
  ];
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Monthly rainfall at the Osric Falls gauge, 2024</title>`);
  out.push(
    `<desc>Line chart of rainfall in millimetres per month. Rainfall falls from 112 mm in January to a low of 49 mm in June, then rises to a peak of 131 mm in November; the year's total is ${rain.reduce((a, b) => a + b, 0)} mm.</desc>`,
  );
  out.push(`<style>`, ...css.map((c) => `  ${c}`), `</style>`);
  out.push(`<text class="title" x="${ox}" y="28">Monthly rainfall at the Osric Falls gauge, 2024</text>`);
  out.push(`<text class="subtitle" x="${ox}" y="46">Millimetres</text>`);
  out.push(`<g transform="translate(${ox},${oy})">`);
  out.push(`  <g class="grid">`);
  for (const t of ticks(20, 140, 20)) out.push(`    <line x1="0" x2="${iw}" y1="${num(y(t))}" y2="${num(y(t))}"/>`);
  out.push(`  </g>`);
  out.push(`  <line class="baseline" x1="0" x2="${iw}" y1="${ih}" y2="${ih}"/>`);
  for (const t of ticks(0, 140, 20)) out.push(`  <text class="tick y" x="-8" y="${num(y(t) + 4)}">${t}</text>`);
  MONTHS.forEach((m, k) => out.push(`  <text class="tick x" x="${num(x(k))}" y="${ih + 20}">${m}</text>`));
  out.push(`  <path class="rain" d="${rain.map((v, k) => `${k === 0 ? 'M' : 'L'}${num(x(k))},${num(y(v))}`).join('')}"/>`);
  out.push(`  <g>`);
  rain.forEach((v, k) => out.push(`    <circle class="dot" cx="${num(x(k))}" cy="${num(y(v))}" r="3.5"/>`));
  out.push(`  </g>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'rainfall-monthly', svg: out.join('\n') + '\n' };
}
