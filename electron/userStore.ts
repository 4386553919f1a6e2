/**
 * Per-user state of the desktop shell, in Electron's userData folder: the recent-studies list and the
 * autosave of unsaved edits (recovered at the next start after a crash).
 */
import { readFile, unlink } from 'node:fs/promises';
import { join } from 'node:path';
import { atomicWriteFile } from '../cli/io/atomicWrite';
import type { RecentStudy, RecoveredWork } from '../shared/ipc/contract';

/** Most recent studies kept. */
export const RECENT_LIMIT = 10;

/** Adds (or moves to the front) a study in a recent list; pure. */
export function pushRecent(list: readonly RecentStudy[], entry: RecentStudy, limit = RECENT_LIMIT): RecentStudy[] {
  return [entry, ...list.filter((r) => r.displayPath !== entry.displayPath)].slice(0, limit);
}

/** Reads and writes the shell's per-user files in `folder`. */
export class UserStore {
  private readonly recentPath: string;
  private readonly autosavePath: string;

  /** @param folder - Electron's `app.getPath('userData')` (or a temporary folder in tests) */
  constructor(folder: string) {
    this.recentPath = join(folder, 'recent-studies.json');
    this.autosavePath = join(folder, 'autosave.json');
  }

  /** The recent list; empty when absent or unreadable. */
  async recent(): Promise<RecentStudy[]> {
    try {
      const parsed = JSON.parse(await readFile(this.recentPath, 'utf8')) as unknown;
      if (!Array.isArray(parsed)) return [];
      return parsed.filter(
        (r): r is RecentStudy => typeof r?.displayPath === 'string' && typeof r?.name === 'string' && typeof r?.openedIso === 'string',
      );
    } catch {
      return [];
    }
  }

  /** Records that a study was opened or saved. */
  async addRecent(entry: RecentStudy): Promise<RecentStudy[]> {
    const next = pushRecent(await this.recent(), entry);
    await atomicWriteFile(this.recentPath, JSON.stringify(next, null, 2), { keepBackup: false });
    return next;
  }

  /** Saves unsaved work (called a few seconds after each edit). */
  async autosave(text: string, displayPath: string | null): Promise<void> {
    const record: RecoveredWork = { text, savedIso: new Date().toISOString(), displayPath };
    await atomicWriteFile(this.autosavePath, JSON.stringify(record), { keepBackup: false });
  }

  /** Unsaved work left by a previous session, or null. */
  async recover(): Promise<RecoveredWork | null> {
    try {
      const r = JSON.parse(await readFile(this.autosavePath, 'utf8')) as RecoveredWork;
      return typeof r?.text === 'string' && typeof r?.savedIso === 'string' ? { text: r.text, savedIso: r.savedIso, displayPath: r.displayPath ?? null } : null;
    } catch {
      return null;
    }
  }

  /** Forgets the autosave (after a save, or when the user discards the recovered work). */
  async clearAutosave(): Promise<void> {
    await unlink(this.autosavePath).catch(() => undefined);
  }
}
