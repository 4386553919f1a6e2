/**
 * The desktop shell's security settings, asserted without Electron's runtime: each item follows the
 * Electron security checklist (electronjs.org/docs/latest/tutorial/security, "Checklist: Security
 * Recommendations"), numbered there 1-20.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { APP_INDEX_URL, APP_SCHEME_PRIVILEGES, mainWindowOptions, secureWebPreferences } from '../../electron/windowOptions';
import { isAllowedNavigation, isTrustedSenderUrl } from '../../electron/ipc/trustedSender';
import { checkIpcMessage, runIpc } from '../../electron/ipc/handle';
import { resolveAppAsset } from '../../electron/appProtocol';
import { IPC_CHANNELS, IPC_VALIDATORS } from '../../shared/ipc/contract';
import { CONTENT_SECURITY_POLICY, CSP_DIRECTIVES } from '../../scripts/csp.mjs';

const root = fileURLToPath(new URL('../..', import.meta.url));
const trusted = 'forecatch://app/index.html';

describe('window options (checklist 2 no Node integration, 3 context isolation, 4 sandbox, 6 webSecurity)', () => {
  const prefs = secureWebPreferences('/x/preload.cjs');
  it('turns on context isolation, sandbox and web security, and Node integration off everywhere', () => {
    expect(prefs.contextIsolation).toBe(true);
    expect(prefs.sandbox).toBe(true);
    expect(prefs.nodeIntegration).toBe(false);
    expect(prefs.nodeIntegrationInWorker).toBe(false);
    expect(prefs.nodeIntegrationInSubFrames).toBe(false);
    expect(prefs.webSecurity).toBe(true);
  });
  it('allows no insecure content, no experimental features and no <webview> (checklist 8, 9, 12)', () => {
    expect(prefs.allowRunningInsecureContent).toBe(false);
    expect(prefs.experimentalFeatures).toBe(false);
    expect(prefs.webviewTag).toBe(false);
    expect(prefs.preload).toBe('/x/preload.cjs');
  });
  it('the main window uses exactly these preferences and loads from the custom scheme, not file:// (checklist 18)', () => {
    expect(mainWindowOptions('/x/preload.cjs').webPreferences).toEqual(prefs);
    expect(APP_INDEX_URL.startsWith('forecatch://app/')).toBe(true);
    expect(APP_SCHEME_PRIVILEGES.secure).toBe(true);
    expect(APP_SCHEME_PRIVILEGES.standard).toBe(true);
    expect(APP_SCHEME_PRIVILEGES.bypassCSP).toBe(false);
  });
});

describe('Content-Security-Policy (checklist 7): no remote origin, no eval, no inline script', () => {
  const directives = new Map(CSP_DIRECTIVES.map(([name, ...sources]) => [name, sources]));
  it('defaults to self and forbids objects, base and framing', () => {
    expect(directives.get('default-src')).toEqual(["'self'"]);
    expect(directives.get('object-src')).toEqual(["'none'"]);
    expect(directives.get('base-uri')).toEqual(["'none'"]);
    expect(directives.get('frame-ancestors')).toEqual(["'none'"]);
  });
  it('scripts come from self only: no unsafe-eval, no unsafe-inline, no remote host anywhere', () => {
    expect(directives.get('script-src')).toEqual(["'self'"]);
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/unsafe-eval|wasm-unsafe-eval|https?:|\*/);
    for (const [name, sources] of directives) if (name !== 'style-src') expect(sources).not.toContain("'unsafe-inline'");
  });
  it('the built page carries the same policy in a <meta> when dist/ exists', () => {
    let html: string;
    try {
      html = readFileSync(`${root}dist/index.html`, 'utf8');
    } catch {
      return; // not built yet: the end-to-end tests build and check it in a real browser
    }
    expect(html).toContain('http-equiv="Content-Security-Policy"');
    const content = /http-equiv="Content-Security-Policy" content="([^"]*)"/.exec(html)?.[1].replace(/&#39;/g, "'");
    expect(content).toBe(CONTENT_SECURITY_POLICY.replace("; frame-ancestors 'none'", ''));
    expect(html).not.toMatch(/<script(?![^>]*\bsrc=)[^>]*>/); // no inline script element
  });
});

