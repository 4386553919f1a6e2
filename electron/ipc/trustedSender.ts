/**
 * Whether an IPC message comes from one of our own pages: the sending frame's URL must be on the app's
 * custom scheme and host. Messages from any other origin (a navigated-away frame, an injected iframe,
 * devtools extensions) are refused.
 */
import { APP_HOST, APP_SCHEME } from '../windowOptions';

/**
 * @param frameUrl - `event.senderFrame.url` (null/undefined when the frame is gone)
 * @returns true only for `forecatch://app/...`
 */
export function isTrustedSenderUrl(frameUrl: string | null | undefined): boolean {
  if (typeof frameUrl !== 'string' || frameUrl.length === 0) return false;
  let url: URL;
  try {
    url = new URL(frameUrl);
  } catch {
    return false;
  }
  return url.protocol === `${APP_SCHEME}:` && url.host === APP_HOST && url.username === '' && url.password === '';
}

/**
 * Whether the window may navigate to `targetUrl`: only within the app's own pages (same scheme and
 * host). Everything else (http(s), file:, data:, javascript:) is blocked; links open nowhere.
 */
export function isAllowedNavigation(targetUrl: string): boolean {
  return isTrustedSenderUrl(targetUrl);
}
