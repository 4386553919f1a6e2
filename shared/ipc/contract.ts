/**
 * The one IPC contract between the Forecatch desktop shell (electron/) and its renderer: every channel's
 * name, request type, response type and request validator, declared once. The main process registers
 * handlers only through `electron/ipc/handle.ts`, which runs the validator below on every message; the
 * preload exposes one function per channel; the renderer imports these types only.
 *
 * Pure TypeScript (no Node, no DOM), so the validators are unit-tested without Electron's runtime.
 */
import {
  expectArray,
  expectBoolean,
  expectBytes,
  expectFileName,
  expectObject,
  expectOnlyKeys,
  expectRelativePath,
  expectString,
} from './validate';
import type { SerializedError } from '../errors';

/** A file read from disk for the renderer: its name and bytes (never a path the renderer can reuse). */
export interface FilePayload {
  name: string;
  bytes: Uint8Array;
}

/** A study opened by the shell: the study file's text plus a handle naming its folder for later reads. */
export interface OpenedStudyPayload {
  /** Opaque handle of the study's folder; `readStudyFile` accepts only handles the main process issued. */
  folderHandle: string;
  /** File name of the study (or trial list) file. */
  name: string;
  text: string;
  /** Full path, shown in the title and the recent list. */
  displayPath: string;
}

/** One entry of the recent-studies list. */
export interface RecentStudy {
  displayPath: string;
  name: string;
  openedIso: string;
}

/** One output file to write (export or figure). */
export interface OutputFile {
  name: string;
  data: string | Uint8Array;
}

/** Autosaved unsaved work found at startup after a crash. */
export interface RecoveredWork {
  text: string;
  savedIso: string;
  /** The study it belongs to, when it had been saved before. */
  displayPath: string | null;
}

/** Commands the native menu sends to the renderer. */
export const MENU_COMMANDS = [
  'open-study',
  'open-trial-list',
  'open-recording',
  'open-demo',
  'save',
  'save-as',
  'export-tables',
  'export-figures',
  'undo',
  'redo',
  'next-trial',
  'previous-trial',
  'view-overview',
  'view-trial',
  'view-comparison',
  'toggle-theme',
  'about',
] as const;
export type MenuCommand = (typeof MENU_COMMANDS)[number];

/** Channel name -> [request, response]. `void` requests take no argument. */
export interface IpcChannels {
  'study:open': [void, OpenedStudyPayload | null];
  'study:openRecent': [{ displayPath: string }, OpenedStudyPayload | null];
  'trialList:open': [void, OpenedStudyPayload | null];
  'study:readFile': [{ folderHandle: string; relativePath: string }, FilePayload];
  'recording:open': [void, FilePayload[] | null];
  'study:save': [{ text: string; suggestedName: string; saveAs: boolean }, { displayPath: string } | null];
  'export:write': [{ files: OutputFile[] }, { folder: string; written: string[] } | null];
  'recent:list': [void, RecentStudy[]];
  'autosave:write': [{ text: string }, void];
  'autosave:clear': [void, void];
  'autosave:recover': [void, RecoveredWork | null];
  'window:setDocumentState': [{ title: string; dirty: boolean }, void];
}
export type IpcChannel = keyof IpcChannels;
export type IpcRequest<C extends IpcChannel> = IpcChannels[C][0];
export type IpcResponse<C extends IpcChannel> = IpcChannels[C][1];

/** What every invoke resolves to: the handler's value, or the error in plain-data form. */
export type IpcResult<T> = { ok: true; value: T } | { ok: false; error: SerializedError };

/** Main -> renderer event channel of menu commands. */
export const MENU_EVENT_CHANNEL = 'menu:command';
/** Main -> renderer event channel: the user picked a study from File > Open Recent (its display path). */
export const RECENT_EVENT_CHANNEL = 'menu:openRecent';

const noArgs = (value: unknown, field: string): void => {
  if (value !== undefined) throw new TypeError(`${field} takes no argument`);
};

