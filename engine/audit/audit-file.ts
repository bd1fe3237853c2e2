/** One file → its FileReport: read, understand, measure, check. Never throws for bad input. */
import { readSvgText } from '../read/read-file.js';
import { DEFAULT_CONFIG, type Config } from '../config/config.js';
import { measureChart, type Measures } from '../measure/measures.js';
import { ALL_RULES } from '../rules/index.js';
import type { Finding, FileReport } from '../report/types.js';
import { SEVERITY_RANK } from '../report/types.js';
import { analyzeSvg, type Analysis } from './analyze.js';
import { chartReport } from './chart-report.js';
import { errorOf } from './error-of.js';

export interface AuditResult {
  report: FileReport;
  analysis: Analysis | null;
  measures: Measures | null;
}

export function runRules(analysis: Analysis, measures: Measures, config: Config = DEFAULT_CONFIG): Finding[] {
  const { chart, scene } = analysis;
  const findings: Finding[] = [];
  for (const rule of ALL_RULES) {
    const setting = config.rules[rule.id];
    const configured = setting?.severity;
    if (configured === 'off') continue;
    if (scene.ignore.includes(rule.id) || scene.ignore.includes('*')) continue;
    const severity = configured ?? rule.severity;
    const thresholds = { ...rule.thresholds, ...(setting?.thresholds ?? {}) };
    let out;
    try {
      out = rule.check({ chart, measures, thresholds, severity });
    } catch (err) {
      findings.push({
        rule: 'plumbline.internal',
        severity: 'note',
        message: `rule ${rule.id} could not run on this file: ${(err as Error).message}`,
        elements: [],
        measures: {},
      });
      continue;
    }
    for (const f of out) {
      // In-file opt-out: data-plumbline-ignore on the element or an ancestor.
      const items = f.elements.map((e) => scene.items.find((it) => it.source.line === e.line && it.source.column === e.column));
      if (items.length > 0 && items.every((it) => it && (it.ignore.includes(rule.id) || it.ignore.includes('*')))) continue;
      findings.push({
        rule: rule.id,
        severity: configured !== undefined ? severity : (f.severity ?? severity),
        message: f.message,
        elements: f.elements,
        measures: f.measures,
        ...(rule.fix ? { fix: rule.fix } : {}),
      });
    }
  }
  findings.sort((a, b) => SEVERITY_RANK[b.severity] - SEVERITY_RANK[a.severity] || a.rule.localeCompare(b.rule));
  return findings;
}

export function auditText(text: string, path: string, config: Config = DEFAULT_CONFIG): AuditResult {
  let analysis: Analysis;
  try {
    analysis = analyzeSvg(text, { file: path });
  } catch (err) {
    return { report: unreadable(path, err), analysis: null, measures: null };
  }
  try {
    const measures = measureChart(analysis.chart, { displayWidth: config.displayWidth });
    const findings = runRules(analysis, measures, config);
    return {
      report: { path, ok: true, error: null, chart: chartReport(analysis.chart), ink: measures.ink.shares, findings },
      analysis,
      measures,
    };
  } catch (err) {
    return { report: unreadable(path, err), analysis: null, measures: null };
  }
}

export async function auditFile(path: string, config: Config = DEFAULT_CONFIG): Promise<AuditResult> {
  let text: string;
  try {
    text = await readSvgText(path);
  } catch (err) {
    return { report: unreadable(path, err), analysis: null, measures: null };
  }
  return auditText(text, path, config);
}

export function unreadable(path: string, err: unknown): FileReport {
  const error = errorOf(err);
  const where = error.line !== null ? ` (line ${error.line}, column ${error.column})` : '';
  return {
    path,
    ok: false,
    error,
    findings: [
      {
        rule: 'plumbline.unreadable',
        severity: 'error',
        message: `cannot read this file${where}: ${error.message}`,
        elements: error.line !== null ? [{ id: null, line: error.line, column: error.column ?? 1 }] : [],
        measures: {},
      },
    ],
  };
}
