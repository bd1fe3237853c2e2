/**
 * Bar charts of the Kestrel Valley Water Co-operative annual report, each
 * written the way a different kind of exporting tool writes SVG.
 * All names and numbers are invented.
 */
import { bands, esc, grouped, linear, num, shade, ticks, type Figure } from './svg-kit.js';

const SANS = 'Arial, Helvetica, sans-serif';

/** Presentation attributes only: `<rect>` bars, `<line>` ticks, a four-sided frame around the plot. */
export function pipeRepairs(): Figure {
  const data: [string, number][] = [
    ['Brackenford', 42],
    ['Millhaven', 57],
    ['Osric Falls', 23],
    ['Tarn End', 31],
    ['Wyle Bridge', 48],
    ['Hollin Moor', 19],
  ];
  const W = 640;
  const H = 420;
  const px0 = 70, px1 = 610, py0 = 50, py1 = 360;
  const y = linear(0, 60, py1, py0);
  const band = bands(data.length, px0, px1);
  const bw = band.width * 0.6;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Pipe repairs by district, 2024</title>`);
  out.push(`<rect x="0" y="0" width="${W}" height="${H}" fill="#ffffff"/>`);
  out.push(`<text x="${W / 2}" y="30" font-family="${SANS}" font-size="16" font-weight="bold" fill="#222222" text-anchor="middle">Pipe repairs by district, 2024</text>`);
  out.push(`<g id="bars">`);
  data.forEach(([, v], k) => {
    const x = band.center(k) - bw / 2;
    out.push(`  <rect x="${num(x)}" y="${num(y(v))}" width="${num(bw)}" height="${num(py1 - y(v))}" fill="#4a7ab5"/>`);
  });
  out.push(`</g>`);
  out.push(`<g id="y-axis" font-family="${SANS}" font-size="12" fill="#333333">`);
  for (const t of ticks(0, 60, 10)) {
    out.push(`  <line x1="${px0 - 5}" y1="${num(y(t))}" x2="${px0}" y2="${num(y(t))}" stroke="#000000" stroke-width="1"/>`);
    out.push(`  <text x="${px0 - 8}" y="${num(y(t) + 4)}" text-anchor="end">${t}</text>`);
  }
  out.push(`  <text x="24" y="${(py0 + py1) / 2}" text-anchor="middle" transform="rotate(-90 24 ${(py0 + py1) / 2})">Repairs</text>`);
  out.push(`</g>`);
  out.push(`<g id="x-axis" font-family="${SANS}" font-size="12" fill="#333333">`);
  data.forEach(([name], k) => {
    const cx = band.center(k);
    out.push(`  <line x1="${num(cx)}" y1="${py1}" x2="${num(cx)}" y2="${py1 + 5}" stroke="#000000" stroke-width="1"/>`);
    out.push(`  <text x="${num(cx)}" y="${py1 + 20}" text-anchor="middle">${esc(name)}</text>`);
  });
  out.push(`</g>`);
  out.push(`<rect x="${px0}" y="${py0}" width="${px1 - px0}" height="${py1 - py0}" fill="none" stroke="#000000" stroke-width="1"/>`);
  out.push(`</svg>`);
  return { name: 'pipe-repairs', svg: out.join('\n') + '\n' };
}

/** A style sheet with classes and translated axis groups; the value axis starts at 80. */
export function customerSatisfaction(): Figure {
  const data: [string, number][] = [
    ['2019', 86.2],
    ['2020', 87.5],
    ['2021', 84.9],
    ['2022', 88.3],
    ['2023', 90.1],
    ['2024', 91.4],
  ];
  const W = 600, H = 400;
  const ox = 70, oy = 56, iw = 500, ih = 290;
  const y = linear(80, 95, ih, 0);
  const band = bands(data.length, 0, iw);
  const bw = band.width * 0.7;
  const css = [
    `.title { font: bold 16px ${SANS}; fill: #222222; text-anchor: middle; }`,
    `.axis text { font: 12px ${SANS}; fill: #333333; }`,
    `.axis .domain { fill: none; stroke: #333333; stroke-width: 1; }`,
    `.axis line { stroke: #333333; stroke-width: 1; }`,
    `.y.axis text { text-anchor: end; }`,
    `.x.axis text { text-anchor: middle; }`,
    `.axis-title { font: 12px ${SANS}; fill: #333333; text-anchor: middle; }`,
    `.bar { fill: #5b8db8; }`,
  ];
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Customers satisfied with their water service, 2019 to 2024</title>`);
  out.push(`<style>`, ...css.map((c) => `  ${c}`), `</style>`);
  out.push(`<text class="title" x="${W / 2}" y="30">Customers satisfied with their water service</text>`);
  out.push(`<g transform="translate(${ox},${oy})">`);
  out.push(`  <g class="bars">`);
  data.forEach(([, v], k) => {
    out.push(`    <rect class="bar" x="${num(band.center(k) - bw / 2)}" y="${num(y(v))}" width="${num(bw)}" height="${num(ih - y(v))}"/>`);
  });
  out.push(`  </g>`);
  out.push(`  <g class="y axis">`);
  out.push(`    <path class="domain" d="M-6,0H0V${ih}H-6"/>`);
  for (const t of ticks(80, 95, 5)) {
    out.push(`    <g class="tick" transform="translate(0,${num(y(t))})"><line x2="-6"/><text x="-9" dy="0.32em">${t}</text></g>`);
  }
  out.push(`  </g>`);
  out.push(`  <g class="x axis" transform="translate(0,${ih})">`);
  out.push(`    <path class="domain" d="M0,6V0H${iw}V6"/>`);
  data.forEach(([name], k) => {
    out.push(`    <g class="tick" transform="translate(${num(band.center(k))},0)"><line y2="6"/><text y="9" dy="0.71em">${name}</text></g>`);
  });
  out.push(`  </g>`);
  out.push(`  <text class="axis-title" transform="translate(-46,${ih / 2}) rotate(-90)">Satisfied customers (%)</text>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'customer-satisfaction', svg: out.join('\n') + '\n' };
}

