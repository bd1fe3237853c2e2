/** Chart → the `chart` block of a FileReport (the JSON contract). */
import type { Axis, Chart } from '../classify/chart.js';
import type { AxisReport, ChartReport } from '../report/types.js';

const round = (v: number, digits = 6): number => (Number.isFinite(v) ? Number(v.toPrecision(digits)) : v);

function axisReport(a: Axis | null): AxisReport | null {
  if (!a) return null;
  return {
    scale: a.scale,
    domain: a.domain.map((d) => (typeof d === 'number' ? round(d) : d)),
    ticks: a.ticks.map((t) => ({ value: typeof t.value === 'number' ? round(t.value) : t.value, position: round(t.position, 7) })),
  };
}

export function chartReport(chart: Chart): ChartReport {
  const counts = { marks: 0, guides: 0, labels: 0, decoration: 0, legend: 0 };
  for (const r of chart.roles) {
    if (r.role === 'mark') counts.marks++;
    else if (r.role === 'guide') counts.guides++;
    else if (r.role === 'label') counts.labels++;
    else if (r.role === 'legend') counts.legend++;
    else counts.decoration++;
  }
  const p = chart.plotArea;
  const axes: ChartReport['axes'] = { x: axisReport(chart.axes.x), y: axisReport(chart.axes.y) };
  if (chart.axes.y2) axes.y2 = axisReport(chart.axes.y2);
  return {
    kind: chart.kind,
    threeD: chart.threeD,
    orientation: chart.orientation,
    plotArea: p ? { x: round(p.x, 7), y: round(p.y, 7), width: round(p.width, 7), height: round(p.height, 7) } : null,
    axes,
    series: chart.series.map((s) => ({
      name: s.name,
      color: s.colorHex,
      ...(s.axis === 'y2' ? { axis: 'y2' as const } : {}),
      points: s.points.map((pt) => ({
        x: typeof pt.x === 'number' ? round(pt.x) : pt.x,
        y: round(pt.y),
        ...(pt.value !== undefined ? { value: pt.value === null ? null : round(pt.value) } : {}),
        ...(pt.yCategory !== undefined && typeof pt.yCategory === 'string' ? { yCategory: pt.yCategory } : {}),
      })),
    })),
    counts,
  };
}
