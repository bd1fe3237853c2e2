/** Atomic file writes: a temporary file in the same folder, fsync, rename. A reader sees the old file or the new one, never half. */
import { randomBytes } from 'node:crypto';
import { open, rename, unlink, mkdir, readdir } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const dir = dirname(path);
  await mkdir(dir, { recursive: true });
  await removeStaleTemporaries(dir, basename(path));
  const tmp = join(dir, `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
  const handle = await open(tmp, 'wx', 0o644);
  try {
    await handle.writeFile(data);
    await handle.sync();
  } catch (err) {
    await handle.close().catch(() => undefined);
    await unlink(tmp).catch(() => undefined);
    throw err;
  }
  await handle.close();
  try {
    await rename(tmp, path);
  } catch (err) {
    await unlink(tmp).catch(() => undefined);
    throw err;
  }
  // Make the rename itself durable.
  const d = await open(dir, 'r').catch(() => null);
  if (d) {
    await d.sync().catch(() => undefined);
    await d.close();
  }
}

/** Temporaries left by a writer that was killed (its process is gone) are removed before the next write. */
async function removeStaleTemporaries(dir: string, base: string): Promise<void> {
  const prefix = `.${base}.`;
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return;
  }
  for (const name of names) {
    if (!name.startsWith(prefix) || !name.endsWith('.tmp')) continue;
    const pid = Number(name.slice(prefix.length).split('.')[0]);
    if (!Number.isInteger(pid) || pid === process.pid || isAlive(pid)) continue;
    await unlink(join(dir, name)).catch(() => undefined);
  }
}

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}
