// `npm start`: builds what is missing, then launches the desktop app in Electron. Where the Electron binary
// is not installed (it is downloaded from outside the npm registry, so offline machines and CI lack it), it
// says so and serves the same UI (dist/renderer) on 127.0.0.1 with the cross-origin-isolation headers the
// app needs for SharedArrayBuffer (stack.md §4), and prints the address to open in Chromium or Chrome.
// The check reads node_modules/electron/path.txt and the binary it names; it never requires 'electron',
// because that would start a download.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { readFile, realpath } from 'node:fs/promises';
import { createServer } from 'node:http';
import { createRequire } from 'node:module';
import { dirname, extname, join, sep } from 'node:path';
import { pathToFileURL } from 'node:url';
import { CONTENT_SECURITY_POLICY, ISOLATION_HEADERS } from '../app/shared/web-policy.mjs';

const ROOT = new URL('..', import.meta.url).pathname;

/**
 * Whether an Electron binary is present, without triggering its download.
 * @param {string} root project root
 * @param {Record<string, string | undefined>} env
 * @returns {{ available: boolean, binaryPath: string | null, reason: string }}
 */
export function electronStatus(root = ROOT, env = process.env) {
  let pkgDir;
  try {
    pkgDir = dirname(createRequire(join(root, 'package.json')).resolve('electron/package.json'));
  } catch {
    return { available: false, binaryPath: null, reason: 'the electron package is not installed (run npm install)' };
  }
  const pathFile = join(pkgDir, 'path.txt');
  const relative = existsSync(pathFile) ? readFileSync(pathFile, 'utf8').trim() : '';
  if (env.ELECTRON_OVERRIDE_DIST_PATH) {
    const p = join(env.ELECTRON_OVERRIDE_DIST_PATH, relative || 'electron');
    return existsSync(p)
      ? { available: true, binaryPath: p, reason: 'ELECTRON_OVERRIDE_DIST_PATH' }
      : { available: false, binaryPath: null, reason: `ELECTRON_OVERRIDE_DIST_PATH is set but ${p} does not exist` };
  }
  if (!relative) return { available: false, binaryPath: null, reason: 'the Electron binary was never downloaded (node_modules/electron/path.txt is absent)' };
  const binary = join(pkgDir, 'dist', relative);
  if (!existsSync(binary)) return { available: false, binaryPath: null, reason: `the Electron binary ${binary} is missing` };
  return { available: true, binaryPath: binary, reason: 'installed' };
}

export { CONTENT_SECURITY_POLICY, ISOLATION_HEADERS };

const MIME = {
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
};

/**
 * Maps a URL path to a file inside base, or null when it would leave it (dot segments, backslashes, NUL,
 * bad escapes).
 * @param {string} base
 * @param {string} urlPath path part of the request URL, still percent-encoded
 */
export function resolveInside(base, urlPath) {
  let decoded;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes('\0') || decoded.includes('\\')) return null;
  const parts = decoded.split('/').filter((p) => p.length > 0);
  if (parts.some((p) => p === '.' || p === '..')) return null;
  return join(base, ...parts);
}

/**
 * A static server for the built UI: GET/HEAD only, isolation headers and CSP on every answer, 403 for
 * any path that leaves its folder (also through symbolic links). /samples/<name>.sgy serves the demo files
 * so the browser build can open the demo line without a file dialog.
 * @param {{ rendererDir: string, samplesDir: string }} dirs
 */
