/**
 * The one interface the renderer uses to reach files and the window: opening studies, trial lists and
 * recordings, saving, exporting, recent studies, autosave. Two implementations: the Electron preload API
 * (electronHost.ts) and the browser build (browserHost.ts: file inputs, drag and drop, downloads).
 */
import type { MenuCommand, OutputFile, RecentStudy, RecoveredWork } from '../../../shared/ipc/contract';

export type { MenuCommand, OutputFile, RecentStudy, RecoveredWork };

/** A file the user gave us: its name and bytes. */
export interface UserFile {
  name: string;
  bytes: Uint8Array;
}

/** An opened study (or trial list) and the way to read the recordings it names. */
export interface OpenedStudy {
  /** File name of the study or trial list. */
  name: string;
  text: string;
  /** Where it lives, for the title and recent list (null in the browser). */
  displayPath: string | null;
  /**
   * Reads a file the study names, by its path relative to the study file's folder.
   * @throws Error when the file is not available
   */
  readFile(relativePath: string): Promise<Uint8Array>;
}

/** Everything the renderer asks of its host. */
export interface Host {
  readonly kind: 'electron' | 'browser';
  openStudy(): Promise<OpenedStudy | null>;
  openTrialList(): Promise<OpenedStudy | null>;
  openRecentStudy(displayPath: string): Promise<OpenedStudy | null>;
  openRecordings(): Promise<UserFile[] | null>;
  recentStudies(): Promise<RecentStudy[]>;
  /** Saves the study text; returns where (path or downloaded name), or null when cancelled. */
  saveStudy(text: string, suggestedName: string, saveAs: boolean): Promise<string | null>;
  /** Writes output files (tables, methods, figures); returns a short description of where, or null when cancelled. */
  exportFiles(files: OutputFile[]): Promise<string | null>;
  autosave(text: string): Promise<void>;
  clearAutosave(): Promise<void>;
  recoverAutosave(): Promise<RecoveredWork | null>;
  /** Window title and unsaved-changes mark. */
  setDocumentState(title: string, dirty: boolean): void;
  /** Menu commands (native menu in Electron, keyboard shortcuts in the browser); returns unsubscribe. */
  onCommand(listener: (command: MenuCommand) => void): () => void;
  /** Recent-study picks from the native menu; returns unsubscribe. */
  onOpenRecent(listener: (displayPath: string) => void): () => void;
}
