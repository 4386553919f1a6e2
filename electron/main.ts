/**
 * Main process of the Forecatch desktop shell: one secure window showing the renderer through the
 * `forecatch://` protocol, native menus, dialogs, file reading and atomic writing, recent studies,
 * autosave and recovery. No numerical work happens here; the renderer's worker does it all.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session } from 'electron';
import { readFile, stat } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join, resolve, sep } from 'node:path';
import { APP_INDEX_URL, APP_SCHEME, APP_SCHEME_PRIVILEGES, mainWindowOptions } from './windowOptions';
import { resolveAppAsset, mimeTypeFor } from './appProtocol';
import { handle } from './ipc/handle';
import { isAllowedNavigation } from './ipc/trustedSender';
import { menuTemplate } from './menuTemplate';
import { atomicWriteFile } from '../cli/io/atomicWrite';
import { UserStore } from './userStore';
import { MENU_EVENT_CHANNEL, RECENT_EVENT_CHANNEL, type FilePayload, type MenuCommand, type OpenedStudyPayload } from '../shared/ipc/contract';
import { ForecatchError } from '../shared/errors';
import { CONTENT_SECURITY_POLICY } from '../scripts/csp.mjs';

/** Largest recording the shell will read in one piece, bytes. */
const MAX_READ_BYTES = 2 ** 31 - 1;

protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: APP_SCHEME_PRIVILEGES }]);

const appRoot = resolve(__dirname, '..');
const distRoot = join(appRoot, 'dist');
const preloadPath = join(__dirname, 'preload.cjs');
const openDemo = process.argv.includes('--demo');

let mainWindow: BrowserWindow | null = null;
let store: UserStore;
/** Folders of studies the user opened through a dialog, by opaque handle: the only places the renderer may read. */
const grantedFolders = new Map<string, string>();
let currentStudyPath: string | null = null;
let documentDirty = false;

function grantFolder(folder: string): string {
  for (const [h, f] of grantedFolders) if (f === folder) return h;
  const handleId = randomBytes(16).toString('hex');
  grantedFolders.set(handleId, folder);
  return handleId;
}

async function readStudyAt(path: string): Promise<OpenedStudyPayload> {
  const text = await readFile(path, 'utf8');
  await store.addRecent({ displayPath: path, name: basename(path), openedIso: new Date().toISOString() });
  currentStudyPath = /\.json$/i.test(path) ? path : null;
  refreshMenu();
  return { folderHandle: grantFolder(dirname(path)), name: basename(path), text, displayPath: path };
}

function send(command: MenuCommand): void {
  mainWindow?.webContents.send(MENU_EVENT_CHANNEL, command);
}

function refreshMenu(): void {
  void store.recent().then((recent) => {
    const template = menuTemplate(
      {
        send,
        // the renderer opens it through study:openRecent, after checking for unsaved edits
        openRecent: (displayPath) => mainWindow?.webContents.send(RECENT_EVENT_CHANNEL, displayPath),
        quit: () => app.quit(),
      },
      recent,
      process.platform === 'darwin',
    );
    Menu.setApplicationMenu(Menu.buildFromTemplate(template));
  });
}

