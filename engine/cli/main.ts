/**
 * The `plumbline` command. Exit status: 0 done and nothing at or above
 * --fail-on; 1 findings at or above --fail-on; 2 usage error or no input.
 */
import { Command, CommanderError, Option } from 'commander';
import { VERSION } from '../version.js';
import { runAudit } from './run-audit.js';
import { runExtract } from './run-extract.js';
import { runRules } from './run-rules.js';
import { runRedraw } from './run-redraw.js';
import { runDiff } from './run-diff.js';
import { runMerge } from './run-merge.js';
import { UsageError } from './usage-error.js';

export { UsageError } from './usage-error.js';

export async function main(argv: string[]): Promise<number> {
  let exitCode = 0;
  const program = new Command();
  program
    .name('plumbline')
    .description('Audit rendered SVG charts for clutter and distortion, and redraw them cleaner with the data unchanged.')
    .version(VERSION, '-v, --version')
    .exitOverride()
    .configureOutput({ writeErr: (s) => process.stderr.write(s), writeOut: (s) => process.stdout.write(s) })
    .showHelpAfterError('(run plumbline --help for usage)');

  program
    .command('audit')
    .description('check charts and report what misleads or clutters them')
    .argument('<paths...>', 'SVG files, directories (every *.svg below) or globs')
    .addOption(new Option('--format <format>', 'report format').choices(['text', 'json', 'md', 'sarif', 'html']).default('text'))
    .option('--out <file>', 'write the report to a file instead of stdout')
    .addOption(new Option('--fail-on <severity>', 'exit 1 when a finding is at or above this severity').choices(['error', 'warning', 'note', 'never']).default('error'))
    .option('--config <file>', 'configuration file (default: plumbline.config.json found from the working directory up)')
    .option('--jobs <n>', 'files analysed in parallel (default: number of cores)')
    .option('--cache <dir>', 'reuse results of unchanged files from this folder')
    .option('--shard <k/n>', 'audit only shard k of n (stable by path), for CI matrices')
    .option('--quiet', 'no progress on stderr')
    .action(async (paths: string[], opts: Record<string, string | boolean | undefined>) => {
      exitCode = await runAudit(paths, opts);
    });

  program
    .command('extract')
    .description('print the data table recovered from a chart')
    .argument('<file>', 'one SVG file')
    .addOption(new Option('--format <format>', 'table format').choices(['json', 'csv']).default('json'))
    .action(async (file: string, opts: { format: 'json' | 'csv' }) => {
      exitCode = await runExtract(file, opts);
    });

  program
    .command('redraw')
    .description('write decluttered, more honest copies of charts; data marks keep their geometry')
    .argument('<paths...>', 'SVG files, directories or globs')
    .option('--out-dir <dir>', 'write redrawn files below this folder')
    .option('--in-place', 'replace the files (atomic writes)')
    .option('--only <rules>', 'apply only the fixes of these rule ids (comma separated)')
    .option('--dry-run', 'print what would change, write nothing')
    .option('--config <file>', 'configuration file')
    .option('--shard <k/n>', 'redraw only shard k of n')
    .option('--quiet', 'no progress on stderr')
    .action(async (paths: string[], opts: Record<string, string | boolean | undefined>) => {
      exitCode = await runRedraw(paths, opts);
    });

  program
    .command('diff')
    .description('compare two versions of a chart: pixels and recovered data')
    .argument('<before>', 'the earlier SVG')
    .argument('<after>', 'the later SVG')
    .option('--out <png>', 'write a before | after | difference image')
    .addOption(new Option('--format <format>', 'output format').choices(['text', 'json']).default('text'))
    .action(async (before: string, after: string, opts: { out?: string; format: 'text' | 'json' }) => {
      exitCode = await runDiff(before, after, opts);
    });

  program
    .command('rules')
    .description('list the checks with their rationale, sources and defaults')
    .addOption(new Option('--format <format>', 'output format').choices(['text', 'json']).default('text'))
    .action(async (opts: { format: 'text' | 'json' }) => {
      exitCode = await runRules(opts);
    });

  program
    .command('merge')
    .description('combine JSON reports of shards into one report')
    .argument('<reports...>', 'JSON report files')
    .option('--out <file>', 'write the merged report to a file')
    .addOption(new Option('--fail-on <severity>', 'exit 1 when a finding is at or above this severity').choices(['error', 'warning', 'note', 'never']).default('error'))
    .action(async (reports: string[], opts: { out?: string; failOn: string }) => {
      exitCode = await runMerge(reports, opts);
    });

  try {
    await program.parseAsync(argv, { from: 'user' });
  } catch (err) {
    if (err instanceof CommanderError) {
      if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') return 0;
      return 2;
    }
    if (err instanceof UsageError) {
      process.stderr.write(`plumbline: ${err.message}\n`);
      return 2;
    }
    throw err;
  }
  if (argv.length === 0) {
    program.outputHelp();
    return 2;
  }
  return exitCode;
}
