// Builds of the Forecatch app, shared by `npm start`, `npm run web`, `npm run package` and the
// end-to-end tests: the renderer (vite.config.ts -> dist/) and the Electron main process and preload
// (electron/*.ts -> dist-electron/main.cjs and preload.cjs, each one self-contained CommonJS file; the
// sandboxed preload may require nothing but `electron`).
import { build } from 'vite';
import { builtinModules } from 'node:module';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

/** Repository root. */
export const ROOT = fileURLToPath(new URL('..', import.meta.url));

/**
 * Whether Electron's runtime binary is installed (never by requiring `electron`, which would try to
 * download it): node_modules/electron/path.txt names the executable inside node_modules/electron/dist.
 * @returns the executable's absolute path, or null
 */
export function electronRuntimePath() {
  const pkg = join(ROOT, 'node_modules', 'electron');
  const pathTxt = join(pkg, 'path.txt');
  if (!existsSync(pathTxt)) return null;
  const rel = readFileSync(pathTxt, 'utf8').trim();
  const exe = join(pkg, 'dist', rel);
  return rel && existsSync(exe) ? exe : null;
}

/** Builds the renderer into dist/. */
export async function buildRenderer({ quiet = true } = {}) {
  // always React's production build and JSX transform, also when called from the test runner (NODE_ENV=test)
  const saved = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({ configFile: join(ROOT, 'vite.config.ts'), logLevel: quiet ? 'warn' : 'info' });
  } finally {
    if (saved === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = saved;
  }
  return join(ROOT, 'dist');
}

const external = ['electron', ...builtinModules, ...builtinModules.map((m) => `node:${m}`)];

async function buildNodeEntry(entry, fileName, quiet) {
  await build({
    configFile: false,
    root: ROOT,
    logLevel: quiet ? 'warn' : 'info',
    publicDir: false,
    build: {
      outDir: join(ROOT, 'dist-electron'),
      emptyOutDir: false,
      target: 'node20',
      minify: false,
      sourcemap: false,
      ssr: join(ROOT, entry),
      rollupOptions: {
        external,
        output: { format: 'cjs', entryFileNames: fileName, codeSplitting: false },
      },
    },
  });
}

/** Builds dist-electron/main.cjs and dist-electron/preload.cjs. */
export async function buildElectron({ quiet = true } = {}) {
  await buildNodeEntry('electron/main.ts', 'main.cjs', quiet);
  await buildNodeEntry('electron/preload.ts', 'preload.cjs', quiet);
  return join(ROOT, 'dist-electron');
}
