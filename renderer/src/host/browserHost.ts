/**
 * The host in the browser build: files come from file inputs or drag and drop, outputs leave as
 * downloads, autosave and the recent list live in localStorage, and the menu's shortcuts are keyboard
 * handlers on the page.
 */
import type { Host, OpenedStudy, OutputFile, RecentStudy, RecoveredWork, UserFile } from './host';
import { shortcutCommand } from './shortcuts';

const AUTOSAVE_KEY = 'forecatch.autosave';
const RECENT_KEY = 'forecatch.recent';

/** Opens the browser's file picker; resolves with the chosen files (empty when cancelled). */
function pickFiles(accept: string, multiple: boolean): Promise<File[]> {
  return new Promise((resolve) => {
    const input = document.createElement('input');
    input.type = 'file';
    input.accept = accept;
    input.multiple = multiple;
    input.style.display = 'none';
    input.addEventListener('change', () => {
      resolve(Array.from(input.files ?? []));
      input.remove();
    });
    input.addEventListener('cancel', () => {
      resolve([]);
      input.remove();
    });
    document.body.appendChild(input);
    input.click();
  });
}

/**
 * A study from a set of files given together (picked or dropped): the first `.json` (or, failing that,
 * `.csv`/`.tsv` trial list) is the study, the others are the recordings it names, matched by relative
 * path or by file name.
 * @returns null when no study or trial-list file is among them
 */
export async function studyFromFiles(files: File[]): Promise<OpenedStudy | null> {
  const study = files.find((f) => /\.json$/i.test(f.name)) ?? files.find((f) => /\.(csv|tsv)$/i.test(f.name));
  if (!study) return null;
  const byPath = new Map<string, File>();
  for (const f of files) {
    const rel = (f as File & { webkitRelativePath?: string }).webkitRelativePath || f.name;
    byPath.set(rel, f);
    byPath.set(f.name, f);
  }
  const recordName = study.name;
  try {
    const recent = JSON.parse(localStorage.getItem(RECENT_KEY) ?? '[]') as RecentStudy[];
    const next = [{ displayPath: recordName, name: recordName, openedIso: new Date().toISOString() }, ...recent.filter((r) => r.name !== recordName)].slice(0, 10);
    localStorage.setItem(RECENT_KEY, JSON.stringify(next));
  } catch {
    /* storage full or disabled: the recent list is a convenience */
  }
  return {
    name: study.name,
    text: await study.text(),
    displayPath: null,
    readFile: async (relativePath) => {
      const norm = relativePath.replace(/\\/g, '/');
      const file = byPath.get(norm) ?? byPath.get(norm.split('/').pop() ?? norm);
      if (!file) throw new Error(`${relativePath} was not among the files given with ${study.name}: select or drop it together with the study`);
      return new Uint8Array(await file.arrayBuffer());
    },
  };
}

/** Offers `data` as a download named `name`. */
export function downloadFile(name: string, data: string | Uint8Array, type = 'application/octet-stream'): void {
  const blob = new Blob([typeof data === 'string' ? data : (data as Uint8Array<ArrayBuffer>)], { type });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

function typeOf(name: string): string {
  if (name.endsWith('.csv')) return 'text/csv';
  if (name.endsWith('.txt')) return 'text/plain';
  if (name.endsWith('.json')) return 'application/json';
  if (name.endsWith('.svg')) return 'image/svg+xml';
  if (name.endsWith('.png')) return 'image/png';
  return 'application/octet-stream';
}

/** Creates the browser host. */
export function createBrowserHost(): Host {
  return {
    kind: 'browser',
    openStudy: async () => studyFromFiles(await pickFiles('.json,.csv,.tsv,.c3d,.edf,.bdf,.txt', true)),
    openTrialList: async () => studyFromFiles(await pickFiles('.csv,.tsv,.c3d,.edf,.bdf,.txt', true)),
    openRecentStudy: async () => studyFromFiles(await pickFiles('.json,.csv,.tsv,.c3d,.edf,.bdf,.txt', true)),
    openRecordings: async () => {
      const files = await pickFiles('.c3d,.csv,.tsv,.txt,.edf,.bdf', true);
      if (files.length === 0) return null;
      return Promise.all(files.map(async (f): Promise<UserFile> => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) })));
    },
    recentStudies: async () => {
      try {
        return JSON.parse(localStorage.getItem(RECENT_KEY) ?? '[]') as RecentStudy[];
      } catch {
        return [];
      }
    },
    saveStudy: async (text, name) => {
      downloadFile(name, text, 'application/json');
      return name;
    },
    exportFiles: async (files: OutputFile[]) => {
      for (const f of files) downloadFile(f.name, f.data, typeOf(f.name));
      return `${files.length} file(s) downloaded`;
    },
    autosave: async (text) => {
      try {
        localStorage.setItem(AUTOSAVE_KEY, JSON.stringify({ text, savedIso: new Date().toISOString(), displayPath: null } satisfies RecoveredWork));
      } catch {
        /* storage full: autosave is best effort in the browser */
      }
    },
    clearAutosave: async () => localStorage.removeItem(AUTOSAVE_KEY),
    recoverAutosave: async () => {
      try {
        const raw = localStorage.getItem(AUTOSAVE_KEY);
        return raw ? (JSON.parse(raw) as RecoveredWork) : null;
      } catch {
        return null;
      }
    },
    setDocumentState: (title, dirty) => {
      document.title = `${dirty ? '● ' : ''}${title} — Forecatch`;
    },
    onCommand: (listener) => {
      const onKey = (e: KeyboardEvent) => {
        const command = shortcutCommand(e);
        if (!command) return;
        const target = e.target as HTMLElement | null;
        if ((command === 'undo' || command === 'redo') && target && /^(INPUT|TEXTAREA)$/.test(target.tagName)) return;
        e.preventDefault();
        listener(command);
      };
      window.addEventListener('keydown', onKey);
      return () => window.removeEventListener('keydown', onKey);
    },
    onOpenRecent: () => () => undefined,
  };
}
