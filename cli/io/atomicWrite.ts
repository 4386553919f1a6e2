/**
 * Atomic file writes for study files and outputs: the data goes to a temporary file in the same folder,
 * is flushed to disk (fsync), the previous version (if any) is kept as `<name>.bak`, and the temporary file
 * is renamed over the target, so a crash leaves either the old or the new file, never half of one.
 */
import { open, rename, copyFile, unlink, stat } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { ForecatchError } from '../../shared/errors';

/** Options of {@link atomicWriteFile}. */
export interface AtomicWriteOptions {
  /** Keep the previous version as `<path>.bak` (default true). */
  keepBackup?: boolean;
}

/**
 * Writes a file atomically (temporary file in the same folder, fsync, rename).
 *
 * @param path - target path
 * @param data - text (UTF-8) or bytes
 * @param opts - backup policy
 * @returns the backup's path when a previous version was kept, otherwise null
 * @throws ForecatchError `IO_ERROR` naming the path when the folder is missing or not writable
 */
export async function atomicWriteFile(
  path: string,
  data: string | Uint8Array,
  opts: AtomicWriteOptions = {},
): Promise<{ backupPath: string | null }> {
  const dir = dirname(path);
  const tmp = join(dir, `.${basename(path)}.tmp-${process.pid}-${Math.random().toString(36).slice(2, 10)}`);
  try {
    const fh = await open(tmp, 'wx');
    try {
      await fh.writeFile(data);
      await fh.sync();
    } finally {
      await fh.close();
    }
    let backupPath: string | null = null;
    if (opts.keepBackup !== false) {
      const existing = await stat(path).catch(() => null);
      if (existing?.isFile()) {
        backupPath = `${path}.bak`;
        await copyFile(path, backupPath);
      }
    }
    await rename(tmp, path);
    // make the rename durable where the platform allows opening a folder
    try {
      const dh = await open(dir, 'r');
      try {
        await dh.sync();
      } finally {
        await dh.close();
      }
    } catch {
      /* folders cannot be fsynced on every platform; the rename is still atomic */
    }
    return { backupPath };
  } catch (err) {
    await unlink(tmp).catch(() => undefined);
    const e = err as NodeJS.ErrnoException;
    throw new ForecatchError('IO_ERROR', `${path}: cannot write: ${e.code === 'ENOENT' ? 'no such folder' : e.code === 'EACCES' ? 'permission denied' : e.message}`);
  }
}
