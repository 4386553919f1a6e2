/**
 * Vite build of the renderer (renderer/ -> dist/). Relative base so the same build is served by the
 * browser build's static server and by the Electron shell's `forecatch://` protocol. The
 * Content-Security-Policy is written into index.html from scripts/csp.mjs (one declaration for all).
 */
import { defineConfig, type Plugin } from 'vite';
import { fileURLToPath } from 'node:url';
import { CONTENT_SECURITY_POLICY_META } from './scripts/csp.mjs';

const root = fileURLToPath(new URL('./renderer', import.meta.url));
const outDir = fileURLToPath(new URL('./dist', import.meta.url));

/** Inserts the CSP <meta> as the first element of <head> in the built page. */
function cspMeta(): Plugin {
  return {
    name: 'forecatch-csp-meta',
    apply: 'build',
    transformIndexHtml: {
      order: 'pre',
      handler: () => [
        { tag: 'meta', attrs: { 'http-equiv': 'Content-Security-Policy', content: CONTENT_SECURITY_POLICY_META }, injectTo: 'head-prepend' },
      ],
    },
  };
}

export default defineConfig({
  root,
  base: './',
  publicDir: fileURLToPath(new URL('./renderer/public', import.meta.url)),
  plugins: [cspMeta()],
  mode: 'production',
  build: {
    outDir,
    emptyOutDir: true,
    target: 'es2022',
    chunkSizeWarningLimit: 6000,
    sourcemap: false,
    modulePreload: { polyfill: false },
    rolldownOptions: { checks: { pluginTimings: false } },
  },
  worker: { format: 'es' },
  server: { host: '127.0.0.1' },
});
