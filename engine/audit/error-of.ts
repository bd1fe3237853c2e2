/** Any thrown value → the `error` block of a FileReport, keeping line and column when known. */
import type { FileReport } from '../report/types.js';

export function errorOf(err: unknown): NonNullable<FileReport['error']> {
  if (err && typeof err === 'object') {
    const e = err as { message?: unknown; line?: unknown; column?: unknown };
    const message = typeof e.message === 'string' ? e.message : String(err);
    const line = typeof e.line === 'number' ? e.line : null;
    const column = typeof e.column === 'number' ? e.column : null;
    return { message, line, column };
  }
  return { message: String(err), line: null, column: null };
}
