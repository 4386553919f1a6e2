/**
 * The settings every Forecatch window is created with, as pure functions so a test can assert them
 * without Electron's runtime (Electron security checklist: context isolation, sandbox, no Node
 * integration, web security on, no insecure content, no remote module, no webview).
 */
import type { BrowserWindowConstructorOptions, WebPreferences } from 'electron';

/** Scheme the app's pages are served from (registered privileged in main.ts). */
export const APP_SCHEME = 'forecatch';
/** Host of the app's pages under {@link APP_SCHEME}. */
export const APP_HOST = 'app';
/** URL of the main page. */
export const APP_INDEX_URL = `${APP_SCHEME}://${APP_HOST}/index.html`;

/**
 * Web preferences of the Forecatch window.
 * @param preloadPath - absolute path of the compiled preload script (dist-electron/preload.cjs)
 * @returns preferences with every checklist switch set explicitly
 */
export function secureWebPreferences(preloadPath: string): WebPreferences {
  return {
    preload: preloadPath,
    contextIsolation: true,
    sandbox: true,
    nodeIntegration: false,
    nodeIntegrationInWorker: false,
    nodeIntegrationInSubFrames: false,
    webSecurity: true,
    allowRunningInsecureContent: false,
    experimentalFeatures: false,
    webviewTag: false,
    navigateOnDragDrop: false,
    spellcheck: false,
    safeDialogs: true,
  };
}

/**
 * Options of the main window.
 * @param preloadPath - absolute path of the compiled preload script
 * @param iconPath - window icon (PNG), optional
 */
export function mainWindowOptions(preloadPath: string, iconPath?: string): BrowserWindowConstructorOptions {
  return {
    width: 1400,
    height: 900,
    minWidth: 900,
    minHeight: 600,
    title: 'Forecatch',
    show: false,
    backgroundColor: '#1b1d21',
    ...(iconPath ? { icon: iconPath } : {}),
    webPreferences: secureWebPreferences(preloadPath),
  };
}

/** Privileges of the app scheme: standard and secure (so fetch, workers and the CSP behave as on https). */
export const APP_SCHEME_PRIVILEGES = {
  standard: true,
  secure: true,
  supportFetchAPI: true,
  stream: true,
  corsEnabled: false,
  bypassCSP: false,
  allowServiceWorkers: false,
} as const;