describe('navigation and IPC sender checks (checklist 13 navigation, 14 new windows, 17 sender validation)', () => {
  it('accepts only frames of forecatch://app', () => {
    expect(isTrustedSenderUrl(trusted)).toBe(true);
    expect(isTrustedSenderUrl('forecatch://app/assets/x.js')).toBe(true);
    for (const bad of ['https://app/index.html', 'file:///work/dist/index.html', 'forecatch://evil/index.html', 'forecatch://u:p@app/', 'about:blank', 'javascript:alert(1)', '', null, undefined]) {
      expect(isTrustedSenderUrl(bad)).toBe(false);
    }
  });
  it('blocks navigation away from the app', () => {
    expect(isAllowedNavigation('forecatch://app/index.html#demo')).toBe(true);
    expect(isAllowedNavigation('https://example.org/')).toBe(false);
    expect(isAllowedNavigation('file:///etc/passwd')).toBe(false);
    expect(isAllowedNavigation('data:text/html,hi')).toBe(false);
  });
  it('main.ts blocks new windows, webviews and redirects, and denies every permission request', () => {
    const main = readFileSync(`${root}electron/main.ts`, 'utf8');
    expect(main).toMatch(/setWindowOpenHandler\(\(\) => \(\{ action: 'deny' \}\)\)/);
    expect(main).toMatch(/will-navigate/);
    expect(main).toMatch(/will-redirect/);
    expect(main).toMatch(/will-attach-webview', \(event\) => event\.preventDefault\(\)/);
    expect(main).toMatch(/setPermissionRequestHandler\(\(_wc, _permission, callback\) => callback\(false\)\)/);
    expect(main).toMatch(/setPermissionCheckHandler\(\(\) => false\)/);
    expect(main).toMatch(/protocol\.handle\(APP_SCHEME/);
    expect(main).not.toMatch(/loadFile\(|file:\/\//);
  });
  it('no file in electron/ registers raw ipcMain handlers outside the one wrapper', () => {
    for (const name of readdirSync(`${root}electron`, { recursive: true }) as string[]) {
      if (!name.endsWith('.ts') || name.replace(/\\/g, '/') === 'ipc/handle.ts') continue;
      const text = readFileSync(`${root}electron/${name}`, 'utf8');
      expect(text, name).not.toMatch(/ipcMain\.(handle|on|once)\(/);
    }
  });
});

describe('the IPC wrapper validates every message (one contract, one validator per channel)', () => {
  it('declares a validator for every channel and refuses unknown channels', () => {
    expect(IPC_CHANNELS.length).toBeGreaterThanOrEqual(10);
    for (const c of IPC_CHANNELS) expect(typeof IPC_VALIDATORS[c]).toBe('function');
    expect(() => checkIpcMessage('shell:exec' as never, trusted, [])).toThrow(/unknown IPC channel/);
  });
  it('refuses a message from an untrusted frame before looking at its argument', () => {
    expect(() => checkIpcMessage('recent:list', 'https://evil.example/', [])).toThrow(/untrusted/);
    expect(() => checkIpcMessage('recent:list', null, [])).toThrow(/untrusted/);
  });
  it('refuses extra arguments, missing fields, wrong types and extra fields', () => {
    expect(() => checkIpcMessage('recent:list', trusted, [1])).toThrow(TypeError);
    expect(() => checkIpcMessage('recent:list', trusted, [undefined, 2])).toThrow(TypeError);
    expect(() => checkIpcMessage('study:save', trusted, [{ text: 'x', suggestedName: 'a.json' }])).toThrow(/saveAs/);
    expect(() => checkIpcMessage('study:save', trusted, [{ text: 1, suggestedName: 'a.json', saveAs: false }])).toThrow(/text/);
    expect(() => checkIpcMessage('study:save', trusted, [{ text: 'x', suggestedName: 'a.json', saveAs: false, path: '/etc' }])).toThrow(/unexpected field/);
    expect(checkIpcMessage('study:save', trusted, [{ text: 'x', suggestedName: 'a.json', saveAs: true }])).toEqual({ text: 'x', suggestedName: 'a.json', saveAs: true });
  });
  it('never lets the renderer choose a folder: export and save names are plain file names', () => {
    for (const name of ['../x.csv', '/etc/passwd', 'a/b.csv', 'a\\b.csv', '..', '', 'x\u0000.csv']) {
      expect(() => checkIpcMessage('export:write', trusted, [{ files: [{ name, data: 'x' }] }]), name).toThrow();
    }
    expect(() => checkIpcMessage('export:write', trusted, [{ files: [] }])).toThrow(/empty/);
    expect(() => checkIpcMessage('export:write', trusted, [{ files: [{ name: 'a.csv', data: 'x' }, { name: 'a.csv', data: 'y' }] }])).toThrow(/duplicate/);
    const ok = checkIpcMessage('export:write', trusted, [{ files: [{ name: 'trials.csv', data: 'x' }, { name: 'fig.png', data: new Uint8Array(3) }] }]);
    expect(ok.files.map((f) => f.name)).toEqual(['trials.csv', 'fig.png']);
  });
  it('reads of study files stay inside the granted folder: no absolute path, no .., handle format checked', () => {
    const h = '0123456789abcdef0123456789abcdef';
    expect(checkIpcMessage('study:readFile', trusted, [{ folderHandle: h, relativePath: 'rec/t01.c3d' }]).relativePath).toBe('rec/t01.c3d');
    for (const relativePath of ['/etc/passwd', 'C:\\x', '../x.c3d', 'a/../../x', 'a\\..\\x']) {
      expect(() => checkIpcMessage('study:readFile', trusted, [{ folderHandle: h, relativePath }]), relativePath).toThrow(RangeError);
    }
    expect(() => checkIpcMessage('study:readFile', trusted, [{ folderHandle: '/home', relativePath: 'x' }])).toThrow(/handle/);
  });
  it('runIpc turns every failure into a plain-data error with a code, and never throws', async () => {
    const bad = await runIpc('recent:list', 'https://evil.example/', [], () => []);
    expect(bad).toEqual({ ok: false, error: expect.objectContaining({ code: 'IPC_UNTRUSTED_SENDER' }) });
    const typeErr = await runIpc('autosave:write', trusted, [{ text: 5 }], () => undefined);
    expect(typeErr.ok).toBe(false);
    if (!typeErr.ok) expect(typeErr.error.code).toBe('TYPE_ERROR');
    const good = await runIpc('recent:list', trusted, [], () => [{ displayPath: '/a.json', name: 'a.json', openedIso: 'x' }]);
    expect(good).toEqual({ ok: true, value: [{ displayPath: '/a.json', name: 'a.json', openedIso: 'x' }] });
    const thrown = await runIpc('recent:list', trusted, [], () => {
      throw new Error('disk on fire');
    });
    expect(thrown).toEqual({ ok: false, error: { name: 'Error', code: 'UNKNOWN', message: 'disk on fire' } });
  });
});

describe('custom protocol serves dist/ only', () => {
  it('maps app URLs into the build folder and refuses everything else', () => {
    expect(resolveAppAsset('/opt/fc/dist', 'forecatch://app/')).toBe('/opt/fc/dist/index.html');
    expect(resolveAppAsset('/opt/fc/dist', 'forecatch://app/assets/a%20b.js')).toBe('/opt/fc/dist/assets/a b.js');
    expect(resolveAppAsset('/opt/fc/dist', 'forecatch://app/../secret')).toBe('/opt/fc/dist/secret'); // URL parsing drops the ..
    expect(resolveAppAsset('/opt/fc/dist', 'forecatch://app/%2e%2e/%2e%2e/etc/passwd')).toBe('/opt/fc/dist/etc/passwd'); // so does %2e%2e
    expect(resolveAppAsset('/opt/fc/dist', 'forecatch://app/%2F..%2F..%2Fetc%2Fpasswd')).toBeNull(); // encoded slashes would escape
    expect(resolveAppAsset('/opt/fc/dist', 'forecatch://other/index.html')).toBeNull();
    expect(resolveAppAsset('/opt/fc/dist', 'file:///etc/passwd')).toBeNull();
    expect(resolveAppAsset('/opt/fc/dist', 'forecatch://app/a%00b')).toBeNull();
  });
});
