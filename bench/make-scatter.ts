/** Generates the large scatter used by the reader and audit benchmarks: 50,000 circles, ~5 MB. */
export function makeLargeScatter(points = 50_000, seed = 7): string {
  let s = seed >>> 0;
  const rand = (): number => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
  const parts: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<svg xmlns="http://www.w3.org/2000/svg" width="800" height="600" viewBox="0 0 800 600">',
    '<rect x="0" y="0" width="800" height="600" fill="#ffffff"/>',
    '<g id="axes" stroke="#333333" stroke-width="1">',
    '<line x1="60" y1="540" x2="760" y2="540"/><line x1="60" y1="40" x2="60" y2="540"/>',
  ];
  for (let k = 0; k <= 10; k++) {
    const x = 60 + k * 70;
    const y = 540 - k * 50;
    parts.push(`<line x1="${x}" y1="540" x2="${x}" y2="546"/><line x1="54" y1="${y}" x2="60" y2="${y}"/>`);
  }
  parts.push('</g><g id="labels" font-family="sans-serif" font-size="11" fill="#333333">');
  for (let k = 0; k <= 10; k++) {
    parts.push(`<text x="${60 + k * 70}" y="560" text-anchor="middle">${k * 10}</text>`);
    parts.push(`<text x="50" y="${544 - k * 50}" text-anchor="end">${k * 100}</text>`);
  }
  parts.push('</g><g id="points" fill="#1f6fb4" fill-opacity="0.6">');
  for (let k = 0; k < points; k++) {
    const vx = rand() * 100;
    const vy = Math.min(1000, Math.max(0, 500 + (rand() + rand() + rand() - 1.5) * 400));
    const x = (60 + vx * 7).toFixed(3);
    const y = (540 - vy * 0.5).toFixed(3);
    parts.push(`<circle cx="${x}" cy="${y}" r="2.5" stroke="#0b3d6b" stroke-width="0.5" class="pt" data-row="${k}"/>`);
  }
  parts.push('</g></svg>');
  return parts.join('\n');
}
