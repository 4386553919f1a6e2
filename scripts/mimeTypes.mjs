// Content types of the files the browser build and the desktop shell serve: one table for both
// (scripts/staticServer.mjs on localhost, electron/appProtocol.ts under forecatch://).
import { extname } from 'node:path';

const MIME = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.csv': 'text/csv; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
  '.wasm': 'application/wasm',
};

/** Content type for a file path; `application/octet-stream` when unknown (C3D, EDF, BDF, ...). */
export function mimeTypeFor(path) {
  return MIME[extname(path).toLowerCase()] ?? 'application/octet-stream';
}