function registerIpc(): void {
  handle(ipcMain, 'study:open', async () => {
    const r = await dialog.showOpenDialog(mainWindow!, {
      title: 'Open study',
      properties: ['openFile'],
      filters: [{ name: 'Forecatch study', extensions: ['json'] }, { name: 'Trial list', extensions: ['csv', 'tsv'] }],
    });
    return r.canceled || r.filePaths.length === 0 ? null : readStudyAt(r.filePaths[0]);
  });
  handle(ipcMain, 'study:openRecent', async ({ displayPath }) => {
    const recent = await store.recent();
    if (!recent.some((r) => r.displayPath === displayPath)) throw new ForecatchError('NOT_RECENT', 'that study is not in the recent list');
    return readStudyAt(displayPath);
  });
  handle(ipcMain, 'trialList:open', async () => {
    const r = await dialog.showOpenDialog(mainWindow!, {
      title: 'Open trial list',
      properties: ['openFile'],
      filters: [{ name: 'Trial list', extensions: ['csv', 'tsv', 'txt'] }],
    });
    return r.canceled || r.filePaths.length === 0 ? null : readStudyAt(r.filePaths[0]);
  });
  handle(ipcMain, 'study:readFile', async ({ folderHandle, relativePath }): Promise<FilePayload> => {
    const folder = grantedFolders.get(folderHandle);
    if (!folder) throw new ForecatchError('NOT_GRANTED', 'unknown study folder handle');
    const full = resolve(folder, relativePath);
    if (!full.startsWith(folder + sep)) throw new ForecatchError('NOT_GRANTED', `${relativePath} is outside the study folder`);
    const st = await stat(full);
    if (!st.isFile()) throw new ForecatchError('NOT_A_FILE', `${relativePath} is not a file`);
    if (st.size > MAX_READ_BYTES) throw new ForecatchError('FILE_TOO_LARGE', `${relativePath} is larger than 2 GiB`);
    return { name: basename(full), bytes: new Uint8Array(await readFile(full)) };
  });
  handle(ipcMain, 'recording:open', async () => {
    const r = await dialog.showOpenDialog(mainWindow!, {
      title: 'Add recording',
      properties: ['openFile', 'multiSelections'],
      filters: [{ name: 'Recordings', extensions: ['c3d', 'csv', 'tsv', 'txt', 'edf', 'bdf'] }],
    });
    if (r.canceled) return null;
    const out: FilePayload[] = [];
    for (const p of r.filePaths) {
      const st = await stat(p);
      if (st.size > MAX_READ_BYTES) throw new ForecatchError('FILE_TOO_LARGE', `${p} is larger than 2 GiB`);
      out.push({ name: basename(p), bytes: new Uint8Array(await readFile(p)) });
    }
    return out;
  });
  handle(ipcMain, 'study:save', async ({ text, suggestedName, saveAs }) => {
    let target = saveAs ? null : currentStudyPath;
    if (!target) {
      const r = await dialog.showSaveDialog(mainWindow!, {
        title: 'Save study',
        defaultPath: currentStudyPath ?? suggestedName,
        filters: [{ name: 'Forecatch study', extensions: ['json'] }],
      });
      if (r.canceled || !r.filePath) return null;
      target = r.filePath;
    }
    await atomicWriteFile(target, text, { keepBackup: true });
    currentStudyPath = target;
    grantFolder(dirname(target));
    await store.addRecent({ displayPath: target, name: basename(target), openedIso: new Date().toISOString() });
    await store.clearAutosave();
    refreshMenu();
    return { displayPath: target };
  });
  handle(ipcMain, 'export:write', async ({ files }) => {
    const r = await dialog.showOpenDialog(mainWindow!, { title: 'Export to folder', properties: ['openDirectory', 'createDirectory'] });
    if (r.canceled || r.filePaths.length === 0) return null;
    const folder = r.filePaths[0];
    const written: string[] = [];
    for (const f of files) {
      await atomicWriteFile(join(folder, f.name), f.data, { keepBackup: true });
      written.push(f.name);
    }
    return { folder, written };
  });
  handle(ipcMain, 'recent:list', () => store.recent());
  handle(ipcMain, 'autosave:write', ({ text }) => store.autosave(text, currentStudyPath));
  handle(ipcMain, 'autosave:clear', () => store.clearAutosave());
  handle(ipcMain, 'autosave:recover', () => store.recover());
  handle(ipcMain, 'window:setDocumentState', ({ title, dirty }) => {
    documentDirty = dirty;
    if (mainWindow) {
      mainWindow.setTitle(`${dirty ? '● ' : ''}${title || 'Untitled study'} — Forecatch`);
      mainWindow.setDocumentEdited(dirty);
    }
  });
}

function hardenSessions(): void {
  const ses = session.defaultSession;
  ses.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));
  ses.setPermissionCheckHandler(() => false);
  ses.on('will-download', (event) => event.preventDefault());
  ses.webRequest.onHeadersReceived((details, callback) => {
    callback({ responseHeaders: { ...details.responseHeaders, 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] } });
  });
  protocol.handle(APP_SCHEME, async (request) => {
    const file = resolveAppAsset(distRoot, request.url);
    if (!file) return new Response('forbidden', { status: 403 });
    try {
      const bytes = await readFile(file);
      return new Response(new Uint8Array(bytes), {
        headers: { 'Content-Type': mimeTypeFor(file), 'Content-Security-Policy': CONTENT_SECURITY_POLICY, 'X-Content-Type-Options': 'nosniff' },
      });
    } catch {
      return new Response('not found', { status: 404 });
    }
  });
}

app.on('web-contents-created', (_event, contents) => {
  contents.on('will-navigate', (event, url) => {
    if (!isAllowedNavigation(url)) event.preventDefault();
  });
  contents.on('will-redirect', (event, url) => {
    if (!isAllowedNavigation(url)) event.preventDefault();
  });
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
});

function createWindow(): void {
  const icon = join(appRoot, 'assets', 'icon.png');
  mainWindow = new BrowserWindow(mainWindowOptions(preloadPath, icon));
  mainWindow.once('ready-to-show', () => mainWindow?.show());
  mainWindow.on('close', (event) => {
    if (!documentDirty || !mainWindow) return;
    const choice = dialog.showMessageBoxSync(mainWindow, {
      type: 'warning',
      buttons: ['Keep working', 'Close without saving'],
      defaultId: 0,
      cancelId: 0,
      message: 'This study has unsaved onset edits.',
      detail: 'They are autosaved and will be offered again at the next start, but they are not in the study file yet.',
    });
    if (choice === 0) event.preventDefault();
  });
  mainWindow.on('closed', () => {
    mainWindow = null;
  });
  void mainWindow.loadURL(openDemo ? `${APP_INDEX_URL}#demo` : APP_INDEX_URL);
}

app.enableSandbox();
void app.whenReady().then(() => {
  store = new UserStore(app.getPath('userData'));
  hardenSessions();
  registerIpc();
  refreshMenu();
  createWindow();
});

app.on('window-all-closed', () => {
  if (process.platform !== 'darwin') app.quit();
});
app.on('activate', () => {
  if (BrowserWindow.getAllWindows().length === 0) createWindow();
});
