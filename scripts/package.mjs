#!/usr/bin/env node
// `npm run package`: a Linux package (AppImage and .deb, in release/) of the Forecatch desktop app with
// electron-builder (configuration: build/electron-builder.json). It packages the Electron runtime
// installed in node_modules/electron/dist, so it needs that runtime: where it could not be downloaded
// (ELECTRON_SKIP_BINARY_DOWNLOAD), this says so and stops. Not run in CI.
import { join } from 'node:path';
import { readFileSync } from 'node:fs';
import { ROOT, buildElectron, buildRenderer, electronRuntimePath } from './buildApp.mjs';

const runtime = electronRuntimePath();
if (!runtime) {
  console.error(
    "forecatch: cannot package: Electron's runtime is absent (node_modules/electron/dist not installed). " +
      'On a machine that can download it, run `npm install` without ELECTRON_SKIP_BINARY_DOWNLOAD (or `node node_modules/electron/install.js`), then `npm run package`.',
  );
  process.exit(1);
}

console.log('forecatch: building the renderer and the desktop shell...');
await buildRenderer();
await buildElectron();
const { build, Platform } = await import('electron-builder');
const config = JSON.parse(readFileSync(join(ROOT, 'build', 'electron-builder.json'), 'utf8'));
delete config.$comment;
const electronVersion = JSON.parse(readFileSync(join(ROOT, 'node_modules', 'electron', 'package.json'), 'utf8')).version;
const outputs = await build({
  projectDir: ROOT,
  targets: Platform.LINUX.createTarget(),
  config: { ...config, electronVersion, electronDist: join(ROOT, 'node_modules', 'electron', 'dist') },
  publish: 'never',
});
console.log(`forecatch: packaged:\n${outputs.map((o) => `  ${o}`).join('\n')}`);
