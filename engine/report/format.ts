/** Report → text in the requested format. */
import type { Config } from '../config/config.js';
import { readSvgText } from '../read/read-file.js';
import { formatHtml, type RedrawPreview } from './format-html.js';
import { formatMarkdown } from './format-md.js';
import { formatSarif } from './format-sarif.js';
import { formatText } from './format-text.js';
import { redrawPreviewer } from './redraw-preview.js';
import type { Report } from './types.js';

export type ReportFormat = 'text' | 'json' | 'md' | 'sarif' | 'html';

export interface FormatOptions {
  color: boolean;
  /** HTML: reads a report path's SVG for thumbnails; default reads the file from disk. */
  loadSvg?: (path: string) => Promise<string | null>;
  /** HTML: the redrawn version for "after" thumbnails; default plumbline redraw with `config`; null: none. */
  redraw?: ((text: string, path: string) => RedrawPreview | null) | null;
  /** The configuration the audit used (redraw follows it). */
  config?: Config;
  /** Markdown: chart titles by path. */
  titles?: ReadonlyMap<string, string | null>;
}

/** Reads an SVG for the HTML report; a file that cannot be read gives null (the report already says why). */
export async function loadSvgFromDisk(path: string): Promise<string | null> {
  try {
    return await readSvgText(path);
  } catch {
    return null;
  }
}

export async function formatReport(report: Report, format: ReportFormat, opts: FormatOptions): Promise<string> {
  switch (format) {
    case 'json':
      return JSON.stringify(report, null, 2) + '\n';
    case 'md':
      return formatMarkdown(report, { titles: opts.titles });
    case 'sarif':
      return JSON.stringify(formatSarif(report), null, 2) + '\n';
    case 'html':
      return formatHtml(report, { loadSvg: opts.loadSvg ?? loadSvgFromDisk, redraw: opts.redraw === undefined ? redrawPreviewer(opts.config) : opts.redraw });
    default:
      return formatText(report, opts);
  }
}
