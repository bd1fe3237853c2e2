/** Inputs → the files a command works on: expanded, config-ignored files dropped, sharded. */
import picomatch from 'picomatch';
import type { Config } from '../config/config.js';
import { expandInputs } from './expand-inputs.js';
import { inShard } from './shard.js';
import { UsageError } from './usage-error.js';

export async function selectFiles(inputs: string[], config: Config, shard: { k: number; n: number } | null): Promise<string[]> {
  const { files, unmatched } = await expandInputs(inputs);
  for (const u of unmatched) process.stderr.write(`plumbline: no SVG files match ${u}\n`);
  if (files.length === 0) throw new UsageError('no input files matched');
  const ignored = config.ignore.length > 0 ? picomatch(config.ignore, { dot: true }) : null;
  return files.filter((f) => !(ignored && ignored(f.replace(/^\.\//, ''))) && inShard(f, shard));
}
