/** Files of the desktop shell: atomic saves with backup, recent studies, autosave recovery, the menu, the static server. */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { atomicWriteFile } from '../../cli/io/atomicWrite';
import { UserStore, pushRecent } from '../../electron/userStore';
import { menuTemplate } from '../../electron/menuTemplate';
import { resolveInside, serveStatic } from '../../scripts/staticServer.mjs';
import type { MenuItemConstructorOptions } from 'electron';

const dir = mkdtempSync(join(tmpdir(), 'forecatch-shell-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('atomicWriteFile', () => {
  it('writes the new content, keeps the previous version as .bak, and leaves no temporary file', async () => {
    const p = join(dir, 'study.json');
    expect((await atomicWriteFile(p, '{"v":1}', { keepBackup: true })).backupPath).toBeNull();
    const r = await atomicWriteFile(p, '{"v":2}', { keepBackup: true });
    expect(r.backupPath).toBe(`${p}.bak`);
    expect(readFileSync(p, 'utf8')).toBe('{"v":2}');
    expect(readFileSync(`${p}.bak`, 'utf8')).toBe('{"v":1}');
    expect(readdirSync(dir).filter((f) => f.includes('.tmp'))).toEqual([]);
  });
  it('writes bytes exactly and fails cleanly into a missing folder', async () => {
    const p = join(dir, 'fig.png');
    await atomicWriteFile(p, new Uint8Array([137, 80, 78, 71]), { keepBackup: false });
    expect([...readFileSync(p)]).toEqual([137, 80, 78, 71]);
    await expect(atomicWriteFile(join(dir, 'nope', 'x.csv'), 'x')).rejects.toThrow();
  });
});

describe('UserStore: recent studies and crash recovery', () => {
  it('keeps the most recent first, without duplicates, at most 10', () => {
    let list = [] as ReturnType<typeof pushRecent>;
    for (let i = 0; i < 12; i++) list = pushRecent(list, { displayPath: `/s${i}.json`, name: `s${i}`, openedIso: 't' });
    list = pushRecent(list, { displayPath: '/s5.json', name: 's5', openedIso: 't2' });
    expect(list.length).toBe(10);
    expect(list[0]).toEqual({ displayPath: '/s5.json', name: 's5', openedIso: 't2' });
    expect(list.filter((r) => r.displayPath === '/s5.json').length).toBe(1);
  });
  it('recovers autosaved work after a restart and forgets it once cleared', async () => {
    const store = new UserStore(dir);
    expect(await store.recover()).toBeNull();
    await store.autosave('{"journal":[]}', '/data/study.json');
    const again = new UserStore(dir); // a new session after a crash
    expect(await again.recover()).toEqual({ text: '{"journal":[]}', savedIso: expect.any(String), displayPath: '/data/study.json' });
    await again.clearAutosave();
    expect(await again.recover()).toBeNull();
  });
  it('survives a corrupt recent list', async () => {
    writeFileSync(join(dir, 'recent-studies.json'), '{not json');
    const store = new UserStore(dir);
    expect(await store.recent()).toEqual([]);
    await store.addRecent({ displayPath: '/a.json', name: 'a.json', openedIso: 'x' });
    expect((await store.recent()).length).toBe(1);
  });
});

describe('menu template', () => {
  const sent: string[] = [];
  const items = menuTemplate({ send: (c) => sent.push(c), openRecent: (p) => sent.push(`recent:${p}`), quit: () => sent.push('quit') }, [{ displayPath: '/d/s.json', name: 's.json', openedIso: 'x' }], false);
  const flat: MenuItemConstructorOptions[] = [];
  const walk = (list: MenuItemConstructorOptions[]) => {
    for (const i of list) {
      flat.push(i);
      if (Array.isArray(i.submenu)) walk(i.submenu);
    }
  };
  walk(items);
  const byLabel = (label: string) => flat.find((i) => i.label === label)!;
  it('has the usual shortcuts: open, save, save as, export, undo, redo, quit', () => {
    expect(byLabel('Open Study…').accelerator).toBe('CmdOrCtrl+O');
    expect(byLabel('Save Study').accelerator).toBe('CmdOrCtrl+S');
    expect(byLabel('Save Study As…').accelerator).toBe('CmdOrCtrl+Shift+S');
    expect(byLabel('Export Tables and Methods…').accelerator).toBe('CmdOrCtrl+E');
    expect(byLabel('Undo Onset Edit').accelerator).toBe('CmdOrCtrl+Z');
    expect(byLabel('Redo Onset Edit').accelerator).toBe('Ctrl+Y');
    expect(byLabel('Quit').accelerator).toBe('CmdOrCtrl+Q');
  });
  it('sends document commands to the renderer and lists recent studies', () => {
    (byLabel('Save Study').click as () => void)();
    (byLabel('/d/s.json').click as () => void)();
    expect(sent).toEqual(['save', 'recent:/d/s.json']);
  });
});

describe('static server of the browser build', () => {
  it('never resolves outside its folder', () => {
    expect(resolveInside('/srv/dist', '/index.html')).toBe('/srv/dist/index.html');
    expect(resolveInside('/srv/dist', '/../../etc/passwd')).toBe('/srv/dist/etc/passwd');
    expect(resolveInside('/srv/dist', '/%2e%2e%2f%2e%2e%2fetc/passwd')).toBe('/srv/dist/etc/passwd');
    expect(resolveInside('/srv/dist', '/a%00b')).toBeNull();
    expect(resolveInside('/srv/dist', '/%E0%A4%A')).toBeNull();
  });
  it('serves files on 127.0.0.1 with the CSP header, 404s missing files, refuses POST', async () => {
    writeFileSync(join(dir, 'index.html'), '<p>hi</p>');
    const server = await serveStatic(dir, { port: 0 });
    try {
      expect(server.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
      const ok = await fetch(server.url);
      expect(ok.status).toBe(200);
      expect(await ok.text()).toBe('<p>hi</p>');
      expect(ok.headers.get('content-security-policy')).toContain("script-src 'self'");
      expect((await fetch(`${server.url}missing.js`)).status).toBe(404);
      expect((await fetch(server.url, { method: 'POST' })).status).toBe(405);
    } finally {
      await server.close();
    }
  });
});
