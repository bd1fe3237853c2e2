/**
 * The JSON report: the stable contract scripts and CI jobs read. Fields may be
 * added; renaming or removing one needs a new `reportVersion`.
 */
export const REPORT_VERSION = 1;

export type Severity = 'error' | 'warning' | 'note';

export interface ElementRef {
  id: string | null;
  line: number;
  column: number;
}

export interface Finding {
  rule: string;
  severity: Severity;
  message: string;
  elements: ElementRef[];
  measures: Record<string, number | string | boolean | null | number[] | string[] | Record<string, number | string | null>[]>;
  /** What redraw would do about it, when the rule offers a fix. */
  fix?: string;
}

export type AxisValue = number | string;

export interface AxisReport {
  scale: 'linear' | 'log' | 'band' | 'time';
  domain: AxisValue[];
  ticks: { value: AxisValue; position: number }[];
}

export interface PointReport {
  x: AxisValue | null;
  y: number;
}

export interface SeriesReport {
  name: string | null;
  color: string | null;
  points: PointReport[];
  axis?: 'y' | 'y2';
}

export type ChartKind =
  | 'bar'
  | 'grouped-bar'
  | 'stacked-bar'
  | 'line'
  | 'area'
  | 'scatter'
  | 'pie'
  | 'donut'
  | 'heatmap'
  | 'unknown';

export interface ChartReport {
  kind: ChartKind;
  threeD: boolean;
  orientation: 'vertical' | 'horizontal' | null;
  plotArea: { x: number; y: number; width: number; height: number } | null;
  axes: { x: AxisReport | null; y: AxisReport | null; y2?: AxisReport | null };
  series: SeriesReport[];
  counts: { marks: number; guides: number; labels: number; decoration: number; legend?: number };
}

export interface InkReport {
  data: number;
  guides: number;
  labels: number;
  decoration: number;
}

export interface FileReport {
  path: string;
  ok: boolean;
  error: { message: string; line: number | null; column: number | null } | null;
  chart?: ChartReport;
  ink?: InkReport;
  findings: Finding[];
}

export interface Report {
  reportVersion: number;
  plumbline: string;
  files: FileReport[];
  /** Totals over all files (added by plumbline; not required by readers). */
  totals?: { files: number; unreadable: number; error: number; warning: number; note: number };
}

export const SEVERITY_RANK: Record<Severity, number> = { error: 3, warning: 2, note: 1 };
