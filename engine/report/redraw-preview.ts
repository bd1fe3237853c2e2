/** The redrawn version of a chart, as the HTML report and the GitHub Action show it. */
import type { Config } from '../config/config.js';
import { redrawText } from '../redraw/redraw.js';
import type { RedrawPreview } from './format-html.js';

/**
 * A function that redraws one chart with every available fix, or returns
 * null when the chart cannot be redrawn (the report already explains why).
 */
export function redrawPreviewer(config?: Config): (text: string, path: string) => RedrawPreview | null {
  return (text, path) => {
    try {
      const r = redrawText(text, path, config ? { config } : {});
      return { output: r.output, applied: r.applied.map((a) => a.rule), changed: r.changed };
    } catch {
      return null;
    }
  };
}
