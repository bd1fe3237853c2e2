/**
 * plumbline's public API. The pipeline runs in one direction:
 * SVG text → document → Scene → Chart → Measures → findings, and back to SVG through redraw.
 */
export { parseXml, DEFAULT_LIMITS, type ReadLimits, type ParseOptions } from './read/parse-xml.js';
export { SvgReadError, type XmlDocument, type XmlElement, type XmlNode } from './read/xml-tree.js';
export { readSvgText } from './read/read-file.js';
export { buildScene, type SceneOptions } from './read/build-scene.js';
export type { Scene, SceneItem, ShapeItem, TextItem, ImageItem, Paint, Box, SourceRef } from './read/scene.js';
export { classifyChart } from './classify/classify-chart.js';
export type { Chart, Axis, Series, DataPoint, ItemRole, Role, SubRole, PieInfo, Wedge, LegendEntry, ColorBar } from './classify/chart.js';
export { measureChart, type Measures, type MeasureOptions } from './measure/measures.js';
export { ALL_RULES, ruleById } from './rules/index.js';
export type { Rule, RuleInfo, RuleContext, Family } from './rules/rule.js';
export { analyzeSvg, type Analysis, type AnalyzeOptions } from './audit/analyze.js';
export { auditText, auditFile, runRules, type AuditResult } from './audit/audit-file.js';
export { loadConfig, parseConfig, DEFAULT_CONFIG, type Config, type RuleSetting } from './config/config.js';
export { redrawText, RedrawVerificationError, type RedrawOptions, type RedrawResult } from './redraw/redraw.js';
export { renderSvg, renderPng, diffSvgTexts, diffImages } from './raster/index.js';
export { formatReport, type ReportFormat } from './report/format.js';
export { makeReport } from './report/totals.js';
export { writeFileAtomic } from './report/write-atomic.js';
export { REPORT_VERSION, type Report, type FileReport, type Finding, type Severity, type ChartReport } from './report/types.js';
export { VERSION } from './version.js';
