/** The package version, read once from the nearest package.json named plumbline. */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

function findPackageRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let k = 0; k < 6; k++) {
    const candidate = join(dir, 'package.json');
    if (existsSync(candidate)) {
      const pkg = JSON.parse(readFileSync(candidate, 'utf8')) as { name?: string };
      if (pkg.name === 'plumbline') return dir;
    }
    dir = dirname(dir);
  }
  throw new Error('plumbline: package.json not found');
}

export const PACKAGE_ROOT: string = findPackageRoot();
export const VERSION: string = (JSON.parse(readFileSync(join(PACKAGE_ROOT, 'package.json'), 'utf8')) as { version: string }).version;
