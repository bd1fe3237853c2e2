/** Atomic file writes: a temporary file in the same folder, fsync, rename. A reader sees the old file or the new one, never half. */
import { randomBytes } from 'node:crypto';
import { open, rename, unlink, mkdir } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const dir = dirname(path);
  await mkdir(dir, { recursive: true });
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