export function createUiServer({ rendererDir, samplesDir }) {
  return createServer(async (req, res) => {
    const send = (status, body, type = 'text/plain; charset=utf-8') => {
      res.writeHead(status, { 'Content-Type': type, 'Content-Security-Policy': CONTENT_SECURITY_POLICY, 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-cache', ...ISOLATION_HEADERS });
      res.end(req.method === 'HEAD' ? undefined : body);
    };
    if (req.method !== 'GET' && req.method !== 'HEAD') return send(405, 'Method not allowed');
    const rawPath = (req.url ?? '/').split(/[?#]/)[0];
    if (!rawPath.startsWith('/')) return send(400, 'Bad request');
    let base = rendererDir;
    let rest = rawPath;
    if (rawPath.startsWith('/samples/')) {
      base = samplesDir;
      rest = rawPath.slice('/samples'.length);
      if (!rest.toLowerCase().endsWith('.sgy')) return send(403, 'Forbidden');
    }
    const file = resolveInside(base, rest === '/' ? '/index.html' : rest);
    if (file === null) return send(403, 'Forbidden');
    let body;
    try {
      const realBase = await realpath(base);
      const real = await realpath(file);
      if (real !== realBase && !real.startsWith(realBase + sep)) return send(403, 'Forbidden');
      body = await readFile(real);
    } catch {
      return send(404, 'Not found');
    }
    send(200, body, MIME[extname(file).toLowerCase()] ?? 'application/octet-stream');
  });
}

/**
 * Listens on 127.0.0.1, trying the next ports when one is taken (port 0 = any free port).
 * @param {import('node:http').Server} server
 * @returns {Promise<string>} the address, e.g. http://127.0.0.1:4173/
 */
export async function listenLocal(server, port, tries = 10) {
  for (let i = 0; i < tries; i++) {
    const p = port === 0 ? 0 : port + i;
    const ok = await new Promise((resolve, reject) => {
      const onError = (err) => {
        server.off('listening', onListening);
        if (err.code === 'EADDRINUSE' && port !== 0) resolve(false);
        else reject(err);
      };
      const onListening = () => {
        server.off('error', onError);
        resolve(true);
      };
      server.once('error', onError);
      server.once('listening', onListening);
      server.listen(p, '127.0.0.1');
    });
    if (ok) return `http://127.0.0.1:${server.address().port}/`;
  }
  throw new Error(`ports ${port}–${port + tries - 1} on 127.0.0.1 are all taken; set DIPWEAVE_PORT to a free one`);
}

function run(cmd, args) {
  const r = spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit', shell: process.platform === 'win32' });
  return r.status === 0;
}

function builtUiExists() {
  const dir = join(ROOT, 'dist', 'renderer');
  return existsSync(join(dir, 'index.html')) && readdirSync(dir).length > 1;
}

async function main() {
  if (!builtUiExists()) {
    console.log('dipweave: dist/renderer is missing, building it now (npm run build)…');
    if (!run('npm', ['run', 'build'])) {
      console.error('dipweave: the build failed; fix the errors above, then run `npm run build` and `npm start` again.');
      process.exit(1);
    }
  }
  const electron = electronStatus();
  if (electron.available) {
    if (!existsSync(join(ROOT, 'dist-electron', 'main.cjs')) && !run('npm', ['run', 'build:node'])) process.exit(1);
    console.log('dipweave: starting the desktop app in Electron…');
    const env = { ...process.env };
    delete env.ELECTRON_RUN_AS_NODE; // would make the binary a plain Node
    const child = spawn(electron.binaryPath, [ROOT], { stdio: 'inherit', env });
    child.on('exit', (code, signal) => process.exit(signal ? 1 : (code ?? 0)));
    return;
  }
  console.log(`dipweave: Electron cannot start here: ${electron.reason}.`);
  console.log('dipweave: serving the same interface in the browser instead (files open through the browser; the demo line is served from samples/).');
  const server = createUiServer({ rendererDir: join(ROOT, 'dist', 'renderer'), samplesDir: join(ROOT, 'samples') });
  const port = Number(process.env.DIPWEAVE_PORT ?? 4173);
  const url = await listenLocal(server, Number.isInteger(port) && port >= 0 && port < 65536 ? port : 4173);
  console.log(`\n  Dipweave is running at ${url}\n  Open it in Chromium or Chrome. Press Ctrl+C to stop.\n`);
  const stop = () => server.close(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((err) => {
    console.error(`dipweave: ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  });
}
