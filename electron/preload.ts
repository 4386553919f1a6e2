/**
 * Preload of the Forecatch window (runs sandboxed, context-isolated): exposes `window.forecatch`, one
 * function per operation of the shared IPC contract and nothing else; no raw ipcRenderer reaches the page.
 * Compiled to one self-contained CommonJS file (dist-electron/preload.cjs) that requires only `electron`.
 */
import { contextBridge, ipcRenderer } from 'electron';
import { MENU_COMMANDS, MENU_EVENT_CHANNEL, RECENT_EVENT_CHANNEL, type ForecatchBridge, type IpcChannel, type MenuCommand } from '../shared/ipc/contract';

const invoke = (channel: IpcChannel, arg?: unknown) => (arg === undefined ? ipcRenderer.invoke(channel) : ipcRenderer.invoke(channel, arg));

const bridge: ForecatchBridge = {
  openStudy: () => invoke('study:open'),
  openRecentStudy: (displayPath) => invoke('study:openRecent', { displayPath }),
  openTrialList: () => invoke('trialList:open'),
  readStudyFile: (folderHandle, relativePath) => invoke('study:readFile', { folderHandle, relativePath }),
  openRecordings: () => invoke('recording:open'),
  saveStudy: (text, suggestedName, saveAs) => invoke('study:save', { text, suggestedName, saveAs }),
  exportFiles: (files) => invoke('export:write', { files }),
  recentStudies: () => invoke('recent:list'),
  autosave: (text) => invoke('autosave:write', { text }),
  clearAutosave: () => invoke('autosave:clear'),
  recoverAutosave: () => invoke('autosave:recover'),
  setDocumentState: (title, dirty) => invoke('window:setDocumentState', { title, dirty }),
  onMenuCommand: (listener) => {
    const wrapped = (_event: unknown, command: unknown) => {
      if (typeof command === 'string' && (MENU_COMMANDS as readonly string[]).includes(command)) listener(command as MenuCommand);
    };
    ipcRenderer.on(MENU_EVENT_CHANNEL, wrapped);
    return () => ipcRenderer.off(MENU_EVENT_CHANNEL, wrapped);
  },
  onOpenRecent: (listener) => {
    const wrapped = (_event: unknown, displayPath: unknown) => {
      if (typeof displayPath === 'string' && displayPath.length <= 4096) listener(displayPath);
    };
    ipcRenderer.on(RECENT_EVENT_CHANNEL, wrapped);
    return () => ipcRenderer.off(RECENT_EVENT_CHANNEL, wrapped);
  },
};

contextBridge.exposeInMainWorld('forecatch', Object.freeze(bridge));
