// A small static file server for the browser build (dist/), bound to 127.0.0.1 only. Used by
// `npm start` without Electron's runtime, `npm run web`, the end-to-end tests and the browser benchmark.
import { createServer } from 'node:http';
import { createReadStream, statSync } from 'node:fs';
import { join, normalize, resolve, sep } from 'node:path';
import { CONTENT_SECURITY_POLICY } from './csp.mjs';
import { mimeTypeFor } from './mimeTypes.mjs';


/**
 * Resolves a URL path inside `root`, or null when it would leave it.
 * @param {string} root absolute folder
 * @param {string} urlPath the request's path, percent-encoded
 * @returns {string | null}
 */
export function resolveInside(root, urlPath) {
  let decoded;
  try {
    decoded = decodeURIComponent(urlPath.split('?')[0].split('#')[0]);
  } catch {
    return null;
  }
  if (decoded.includes('\0')) return null;
  const rel = normalize(decoded).replace(/^([/\\])+/, '');
  const full = resolve(root, rel);
  const rootWithSep = root.endsWith(sep) ? root : root + sep;
  if (full !== root && !full.startsWith(rootWithSep)) return null;
  return full;
}

/**
 * Serves `dir` on 127.0.0.1. Tries `port`, then the next ports, when one is taken.
 * @param {string} dir folder to serve (index.html for `/`)
 * @param {{ port?: number, tries?: number, quiet?: boolean }} [opts] port 0 picks a free port
 * @returns {Promise<{ url: string, port: number, close: () => Promise<void> }>}
 */
export async function serveStatic(dir, opts = {}) {
  const root = resolve(dir);
  const tries = opts.tries ?? 20;
  let port = opts.port ?? 0;
  const server = createServer((req, res) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405, { Allow: 'GET, HEAD' }).end();
      return;
    }
    let file = resolveInside(root, req.url ?? '/');
    if (file === null) {
      res.writeHead(403).end('forbidden');
      return;
    }
    try {
      if (statSync(file).isDirectory()) file = join(file, 'index.html');
      const st = statSync(file);
      res.writeHead(200, {
        'Content-Type': mimeTypeFor(file),
        'Content-Length': st.size,
        'Content-Security-Policy': CONTENT_SECURITY_POLICY,
        'X-Content-Type-Options': 'nosniff',
        'Cache-Control': 'no-cache',
      });
      if (req.method === 'HEAD') res.end();
      else createReadStream(file).pipe(res);
    } catch {
      res.writeHead(404, { 'Content-Type': 'text/plain' }).end('not found');
    }
  });
  for (let attempt = 0; ; attempt++) {
    try {
      await new Promise((ok, fail) => {
        server.once('error', fail);
        server.listen(port, '127.0.0.1', () => {
          server.off('error', fail);
          ok(undefined);
        });
      });
      break;
    } catch (err) {
      if (err?.code !== 'EADDRINUSE' || port === 0 || attempt >= tries) throw err;
      port += 1;
    }
  }
  const actual = server.address().port;
  return {
    url: `http://127.0.0.1:${actual}/`,
    port: actual,
    close: () => new Promise((ok) => server.close(() => ok())),
  };
}
