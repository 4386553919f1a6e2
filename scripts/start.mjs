#!/usr/bin/env node
// `npm start`: builds the app and opens the demo study in the Electron shell. Where Electron's runtime
// binary is absent (it cannot be downloaded on every machine) it says so in one line and serves the
// browser build on 127.0.0.1 instead. `npm run web` (`--web`) serves the browser build directly.
// Options: --web, --port N (default 5178, or FORECATCH_PORT), --no-open (do not launch a browser).
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { ROOT, buildElectron, buildRenderer, electronRuntimePath } from './buildApp.mjs';
import { serveStatic } from './staticServer.mjs';

const args = process.argv.slice(2);
const web = args.includes('--web');
const noOpen = args.includes('--no-open') || process.env.CI === 'true';
const portArg = args.indexOf('--port');
const port = Number(portArg >= 0 ? args[portArg + 1] : process.env.FORECATCH_PORT ?? 5178);
if (!Number.isInteger(port) || port < 0 || port > 65535) {
  console.error(`forecatch: --port must be an integer 0..65535, got ${args[portArg + 1]}`);
  process.exit(2);
}

const electronExe = web ? null : electronRuntimePath();

if (electronExe) {
  console.log('forecatch: building the renderer and the desktop shell...');
  await buildRenderer();
  await buildElectron();
  const child = spawn(electronExe, ['.', '--demo'], { cwd: ROOT, stdio: 'inherit' });
  child.on('exit', (code) => process.exit(code ?? 0));
} else {
  await buildRenderer();
  const server = await serveStatic(`${ROOT}dist`, { port });
  const url = `${server.url}#demo`;
  console.log(
    web
      ? `forecatch: serving the browser build at ${url} (Ctrl+C stops it)`
      : `forecatch: Electron's runtime is absent (node_modules/electron/dist not installed), so serving the browser build at ${url} instead (Ctrl+C stops it)`,
  );
  if (!noOpen) openBrowser(url);
  const stop = async () => {
    await server.close();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

/** Opens the URL in the desktop's browser when there is a desktop; otherwise the printed URL is enough. */
function openBrowser(url) {
  const opener =
    process.platform === 'darwin' ? 'open' : process.platform === 'win32' ? 'explorer' : ['/usr/bin/xdg-open', '/usr/local/bin/xdg-open'].find((p) => existsSync(p));
  if (!opener || (process.platform === 'linux' && !process.env.DISPLAY && !process.env.WAYLAND_DISPLAY)) return;
  try {
    const child = spawn(opener, [url], { stdio: 'ignore', detached: true });
    child.on('error', () => undefined);
    child.unref();
  } catch {
    /* no browser to open: the URL is printed above */
  }
}