/** Presentation attributes; every label is 6 px light grey on white. */
export function treatmentCosts(): Figure {
  const data: [string, number][] = [
    ['Screening', 12.4],
    ['Coagulation', 38.9],
    ['Filtration', 54.2],
    ['Disinfection', 21.7],
    ['Sludge handling', 30.5],
    ['Pumping', 46.8],
  ];
  const W = 640, H = 400;
  const px0 = 60, px1 = 620, py0 = 50, py1 = 350;
  const y = linear(0, 60, py1, py0);
  const band = bands(data.length, px0, px1);
  const bw = band.width * 0.55;
  const label = `font-family="${SANS}" font-size="6" fill="#c4c4c4"`;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Treatment cost per megalitre by stage, 2024</title>`);
  out.push(`<text x="${px0}" y="30" font-family="${SANS}" font-size="15" fill="#303030">Treatment cost per megalitre by stage, 2024</text>`);
  out.push(`<g stroke="#eeeeee" stroke-width="1">`);
  for (const t of ticks(10, 60, 10)) out.push(`  <line x1="${px0}" y1="${num(y(t))}" x2="${px1}" y2="${num(y(t))}"/>`);
  out.push(`</g>`);
  for (const [k, [, v]] of data.entries()) {
    out.push(`<rect x="${num(band.center(k) - bw / 2)}" y="${num(y(v))}" width="${num(bw)}" height="${num(py1 - y(v))}" fill="#3d6fa3"/>`);
  }
  out.push(`<line x1="${px0}" y1="${py1}" x2="${px1}" y2="${py1}" stroke="#cccccc" stroke-width="1"/>`);
  out.push(`<g ${label} text-anchor="end">`);
  for (const t of ticks(0, 60, 10)) out.push(`  <text x="${px0 - 4}" y="${num(y(t) + 2)}">${t}</text>`);
  out.push(`</g>`);
  out.push(`<g ${label} text-anchor="middle">`);
  for (const [k, [name, v]] of data.entries()) {
    out.push(`  <text x="${num(band.center(k))}" y="${py1 + 10}">${esc(name)}</text>`);
    out.push(`  <text x="${num(band.center(k))}" y="${num(y(v) - 3)}">${v.toFixed(1)}</text>`);
  }
  out.push(`</g>`);
  out.push(`<text x="20" y="${(py0 + py1) / 2}" ${label} text-anchor="middle" transform="rotate(-90 20 ${(py0 + py1) / 2})">Cost per ML (credits)</text>`);
  out.push(`</svg>`);
  return { name: 'treatment-costs', svg: out.join('\n') + '\n' };
}

/** Inline `style=""` on rects; value-axis labels typed by hand: mixed decimals, left-aligned, in a serif face. */
export function billingTableChart(): Figure {
  const data: [string, number][] = [
    ['Standard', 8.4],
    ['Low income', 5.1],
    ['Large family', 9.6],
    ['Small business', 6.7],
    ['Agricultural', 3.2],
  ];
  const labels = ['0', '2.5', '5.00', '7.5', '10'];
  const W = 620, H = 400;
  const px0 = 80, px1 = 600, py0 = 60, py1 = 340;
  const y = linear(0, 10, py1, py0);
  const band = bands(data.length, px0, px1);
  const bw = band.width * 0.6;
  const serif = `Georgia, 'Times New Roman', serif`;
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="UTF-8" standalone="no"?>`);
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Billed volume per household per month by tariff band</title>`);
  out.push(`<text x="${W / 2}" y="32" style="font-family:${serif};font-size:16px;fill:#1a1a1a;text-anchor:middle">Billed volume per household per month (m³), by tariff band</text>`);
  out.push(`<g style="stroke:#e2e2e2;stroke-width:1">`);
  labels.forEach((_, k) => {
    if (k > 0) out.push(`  <line x1="${px0}" y1="${num(y(k * 2.5))}" x2="${px1}" y2="${num(y(k * 2.5))}"/>`);
  });
  out.push(`</g>`);
  data.forEach(([, v], k) => {
    out.push(`<rect x="${num(band.center(k) - bw / 2)}" y="${num(y(v))}" width="${num(bw)}" height="${num(py1 - y(v))}" style="fill:#6a8caf;stroke:none"/>`);
  });
  out.push(`<line x1="${px0}" y1="${py1}" x2="${px1}" y2="${py1}" style="stroke:#404040;stroke-width:1"/>`);
  out.push(`<g style="font-family:${serif};font-size:13px;fill:#262626">`);
  labels.forEach((s, k) => {
    out.push(`  <text x="28" y="${num(y(k * 2.5) + 4.5)}" style="text-anchor:start">${s}</text>`);
  });
  data.forEach(([name], k) => {
    out.push(`  <text x="${num(band.center(k))}" y="${py1 + 20}" style="text-anchor:middle">${esc(name)}</text>`);
  });
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'billing-table-chart', svg: out.join('\n') + '\n' };
}

/** Office-suite style: pt size on the root, every shape a `<path>` with `style=""`; red and green series. */
export function leakDetection(): Figure {
  const districts = ['Brackenford', 'Millhaven', 'Osric Falls', 'Tarn End', 'Wyle Bridge', 'Hollin Moor'];
  const detected = [64, 81, 37, 45, 72, 29];
  const repaired = [51, 70, 33, 36, 58, 26];
  const series = [
    { name: 'Leaks detected', color: '#cc3333', values: detected },
    { name: 'Repaired within 48 h', color: '#339933', values: repaired },
  ];
  const W = 640, H = 400;
  const px0 = 64, px1 = 620, py0 = 64, py1 = 340;
  const y = linear(0, 100, py1, py0);
  const band = bands(districts.length, px0, px1);
  const bw = band.width * 0.34;
  const text = (x: number, yy: number, s: string, anchor: string, size = 12, fill = '#595959'): string =>
    `<text x="${num(x)}" y="${num(yy)}" style="font-family:Calibri, Arial, sans-serif;font-size:${size}px;fill:${fill};text-anchor:${anchor}">${esc(s)}</text>`;
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="UTF-8"?>`);
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="480pt" height="300pt" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Leaks detected and repaired within 48 hours by district, 2024</title>`);
  out.push(`<g transform="translate(0,0)">`);
  out.push(`  <path d="M0,0 L${W},0 L${W},${H} L0,${H} Z" style="fill:#ffffff;stroke:none"/>`);
  out.push('  ' + text(W / 2, 28, 'Leaks detected and repaired within 48 hours, 2024', 'middle', 17, '#404040'));
  out.push(`  <g>`);
  for (const t of ticks(20, 100, 20)) out.push(`    <path d="M${px0},${num(y(t))} L${px1},${num(y(t))}" style="fill:none;stroke:#d9d9d9;stroke-width:0.75"/>`);
  out.push(`  </g>`);
  series.forEach((s, j) => {
    out.push(`  <g>`);
    s.values.forEach((v, k) => {
      const x0 = band.center(k) - bw + j * bw;
      out.push(`    <path d="M${num(x0)},${py1} L${num(x0)},${num(y(v))} L${num(x0 + bw)},${num(y(v))} L${num(x0 + bw)},${py1} Z" style="fill:${s.color};stroke:none"/>`);
    });
    out.push(`  </g>`);
  });
  out.push(`  <path d="M${px0},${py1} L${px1},${py1}" style="fill:none;stroke:#bfbfbf;stroke-width:0.75"/>`);
  for (const t of ticks(0, 100, 20)) out.push('  ' + text(px0 - 8, y(t) + 4, String(t), 'end'));
  districts.forEach((d, k) => out.push('  ' + text(band.center(k), py1 + 18, d, 'middle')));
  // Legend: swatches and names above the plot.
  series.forEach((s, j) => {
    const lx = 200 + j * 150;
    out.push(`  <path d="M${lx},42 L${lx + 10},42 L${lx + 10},52 L${lx},52 Z" style="fill:${s.color};stroke:none"/>`);
    out.push('  ' + text(lx + 15, 51, s.name, 'start'));
  });
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'leak-detection', svg: out.join('\n') + '\n' };
}

/** Presentation attributes; horizontal bars from zero, labelled at their ends. */
export function connectionsByDistrict(): Figure {
  const data: [string, number][] = [
    ['Brackenford', 12480],
    ['Millhaven', 9860],
    ['Wyle Bridge', 7340],
    ['Tarn End', 5910],
    ['Osric Falls', 4270],
    ['Hollin Moor', 2150],
    ['Ashby Combe', 1420],
  ];
  const W = 640, H = 380;
  const px0 = 110, px1 = 600, py0 = 56, py1 = 336;
  const x = linear(0, 14000, px0, px1);
  const band = bands(data.length, py0, py1);
  const bh = band.width * 0.66;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" role="img" aria-labelledby="t d">`);
  out.push(`<title id="t">Household connections by district, end of 2024</title>`);
  out.push(`<desc id="d">Horizontal bars, largest first: Brackenford 12,480, Millhaven 9,860, Wyle Bridge 7,340, Tarn End 5,910, Osric Falls 4,270, Hollin Moor 2,150, Ashby Combe 1,420 connections.</desc>`);
  out.push(`<text x="${px0}" y="30" font-family="${SANS}" font-size="16" font-weight="bold" fill="#1a1a1a">Household connections by district, end of 2024</text>`);
  out.push(`<g stroke="#e8e8e8" stroke-width="1">`);
  for (const t of ticks(2000, 14000, 2000)) out.push(`  <line x1="${num(x(t))}" y1="${py0}" x2="${num(x(t))}" y2="${py1}"/>`);
  out.push(`</g>`);
  out.push(`<g fill="#2f6b9a">`);
  data.forEach(([, v], k) => {
    out.push(`  <rect x="${px0}" y="${num(band.center(k) - bh / 2)}" width="${num(x(v) - px0)}" height="${num(bh)}"/>`);
  });
  out.push(`</g>`);
  out.push(`<line x1="${px0}" y1="${py0}" x2="${px0}" y2="${py1}" stroke="#4d4d4d" stroke-width="1"/>`);
  out.push(`<g font-family="${SANS}" font-size="12" fill="#333333">`);
  data.forEach(([name, v], k) => {
    out.push(`  <text x="${px0 - 8}" y="${num(band.center(k) + 4)}" text-anchor="end">${esc(name)}</text>`);
    out.push(`  <text x="${num(x(v) + 6)}" y="${num(band.center(k) + 4)}" text-anchor="start">${grouped(v)}</text>`);
  });
  for (const t of ticks(0, 14000, 2000)) out.push(`  <text x="${num(x(t))}" y="${py1 + 18}" text-anchor="middle" fill="#595959">${grouped(t)}</text>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'connections-by-district', svg: out.join('\n') + '\n' };
}

/** Office-suite style with pt size on the root; a plain bar chart from zero. */
export function annualSupply(): Figure {
  const years = [2015, 2016, 2017, 2018, 2019, 2020, 2021, 2022, 2023, 2024];
  const supply = [41.2, 42.0, 43.5, 42.8, 44.1, 45.9, 44.7, 46.3, 47.0, 48.2];
  const W = 640, H = 400;
  const px0 = 60, px1 = 620, py0 = 60, py1 = 350;
  const y = linear(0, 50, py1, py0);
  const band = bands(years.length, px0, px1);
  const bw = band.width * 0.62;
  const font = `font-family:Calibri, Arial, sans-serif`;
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="UTF-8"?>`);
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="480pt" height="300pt" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Water supplied per year, 2015 to 2024, in gigalitres</title>`);
  out.push(`<desc>Bars rise from 41.2 gigalitres in 2015 to 48.2 in 2024, with small dips in 2018 and 2021.</desc>`);
  out.push(`<g>`);
  out.push(`  <text x="${px0}" y="30" style="${font};font-size:17px;fill:#262626">Water supplied per year (gigalitres)</text>`);
  for (const t of ticks(10, 50, 10)) out.push(`  <path d="M${px0},${num(y(t))} L${px1},${num(y(t))}" style="fill:none;stroke:#e0e0e0;stroke-width:1"/>`);
  years.forEach((_, k) => {
    const x0 = band.center(k) - bw / 2;
    const v = supply[k]!;
    out.push(`  <path d="M${num(x0)},${py1} L${num(x0)},${num(y(v))} L${num(x0 + bw)},${num(y(v))} L${num(x0 + bw)},${py1} Z" style="fill:#2e75b6;stroke:none"/>`);
  });
  out.push(`  <path d="M${px0},${py1} L${px1},${py1}" style="fill:none;stroke:#595959;stroke-width:1"/>`);
  for (const t of ticks(0, 50, 10)) {
    out.push(`  <text x="${px0 - 8}" y="${num(y(t) + 4)}" style="${font};font-size:12px;fill:#404040;text-anchor:end">${t}</text>`);
  }
  years.forEach((yr, k) => {
    out.push(`  <text x="${num(band.center(k))}" y="${py1 + 18}" style="${font};font-size:12px;fill:#404040;text-anchor:middle">${yr}</text>`);
  });
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'annual-supply', svg: out.join('\n') + '\n' };
}

/** Extruded bars: a front face, a top and a receding side per bar, on a back wall with gridlines. */
export function districtUsage3d(): Figure {
  const data: [string, number][] = [
    ['Brackenford', 18.4],
    ['Millhaven', 14.2],
    ['Osric Falls', 9.7],
    ['Tarn End', 11.3],
    ['Wyle Bridge', 15.8],
  ];
  const W = 640, H = 420;
  const px0 = 80, px1 = 580, py0 = 80, py1 = 360;
  const dx = 16, dy = -12; // depth offset of the receding faces
  const y = linear(0, 20, py1, py0);
  const band = bands(data.length, px0, px1);
  const bw = band.width * 0.55;
  const front = '#4f81bd';
  const poly = (pts: [number, number][], fill: string): string =>
    `<path d="M${pts.map(([a, b]) => `${num(a)} ${num(b)}`).join(' L')} Z" fill="${fill}" stroke="${shade(fill, 0.8)}" stroke-width="0.5"/>`;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  out.push(`<title>Average daily water use by district, 2024, in megalitres per day</title>`);
  out.push(`<text x="${W / 2}" y="32" font-family="${SANS}" font-size="17" fill="#262626" text-anchor="middle">Average daily water use by district, 2024 (ML/day)</text>`);
  out.push(`<g id="chart" transform="translate(0,0)">`);
  out.push(`  <g id="walls">`);
  out.push(`    ${poly([[px0 + dx, py0 + dy], [px1 + dx, py0 + dy], [px1 + dx, py1 + dy], [px0 + dx, py1 + dy]], '#f2f2f2')}`);
  out.push(`    ${poly([[px0, py1], [px1, py1], [px1 + dx, py1 + dy], [px0 + dx, py1 + dy]], '#d9d9d9')}`);
  out.push(`  </g>`);
  out.push(`  <g id="gridlines" stroke="#bfbfbf" stroke-width="0.75" fill="none">`);
  for (const t of ticks(5, 20, 5)) {
    out.push(`    <path d="M${px0} ${num(y(t))} L${px0 + dx} ${num(y(t) + dy)} L${px1 + dx} ${num(y(t) + dy)}"/>`);
  }
  out.push(`  </g>`);
  out.push(`  <g id="series-1">`);
  data.forEach(([, v], k) => {
    const x0 = band.center(k) - bw / 2;
    const x1 = x0 + bw;
    const top = y(v);
    out.push(`    <g>`);
    out.push(`      ${poly([[x1, top], [x1 + dx, top + dy], [x1 + dx, py1 + dy], [x1, py1]], shade(front, 0.62))}`);
    out.push(`      ${poly([[x0, top], [x0 + dx, top + dy], [x1 + dx, top + dy], [x1, top]], shade(front, 0.8))}`);
    out.push(`      ${poly([[x0, top], [x1, top], [x1, py1], [x0, py1]], front)}`);
    out.push(`    </g>`);
  });
  out.push(`  </g>`);
  out.push(`  <path d="M${px0} ${py0} L${px0} ${py1} L${px1} ${py1}" fill="none" stroke="#7f7f7f" stroke-width="1"/>`);
  out.push(`  <g font-family="${SANS}" font-size="12" fill="#404040">`);
  for (const t of ticks(0, 20, 5)) out.push(`    <text x="${px0 - 8}" y="${num(y(t) + 4)}" text-anchor="end">${t}</text>`);
  data.forEach(([name], k) => out.push(`    <text x="${num(band.center(k))}" y="${py1 + 20}" text-anchor="middle">${esc(name)}</text>`));
  out.push(`  </g>`);
  out.push(`</g>`);
  out.push(`</svg>`);
  return { name: 'district-usage-3d', svg: out.join('\n') + '\n' };
}
