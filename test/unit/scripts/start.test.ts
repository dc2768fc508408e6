// scripts/start.mjs: Electron detection without triggering a download, and the fallback UI server
// (isolation headers, traversal refusal). Servers bind to port 0.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, mkdir, rm, symlink, writeFile } from 'node:fs/promises';
import { request, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createUiServer, electronStatus, listenLocal, resolveInside } from '../../../scripts/start.mjs';

let dir: string;

async function fakeProject(withPathTxt: boolean, withBinary: boolean): Promise<string> {
  const root = await mkdtemp(join(dir, 'proj-'));
  const pkg = join(root, 'node_modules', 'electron');
  await mkdir(join(pkg, 'dist'), { recursive: true });
  await writeFile(join(root, 'package.json'), '{"name":"p"}');
  await writeFile(join(pkg, 'package.json'), '{"name":"electron","main":"index.js"}');
  // index.js would download (as the real one does): the check must never run it.
  await writeFile(join(pkg, 'index.js'), 'throw new Error("index.js was executed")');
  if (withPathTxt) await writeFile(join(pkg, 'path.txt'), 'electron');
  if (withBinary) await writeFile(join(pkg, 'dist', 'electron'), '#!/bin/sh\n');
  return root;
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'dipweave-start-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('electronStatus', () => {
  it('reports a missing download (no path.txt), a missing binary, and an installed one', async () => {
    expect(electronStatus(await fakeProject(false, false), {})).toMatchObject({ available: false, reason: expect.stringMatching(/path\.txt/) });
    expect(electronStatus(await fakeProject(true, false), {})).toMatchObject({ available: false, reason: expect.stringMatching(/missing/) });
    const ok = electronStatus(await fakeProject(true, true), {});
    expect(ok.available).toBe(true);
    expect(ok.binaryPath).toMatch(/node_modules\/electron\/dist\/electron$/);
  });

  it('reports an absent package and honours ELECTRON_OVERRIDE_DIST_PATH', async () => {
    const bare = await mkdtemp(join(dir, 'bare-'));
    await writeFile(join(bare, 'package.json'), '{}');
    expect(electronStatus(bare, {}).available).toBe(false);
    const root = await fakeProject(true, false);
    expect(electronStatus(root, { ELECTRON_OVERRIDE_DIST_PATH: join(dir, 'nowhere') }).available).toBe(false);
    await mkdir(join(dir, 'override'));
    await writeFile(join(dir, 'override', 'electron'), '');
    expect(electronStatus(root, { ELECTRON_OVERRIDE_DIST_PATH: join(dir, 'override') })).toMatchObject({ available: true, binaryPath: join(dir, 'override', 'electron') });
  });

  it('on this project, matches whether the real binary exists (it is absent here and in CI)', () => {
    const s = electronStatus();
    expect(typeof s.available).toBe('boolean');
    if (!s.available) expect(s.reason.length).toBeGreaterThan(10);
  });
});

describe('resolveInside', () => {
  it.each(['/../x', '/a/../../x', '/..%2fx', '/%2e%2e/x', '/a%5c..%5cx', '/a%00', '/%E0%A4%A'])('refuses %s', (p) => {
    expect(resolveInside('/base', p)).toBeNull();
  });
  it('maps ordinary paths inside the base', () => {
    expect(resolveInside('/base', '/assets/app%20x.js')).toBe('/base/assets/app x.js');
  });
});

describe('fallback UI server', () => {
  let server: Server;
  let base: string;
  const get = (path: string, method = 'GET') =>
    new Promise<{ status: number; headers: Record<string, string | string[] | undefined>; body: string }>((resolve, reject) => {
      const u = new URL(base);
      // raw path: no client-side normalisation of dot segments
      const req = request({ host: '127.0.0.1', port: u.port, path, method }, (res) => {
        let body = '';
        res.on('data', (c) => (body += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
      });
      req.on('error', reject);
      req.end();
    });

  beforeAll(async () => {
    const root = await mkdtemp(join(dir, 'ui-'));
    await mkdir(join(root, 'dist', 'renderer', 'assets'), { recursive: true });
    await mkdir(join(root, 'samples'));
    await writeFile(join(root, 'dist', 'renderer', 'index.html'), '<title>Dipweave</title>');
    await writeFile(join(root, 'dist', 'renderer', 'assets', 'a.js'), 'export {}');
    await writeFile(join(root, 'samples', 'demo.sgy'), 'SEGY');
    await writeFile(join(root, 'samples', 'README.md'), 'readme');
    await writeFile(join(root, 'secret.txt'), 'secret');
    await symlink(join(root, 'secret.txt'), join(root, 'dist', 'renderer', 'link.txt'));
    server = createUiServer({ rendererDir: join(root, 'dist', 'renderer'), samplesDir: join(root, 'samples') });
    base = await listenLocal(server, 0);
  });
  afterAll(() => new Promise<void>((r) => server.close(() => r())));

  it('listens on 127.0.0.1 only', () => {
    expect(base).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
  });

  it('serves the UI and the demo files with cross-origin isolation headers and the CSP', async () => {
    for (const path of ['/', '/index.html', '/assets/a.js', '/samples/demo.sgy']) {
      const r = await get(path);
      expect(r.status, path).toBe(200);
      expect(r.headers['cross-origin-opener-policy']).toBe('same-origin');
      expect(r.headers['cross-origin-embedder-policy']).toBe('require-corp');
      expect(String(r.headers['content-security-policy'])).toContain("script-src 'self'");
    }
    expect((await get('/')).body).toContain('Dipweave');
    expect((await get('/assets/a.js')).headers['content-type']).toMatch(/^text\/javascript/);
  });

  it.each(['/../secret.txt', '/assets/../../secret.txt', '/..%2fsecret.txt', '/%2e%2e/secret.txt', '/link.txt', '/samples/../secret.txt', '/samples/README.md', '/samples/..%2f..%2fsecret.txt.sgy'])(
    'refuses %s with 403',
    async (path) => {
      const r = await get(path);
      expect(r.status).toBe(403);
      expect(r.body).not.toContain('secret');
    },
  );

  it('answers 404 for missing files and 405 for writes', async () => {
    expect((await get('/nope.js')).status).toBe(404);
    expect((await get('/index.html', 'POST')).status).toBe(405);
  });

  it('moves to the next port when the first is taken', async () => {
    const taken = Number(new URL(base).port);
    const other = createUiServer({ rendererDir: dir, samplesDir: dir });
    const url = await listenLocal(other, taken, 3);
    expect(Number(new URL(url).port)).toBeGreaterThan(taken);
    await new Promise<void>((r) => other.close(() => r()));
  });
});
