/** The desktop shell's build and packaging configuration, checked without Electron's runtime. */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { buildElectron, electronRuntimePath } from '../../scripts/buildApp.mjs';

const root = fileURLToPath(new URL('../..', import.meta.url));
const requires = (code: string) => [...code.matchAll(/require\(["']([^"']+)["']\)/g)].map((m) => m[1]);

describe('Electron main and preload bundles', () => {
  it('build to dist-electron/, the preload requiring nothing but electron (a sandboxed preload can require nothing else)', async () => {
    await buildElectron();
    const preload = readFileSync(`${root}dist-electron/preload.cjs`, 'utf8');
    expect(new Set(requires(preload))).toEqual(new Set(['electron']));
    expect(preload).toContain('exposeInMainWorld');
    expect(preload).not.toMatch(/exposeInMainWorld\([^)]*ipcRenderer\s*\)/); // never the raw ipcRenderer
    const main = readFileSync(`${root}dist-electron/main.cjs`, 'utf8');
    for (const r of requires(main)) expect(r === 'electron' || r.startsWith('node:'), r).toBe(true);
  }, 120_000);

  it('package.json main, the build output and the electron-builder file list agree', () => {
    const pkg = JSON.parse(readFileSync(`${root}package.json`, 'utf8')) as { main: string };
    expect(pkg.main).toBe('dist-electron/main.cjs');
    const cfg = JSON.parse(readFileSync(`${root}build/electron-builder.json`, 'utf8')) as { files: string[]; extraMetadata: { main: string }; linux: { target: string[]; icon: string } };
    expect(cfg.extraMetadata.main).toBe(pkg.main);
    expect(cfg.files).toEqual(expect.arrayContaining(['dist/**/*', 'dist-electron/**/*']));
    expect(cfg.linux.target).toEqual(['AppImage', 'deb']);
    expect(existsSync(`${root}${cfg.linux.icon}`)).toBe(true);
  });

  it('detects the runtime from node_modules/electron/path.txt and dist/, never by requiring electron', () => {
    const hasRuntime = existsSync(`${root}node_modules/electron/path.txt`);
    const found = electronRuntimePath();
    if (!hasRuntime) expect(found).toBeNull();
    else if (found) expect(existsSync(found)).toBe(true);
    const start = readFileSync(`${root}scripts/start.mjs`, 'utf8') + readFileSync(`${root}scripts/buildApp.mjs`, 'utf8');
    expect(start).not.toMatch(/require\(['"]electron['"]\)|import\(['"]electron['"]\)|from ['"]electron['"]/);
  });
});
