/** `plumbline audit`: reports on every matched file; one bad file never stops the others. */
import { availableParallelism } from 'node:os';
import { loadConfig, ConfigError } from '../config/config.js';
import { auditFiles } from '../audit/audit-batch.js';
import { formatReport, type ReportFormat } from '../report/format.js';
import { useColor } from '../report/format-text.js';
import { failsAt, makeReport } from '../report/totals.js';
import { writeFileAtomic } from '../report/write-atomic.js';
import { parseFailOn, parseJobs, parseShard } from './options.js';
import { selectFiles } from './select-files.js';
import { UsageError } from './usage-error.js';

export async function runAudit(paths: string[], opts: Record<string, string | boolean | undefined>): Promise<number> {
  let config;
  try {
    config = loadConfig(typeof opts.config === 'string' ? opts.config : undefined);
  } catch (err) {
    if (err instanceof ConfigError) throw new UsageError(err.message);
    throw err;
  }
  const shard = parseShard(opts.shard);
  const jobs = parseJobs(opts.jobs, availableParallelism());
  const failOn = parseFailOn(opts.failOn);
  const format = (typeof opts.format === 'string' ? opts.format : 'text') as ReportFormat;
  const files = await selectFiles(paths, config, shard);
  const reports = await auditFiles(files, config, {
    jobs,
    cacheDir: typeof opts.cache === 'string' ? opts.cache : null,
    progress: !opts.quiet,
  });
  const report = makeReport(reports);
  const out = typeof opts.out === 'string' ? opts.out : null;
  const text = await formatReport(report, format, { color: !out && format === 'text' && useColor(process.stdout), config });
  if (out) await writeFileAtomic(out, text);
  else process.stdout.write(text);
  return failsAt(report.files, failOn) ? 1 : 0;
}
