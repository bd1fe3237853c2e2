/** Report → text in the requested format. */
import { formatHtml } from './format-html.js';
import { formatMarkdown } from './format-md.js';
import { formatSarif } from './format-sarif.js';
import { formatText } from './format-text.js';
import type { Report } from './types.js';

export type ReportFormat = 'text' | 'json' | 'md' | 'sarif' | 'html';

export async function formatReport(report: Report, format: ReportFormat, opts: { color: boolean }): Promise<string> {
  switch (format) {
    case 'json':
      return JSON.stringify(report, null, 2) + '\n';
    case 'md':
      return formatMarkdown(report);
    case 'sarif':
      return JSON.stringify(formatSarif(report), null, 2) + '\n';
    case 'html':
      return formatHtml(report);
    default:
      return formatText(report, opts);
  }
}
