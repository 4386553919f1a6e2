/**
 * The native menu of the Forecatch window, as a pure template builder (testable without Electron).
 * Commands that concern the document go to the renderer as `MenuCommand`s; quitting and window roles
 * stay with the shell.
 */
import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand, RecentStudy } from '../shared/ipc/contract';

/** What the menu calls back into. */
export interface MenuActions {
  send(command: MenuCommand): void;
  openRecent(displayPath: string): void;
  quit(): void;
}

/**
 * @param actions - callbacks
 * @param recent - recent studies for the Open Recent submenu
 * @param isMac - true on macOS (app menu first, Cmd shortcuts)
 */
export function menuTemplate(actions: MenuActions, recent: readonly RecentStudy[], isMac: boolean): MenuItemConstructorOptions[] {
  const cmd = (label: string, command: MenuCommand, accelerator?: string): MenuItemConstructorOptions => ({
    label,
    ...(accelerator ? { accelerator } : {}),
    click: () => actions.send(command),
  });
  const recentItems: MenuItemConstructorOptions[] =
    recent.length === 0
      ? [{ label: 'No recent studies', enabled: false }]
      : recent.map((r) => ({ label: r.displayPath, click: () => actions.openRecent(r.displayPath) }));
  const file: MenuItemConstructorOptions = {
    label: '&File',
    submenu: [
      cmd('Open Study…', 'open-study', 'CmdOrCtrl+O'),
      cmd('Open Trial List…', 'open-trial-list', 'CmdOrCtrl+Shift+O'),
      cmd('Add Recording…', 'open-recording', 'CmdOrCtrl+Shift+R'),
      { label: 'Open Recent', submenu: recentItems },
      cmd('Open Demo Study', 'open-demo'),
      { type: 'separator' },
      cmd('Save Study', 'save', 'CmdOrCtrl+S'),
      cmd('Save Study As…', 'save-as', 'CmdOrCtrl+Shift+S'),
      { type: 'separator' },
      cmd('Export Tables and Methods…', 'export-tables', 'CmdOrCtrl+E'),
      cmd('Export Figures…', 'export-figures', 'CmdOrCtrl+Shift+E'),
      ...(isMac ? [] : ([{ type: 'separator' }, { label: 'Quit', accelerator: 'CmdOrCtrl+Q', click: () => actions.quit() }] as MenuItemConstructorOptions[])),
    ],
  };
  const edit: MenuItemConstructorOptions = {
    label: '&Edit',
    submenu: [
      cmd('Undo Onset Edit', 'undo', 'CmdOrCtrl+Z'),
      cmd('Redo Onset Edit', 'redo', isMac ? 'Cmd+Shift+Z' : 'Ctrl+Y'),
      { type: 'separator' },
      { role: 'cut' },
      { role: 'copy' },
      { role: 'paste' },
      { role: 'selectAll' },
    ],
  };
  const view: MenuItemConstructorOptions = {
    label: '&View',
    submenu: [
      cmd('Study Overview', 'view-overview', 'CmdOrCtrl+1'),
      cmd('Trial', 'view-trial', 'CmdOrCtrl+2'),
      cmd('Hypothesis Comparison', 'view-comparison', 'CmdOrCtrl+3'),
      { type: 'separator' },
      cmd('Next Trial', 'next-trial', 'Alt+Down'),
      cmd('Previous Trial', 'previous-trial', 'Alt+Up'),
      { type: 'separator' },
      cmd('Light/Dark Theme', 'toggle-theme', 'CmdOrCtrl+Shift+L'),
      { role: 'resetZoom' },
      { role: 'zoomIn' },
      { role: 'zoomOut' },
      { role: 'togglefullscreen' },
    ],
  };
  const help: MenuItemConstructorOptions = { label: '&Help', role: 'help', submenu: [cmd('About Forecatch', 'about')] };
  const appMenu: MenuItemConstructorOptions[] = isMac ? [{ label: 'Forecatch', submenu: [cmd('About Forecatch', 'about'), { type: 'separator' }, { role: 'quit' }] }] : [];
  return [...appMenu, file, edit, view, { role: 'windowMenu' }, help];
}
