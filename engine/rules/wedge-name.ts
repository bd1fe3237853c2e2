/** What to call a pie wedge in a message: its linked label, else the legend entry of its colour. */
import type { Chart, Wedge } from '../classify/chart.js';
import { formatHex } from '../color/format-hex.js';

export function wedgeName(chart: Chart, w: Wedge): string | null {
  if (w.label) return w.label;
  if (!w.color) return null;
  const hex = formatHex(w.color);
  const e = chart.legend.find((l) => l.color && l.name && formatHex(l.color) === hex);
  return e?.name ?? null;
}
