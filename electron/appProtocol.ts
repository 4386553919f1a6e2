/**
 * Serving the renderer's build (dist/) under `forecatch://app/` instead of file://: the page gets a real
 * origin for the CSP and the IPC sender check, and cannot read anything outside dist/.
 */
import { resolve, sep } from 'node:path';
import { APP_HOST, APP_SCHEME } from './windowOptions';

export { mimeTypeFor } from '../scripts/mimeTypes.mjs';

/**
 * Maps a request URL on the app scheme to a file inside `distRoot`.
 * @param distRoot - absolute folder of the renderer build
 * @param requestUrl - e.g. `forecatch://app/assets/index-abc.js`
 * @returns the absolute file path, or null for another scheme/host, a malformed URL or a path leaving distRoot
 */
export function resolveAppAsset(distRoot: string, requestUrl: string): string | null {
  let url: URL;
  try {
    url = new URL(requestUrl);
  } catch {
    return null;
  }
  if (url.protocol !== `${APP_SCHEME}:` || url.host !== APP_HOST) return null;
  let path: string;
  try {
    path = decodeURIComponent(url.pathname);
  } catch {
    return null;
  }
  if (path.includes('\0')) return null;
  if (path === '/' || path === '') path = '/index.html';
  const root = resolve(distRoot);
  const full = resolve(root, '.' + path);
  if (!full.startsWith(root + sep)) return null;
  return full;
}
