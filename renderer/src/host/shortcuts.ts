/** Keyboard shortcuts of the browser build (no DOM needed: a key press is plain data). */
import type { MenuCommand } from './host';

/** The fields of a keyboard event the shortcuts look at. */
export interface KeyPress {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
}

/** Keyboard shortcuts of the browser build (the desktop shell's menu accelerators, same keys). */
export function shortcutCommand(e: KeyPress): MenuCommand | null {
  const mod = e.ctrlKey || e.metaKey;
  const key = e.key.toLowerCase();
  if (mod && !e.altKey) {
    if (key === 'o') return e.shiftKey ? 'open-trial-list' : 'open-study';
    if (key === 's') return e.shiftKey ? 'save-as' : 'save';
    if (key === 'e') return e.shiftKey ? 'export-figures' : 'export-tables';
    if (key === 'z') return e.shiftKey ? 'redo' : 'undo';
    if (key === 'y') return 'redo';
    if (key === '1') return 'view-overview';
    if (key === '2') return 'view-trial';
    if (key === '3') return 'view-comparison';
    if (key === 'l' && e.shiftKey) return 'toggle-theme';
  }
  if (e.altKey && !mod) {
    if (e.key === 'ArrowDown') return 'next-trial';
    if (e.key === 'ArrowUp') return 'previous-trial';
  }
  return null;
}

