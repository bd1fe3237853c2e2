/** `plumbline rules`: the catalogue with rationale, sources and defaults. */
import { ALL_RULES } from '../rules/index.js';

export async function runRules(opts: { format: 'text' | 'json' }): Promise<number> {
  const catalogue = ALL_RULES.map((r) => ({
    id: r.id,
    family: r.family,
    severity: r.severity,
    rationale: r.rationale,
    source: r.source,
    thresholds: r.thresholds,
    ...(r.fix ? { fix: r.fix } : {}),
  }));
  if (opts.format === 'json') {
    process.stdout.write(JSON.stringify({ rules: catalogue }, null, 2) + '\n');
    return 0;
  }
  const lines: string[] = [];
  for (const r of catalogue) {
    lines.push(`${r.id}  [${r.severity}]`);
    lines.push(`  ${r.rationale}`);
    lines.push(`  source: ${r.source}`);
    const t = Object.entries(r.thresholds);
    if (t.length) lines.push(`  thresholds: ${t.map(([k, v]) => `${k}=${v}`).join(', ')}`);
    if (r.fix) lines.push(`  redraw: ${r.fix}`);
    lines.push('');
  }
  process.stdout.write(lines.join('\n'));
  return 0;
}