/** Request validators, one per channel: each returns the request typed or throws naming the bad field. */
export const IPC_VALIDATORS: { [C in IpcChannel]: (value: unknown) => IpcRequest<C> } = {
  'study:open': (v) => noArgs(v, 'study:open'),
  'study:openRecent': (v) => {
    const o = expectObject(v, 'study:openRecent');
    expectOnlyKeys(o, 'study:openRecent', ['displayPath']);
    return { displayPath: expectString(o.displayPath, 'displayPath', 4096, true) };
  },
  'trialList:open': (v) => noArgs(v, 'trialList:open'),
  'study:readFile': (v) => {
    const o = expectObject(v, 'study:readFile');
    expectOnlyKeys(o, 'study:readFile', ['folderHandle', 'relativePath']);
    const folderHandle = expectString(o.folderHandle, 'folderHandle', 64, true);
    if (!/^[0-9a-f]{32}$/.test(folderHandle)) throw new RangeError('folderHandle is not a handle issued by the shell');
    return { folderHandle, relativePath: expectRelativePath(o.relativePath, 'relativePath') };
  },
  'recording:open': (v) => noArgs(v, 'recording:open'),
  'study:save': (v) => {
    const o = expectObject(v, 'study:save');
    expectOnlyKeys(o, 'study:save', ['text', 'suggestedName', 'saveAs']);
    return { text: expectString(o.text, 'text'), suggestedName: expectFileName(o.suggestedName, 'suggestedName'), saveAs: expectBoolean(o.saveAs, 'saveAs') };
  },
  'export:write': (v) => {
    const o = expectObject(v, 'export:write');
    expectOnlyKeys(o, 'export:write', ['files']);
    const files = expectArray(o.files, 'files', 64, (item, f) => {
      const file = expectObject(item, f);
      expectOnlyKeys(file, f, ['name', 'data']);
      const name = expectFileName(file.name, `${f}.name`);
      const data = typeof file.data === 'string' ? expectString(file.data, `${f}.data`) : expectBytes(file.data, `${f}.data`, 512 * 1024 * 1024);
      return { name, data };
    });
    if (files.length === 0) throw new RangeError('files must not be empty');
    if (new Set(files.map((f) => f.name)).size !== files.length) throw new RangeError('files has duplicate names');
    return { files };
  },
  'recent:list': (v) => noArgs(v, 'recent:list'),
  'autosave:write': (v) => {
    const o = expectObject(v, 'autosave:write');
    expectOnlyKeys(o, 'autosave:write', ['text']);
    return { text: expectString(o.text, 'text') };
  },
  'autosave:clear': (v) => noArgs(v, 'autosave:clear'),
  'autosave:recover': (v) => noArgs(v, 'autosave:recover'),
  'window:setDocumentState': (v) => {
    const o = expectObject(v, 'window:setDocumentState');
    expectOnlyKeys(o, 'window:setDocumentState', ['title', 'dirty']);
    return { title: expectString(o.title, 'title', 300), dirty: expectBoolean(o.dirty, 'dirty') };
  },
};

/** Every channel name, for registering handlers and for tests. */
export const IPC_CHANNELS = Object.keys(IPC_VALIDATORS) as IpcChannel[];

/**
 * The API the preload exposes on `window.forecatch`: one function per operation, nothing else.
 * Each resolves to {@link IpcResult} so errors keep their code across the boundary.
 */
export interface ForecatchBridge {
  openStudy(): Promise<IpcResult<OpenedStudyPayload | null>>;
  openRecentStudy(displayPath: string): Promise<IpcResult<OpenedStudyPayload | null>>;
  openTrialList(): Promise<IpcResult<OpenedStudyPayload | null>>;
  readStudyFile(folderHandle: string, relativePath: string): Promise<IpcResult<FilePayload>>;
  openRecordings(): Promise<IpcResult<FilePayload[] | null>>;
  saveStudy(text: string, suggestedName: string, saveAs: boolean): Promise<IpcResult<{ displayPath: string } | null>>;
  exportFiles(files: OutputFile[]): Promise<IpcResult<{ folder: string; written: string[] } | null>>;
  recentStudies(): Promise<IpcResult<RecentStudy[]>>;
  autosave(text: string): Promise<IpcResult<void>>;
  clearAutosave(): Promise<IpcResult<void>>;
  recoverAutosave(): Promise<IpcResult<RecoveredWork | null>>;
  setDocumentState(title: string, dirty: boolean): Promise<IpcResult<void>>;
  /** Subscribes to native-menu commands; returns the unsubscribe function. */
  onMenuCommand(listener: (command: MenuCommand) => void): () => void;
  /** Subscribes to File > Open Recent picks (display paths); returns the unsubscribe function. */
  onOpenRecent(listener: (displayPath: string) => void): () => void;
}
