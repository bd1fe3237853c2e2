/** Many files → their reports, in input order, with bounded memory: only reports are kept. */
import type { Config } from '../config/config.js';
import type { FileReport } from '../report/types.js';
import { auditFile } from './audit-file.js';

export interface BatchOptions {
  jobs: number;
  cacheDir: string | null;
  progress: boolean;
}

export async function auditFiles(files: string[], config: Config, options: BatchOptions): Promise<FileReport[]> {
  void options;
  const out: FileReport[] = [];
  for (const f of files) out.push((await auditFile(f, config)).report);
  return out;
}
