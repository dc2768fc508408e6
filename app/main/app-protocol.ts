/**
 * Serves the built renderer (dist/renderer) to the window over the privileged app:// scheme, with the
 * cross-origin-isolation headers SharedArrayBuffer needs (stack.md §4) and a strict Content Security Policy.
 * Only files inside the root folder are served: a path that escapes it gets 403, a missing file 404.
 * No electron import, so the handler is tested directly.
 */
import { readFile, realpath } from 'node:fs/promises';
import { extname, join, sep } from 'node:path';

export const APP_SCHEME = 'app';
export const APP_HOST = 'bundle';
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
export const APP_START_URL = `${APP_ORIGIN}/index.html`;

export { CONTENT_SECURITY_POLICY, ISOLATION_HEADERS } from '../shared/web-policy.mjs';
import { CONTENT_SECURITY_POLICY, ISOLATION_HEADERS } from '../shared/web-policy.mjs';

const MIME: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
  '.wasm': 'application/wasm',
  '.map': 'application/json',
  '.sgy': 'application/octet-stream',
  '.segy': 'application/octet-stream',
  '.txt': 'text/plain; charset=utf-8',
};

export function mimeType(path: string): string {
  return MIME[extname(path).toLowerCase()] ?? 'application/octet-stream';
}

function plain(status: number, text: string): Response {
  return new Response(text, { status, headers: { 'Content-Type': 'text/plain; charset=utf-8', ...ISOLATION_HEADERS } });
}

/**
 * Resolves a URL path inside rootDir, or null when it escapes it (encoded dots or slashes, backslashes,
 * NUL, absolute paths). Symbolic links are resolved and checked again by the caller.
 */
export function resolveInside(rootDir: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes('\0') || decoded.includes('\\')) return null;
  const parts = decoded.split('/').filter((p) => p.length > 0);
  if (parts.some((p) => p === '..' || p === '.')) return null;
  if (parts.length === 0) parts.push('index.html');
  return join(rootDir, ...parts);
}

/** Handles one app:// request: GET or HEAD of a file under rootDir. */
export async function serveAppRequest(request: Request, rootDir: string): Promise<Response> {
  let url: URL;
  try {
    url = new URL(request.url);
  } catch {
    return plain(400, 'Bad request');
  }
  if (url.protocol !== `${APP_SCHEME}:` || url.host !== APP_HOST) return plain(403, 'Forbidden');
  if (request.method !== 'GET' && request.method !== 'HEAD') return plain(405, 'Method not allowed');
  // The raw path, before URL normalisation folded any "..": look at what the page asked for.
  const rawPath = request.url.slice(`${APP_ORIGIN}`.length).split(/[?#]/)[0];
  if (resolveInside(rootDir, rawPath) === null) return plain(403, 'Forbidden');
  const path = resolveInside(rootDir, url.pathname);
  if (path === null) return plain(403, 'Forbidden');
  let body: Buffer;
  try {
    const realRoot = await realpath(rootDir);
    const real = await realpath(path);
    if (real !== realRoot && !real.startsWith(realRoot + sep)) return plain(403, 'Forbidden');
    body = await readFile(real);
  } catch {
    return plain(404, 'Not found');
  }
  const headers: Record<string, string> = {
    'Content-Type': mimeType(path),
    'Content-Length': String(body.length),
    'Content-Security-Policy': CONTENT_SECURITY_POLICY,
    'X-Content-Type-Options': 'nosniff',
    'Cache-Control': 'no-cache',
    ...ISOLATION_HEADERS,
  };
  return new Response(request.method === 'HEAD' ? null : new Uint8Array(body), { status: 200, headers });
}
