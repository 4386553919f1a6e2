/** The host in the Electron shell: a thin typed layer over the preload's `window.forecatch` bridge. */
import type { ForecatchBridge, IpcResult, OpenedStudyPayload } from '../../../shared/ipc/contract';
import { deserializeError } from '../../../shared/errors';
import type { Host, OpenedStudy } from './host';

function unwrap<T>(result: IpcResult<T>): T {
  if (result.ok) return result.value;
  throw deserializeError(result.error);
}

/** Creates the Electron host over the preload bridge. */
export function createElectronHost(bridge: ForecatchBridge): Host {
  const opened = (p: OpenedStudyPayload | null): OpenedStudy | null =>
    p && {
      name: p.name,
      text: p.text,
      displayPath: p.displayPath,
      readFile: async (relativePath) => unwrap(await bridge.readStudyFile(p.folderHandle, relativePath)).bytes,
    };
  return {
    kind: 'electron',
    openStudy: async () => opened(unwrap(await bridge.openStudy())),
    openTrialList: async () => opened(unwrap(await bridge.openTrialList())),
    openRecentStudy: async (displayPath) => opened(unwrap(await bridge.openRecentStudy(displayPath))),
    openRecordings: async () => unwrap(await bridge.openRecordings()),
    recentStudies: async () => unwrap(await bridge.recentStudies()),
    saveStudy: async (text, name, saveAs) => unwrap(await bridge.saveStudy(text, name, saveAs))?.displayPath ?? null,
    exportFiles: async (files) => {
      const r = unwrap(await bridge.exportFiles(files));
      return r && `${r.written.length} file(s) written to ${r.folder}`;
    },
    autosave: async (text) => unwrap(await bridge.autosave(text)),
    clearAutosave: async () => unwrap(await bridge.clearAutosave()),
    recoverAutosave: async () => unwrap(await bridge.recoverAutosave()),
    setDocumentState: (title, dirty) => void bridge.setDocumentState(title, dirty),
    onCommand: (listener) => bridge.onMenuCommand(listener),
    onOpenRecent: (listener) => bridge.onOpenRecent(listener),
  };
}
