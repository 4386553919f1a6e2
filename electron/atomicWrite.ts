/**
 * Atomic file writes for saves and exports: the data goes to a temporary file in the same folder, is
 * flushed to disk, and is renamed over the target, so a crash leaves either the old or the new file,
 * never half of one. Saving over an existing file first keeps its previous version as `<name>.bak`.
 */
import { open, rename, copyFile, unlink, stat } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join } from 'node:path';

/**
 * Writes `data` to `path` atomically.
 * @param path - target file
 * @param data - text (written as UTF-8) or bytes
 * @param opts - `backup: true` copies an existing target to `<path>.bak` first
 * @returns the backup path when one was made
 * @throws the file system's error (the temporary file is removed)
 */
export async function atomicWriteFile(path: string, data: string | Uint8Array, opts: { backup?: boolean } = {}): Promise<{ backupPath: string | null }> {
  const tmp = join(dirname(path), `.${basename(path)}.${randomBytes(6).toString('hex')}.tmp`);
  let backupPath: string | null = null;
  const handle = await open(tmp, 'wx', 0o644);
  try {
    await handle.writeFile(data);
    await handle.sync();
  } catch (err) {
    await handle.close();
    await unlink(tmp).catch(() => undefined);
    throw err;
  }
  await handle.close();
  try {
    if (opts.backup) {
      const existing = await stat(path).catch(() => null);
      if (existing?.isFile()) {
        backupPath = `${path}.bak`;
        await copyFile(path, backupPath);
      }
    }
    await rename(tmp, path);
  } catch (err) {
    await unlink(tmp).catch(() => undefined);
    throw err;
  }
  return { backupPath };
}
