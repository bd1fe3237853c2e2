/** Findings as workflow annotations (shown on the file in the pull request's diff), worst first, capped. */
import * as core from '@actions/core';
import type { FileReport, Finding } from '../engine/report/types.js';
import { SEVERITY_RANK } from '../engine/report/types.js';

/** More annotations than this are not shown by GitHub anyway; the rest are counted in the log. */
export const MAX_ANNOTATIONS = 50;

export function annotate(files: readonly FileReport[], max = MAX_ANNOTATIONS): { written: number; skipped: number } {
  const all: { path: string; x: Finding }[] = [];
  for (const f of files) for (const x of f.findings) all.push({ path: f.path, x });
  all.sort((a, b) => SEVERITY_RANK[b.x.severity] - SEVERITY_RANK[a.x.severity]);
  const shown = all.slice(0, max);
  for (const { path, x } of shown) {
    const e = x.elements[0];
    const props: core.AnnotationProperties = { title: `plumbline ${x.rule}`, file: path };
    if (e) {
      props.startLine = e.line;
      props.startColumn = e.column;
    }
    if (x.severity === 'error') core.error(x.message, props);
    else if (x.severity === 'warning') core.warning(x.message, props);
    else core.notice(x.message, props);
  }
  if (all.length > shown.length) core.info(`${all.length - shown.length} more findings are in the report files, not annotated.`);
  return { written: shown.length, skipped: all.length - shown.length };
}
