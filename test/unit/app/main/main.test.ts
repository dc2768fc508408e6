// Electron main process with electron mocked (stack.md §3): no test loads the real electron module.
// Checks the window's security settings, the app:// protocol (headers, traversal), navigation guards,
// and that IPC handlers refuse untrusted senders and hostile arguments.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { mkdtemp, mkdir, rm, symlink, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const h = vi.hoisted(() => ({
  root: '',
  handlers: new Map<string, (...a: unknown[]) => unknown>(),
  windows: [] as { opts: Record<string, unknown>; webContents: Record<string, unknown>; url?: string; listeners: Map<string, (...a: unknown[]) => void> }[],
  schemes: [] as unknown[],
  protocolHandlers: new Map<string, (r: Request) => Promise<Response>>(),
  menuTemplates: [] as unknown[],
  appEvents: new Map<string, (...a: unknown[]) => void>(),
  permissionHandler: null as null | ((...a: unknown[]) => void),
  beforeRequest: null as null | { filter: { urls: string[] }; fn: (d: unknown, cb: (r: { cancel: boolean }) => void) => void },
  sandboxEnabled: false,
}));

vi.mock('electron', () => {
  class BrowserWindow {
    static all: BrowserWindow[] = [];
    webContents: Record<string, unknown>;
    listeners = new Map<string, (...a: unknown[]) => void>();
    url?: string;
    constructor(public opts: Record<string, unknown>) {
      const wcListeners = new Map<string, (...a: unknown[]) => void>();
      this.webContents = {
        listeners: wcListeners,
        on: vi.fn((ev: string, fn: (...a: unknown[]) => void) => wcListeners.set(ev, fn)),
        setWindowOpenHandler: vi.fn((fn: unknown) => wcListeners.set('window-open', fn as (...a: unknown[]) => void)),
        send: vi.fn(),
      };
      BrowserWindow.all.push(this);
      h.windows.push(this as never);
    }
    static fromWebContents(wc: unknown) {
      return BrowserWindow.all.find((w) => w.webContents === wc) ?? null;
    }
    static getAllWindows() {
      return BrowserWindow.all;
    }
    loadURL = vi.fn(async (u: string) => {
      this.url = u;
    });
    once = vi.fn();
    on = vi.fn();
    show = vi.fn();
  }
  return {
    app: {
      getAppPath: () => h.root,
      getPath: (name: string) => join(h.root, 'user', name),
      whenReady: vi.fn(async () => undefined),
      on: vi.fn((ev: string, fn: (...a: unknown[]) => void) => h.appEvents.set(ev, fn)),
      quit: vi.fn(),
      enableSandbox: vi.fn(() => {
        h.sandboxEnabled = true;
      }),
    },
    BrowserWindow,
    ipcMain: { handle: vi.fn((c: string, fn: (...a: unknown[]) => unknown) => h.handlers.set(c, fn)) },
    protocol: {
      registerSchemesAsPrivileged: vi.fn((s: unknown[]) => h.schemes.push(...s)),
      handle: vi.fn((scheme: string, fn: (r: Request) => Promise<Response>) => h.protocolHandlers.set(scheme, fn)),
    },
    Menu: { buildFromTemplate: vi.fn((t: unknown) => (h.menuTemplates.push(t), t)), setApplicationMenu: vi.fn() },
    dialog: { showOpenDialog: vi.fn(async () => ({ canceled: true, filePaths: [] })), showSaveDialog: vi.fn(async () => ({ canceled: true })), showErrorBox: vi.fn() },
    session: {
      defaultSession: {
        setPermissionRequestHandler: vi.fn((fn: (...a: unknown[]) => void) => {
          h.permissionHandler = fn;
        }),
        webRequest: {
          onBeforeRequest: vi.fn((filter: { urls: string[] }, fn: (d: unknown, cb: (r: { cancel: boolean }) => void) => void) => {
            h.beforeRequest = { filter, fn };
          }),
        },
      },
    },
  };
});

import * as main from '../../../../app/main/main';
import { IPC } from '../../../../app/shared/ipc';

beforeAll(async () => {
  h.root = await mkdtemp(join(tmpdir(), 'dipweave-main-'));
  await mkdir(join(h.root, 'dist', 'renderer', 'assets'), { recursive: true });
  await mkdir(join(h.root, 'samples'));
  await writeFile(join(h.root, 'dist', 'renderer', 'index.html'), '<!doctype html><title>Dipweave</title>');
  await writeFile(join(h.root, 'dist', 'renderer', 'assets', 'app.js'), 'export {}');
  await writeFile(join(h.root, 'package.json'), '{"secret":true}');
  await writeFile(join(h.root, 'samples', 'grv07-demo.sgy'), new Uint8Array(4000));
  await symlink(join(h.root, 'package.json'), join(h.root, 'dist', 'renderer', 'escape.json'));
});

afterAll(async () => {
  await rm(h.root, { recursive: true, force: true });
});

describe('importing the module', () => {
  it('starts nothing outside Electron', () => {
    expect(h.handlers.size).toBe(0);
    expect(h.windows.length).toBe(0);
    expect(typeof main.start).toBe('function');
  });
});

describe('start()', () => {
  beforeAll(async () => {
    await main.start();
  });

  it('registers app:// as a privileged, secure, standard scheme and enables the sandbox everywhere', () => {
    expect(h.schemes).toEqual([{ scheme: 'app', privileges: { standard: true, secure: true, supportFetchAPI: true, stream: true } }]);
    expect(h.protocolHandlers.has('app')).toBe(true);
    expect(h.sandboxEnabled).toBe(true);
  });

  it('creates one window with a sandboxed, isolated renderer without Node, loading the bundle', () => {
    expect(h.windows.length).toBe(1);
    const prefs = h.windows[0].opts.webPreferences as Record<string, unknown>;
    expect(prefs).toMatchObject({ contextIsolation: true, sandbox: true, nodeIntegration: false, webSecurity: true, webviewTag: false });
    expect(String(prefs.preload)).toMatch(/preload\.cjs$/);
    expect(h.windows[0].url).toBe('app://bundle/index.html');
  });

  it('registers a handler for every invoke channel and installs a menu of our own', () => {
    const expected = Object.values(IPC).filter((c) => c !== IPC.menuCommand).sort();
    expect([...h.handlers.keys()].sort()).toEqual(expected);
    const labels = JSON.stringify(h.menuTemplates.at(-1));
    for (const l of ['Open Gather File…', 'Open Recent', 'Export Filled Gather as SEG-Y…']) expect(labels).toContain(l);
  });

  it('refuses new windows, navigation off the bundle, web views, permissions and remote requests', () => {
    const wc = h.windows[0].webContents as { listeners: Map<string, (...a: unknown[]) => unknown> };
    expect(wc.listeners.get('window-open')!({ url: 'https://example.org/' })).toEqual({ action: 'deny' });
    for (const [url, blocked] of [['https://example.org/', true], ['file:///etc/passwd', true], ['app://other/index.html', true], ['app://bundle/index.html', false]] as const) {
      const ev = { preventDefault: vi.fn() };
      wc.listeners.get('will-navigate')!(ev, url);
      expect(ev.preventDefault.mock.calls.length > 0, url).toBe(blocked);
    }
    const wv = { preventDefault: vi.fn() };
    wc.listeners.get('will-attach-webview')!(wv);
    expect(wv.preventDefault).toHaveBeenCalled();
    const cb = vi.fn();
    h.permissionHandler!(null, 'media', cb);
    expect(cb).toHaveBeenCalledWith(false);
    expect(h.beforeRequest!.filter.urls).toEqual(expect.arrayContaining(['http://*/*', 'https://*/*', 'ws://*/*', 'wss://*/*']));
    const rcb = vi.fn();
    h.beforeRequest!.fn({ url: 'https://example.org/x.js' }, rcb);
    expect(rcb).toHaveBeenCalledWith({ cancel: true });
  });
});

describe('IPC sender and argument checks', () => {
  const trusted = () => ({ sender: h.windows[0].webContents, senderFrame: { url: 'app://bundle/index.html', parent: null } });
  const call = async (channel: string, event: unknown, ...args: unknown[]) => {
    try {
      return { ok: true, value: await h.handlers.get(channel)!(event, ...args) };
    } catch (e) {
      return { ok: false, message: (e as Error).message };
    }
  };

  it.each([
    ['a sub-frame', { senderFrame: { url: 'app://bundle/index.html', parent: {} } }],
    ['a remote page', { senderFrame: { url: 'https://example.org/', parent: null } }],
    ['a file: page', { senderFrame: { url: 'file:///tmp/x.html', parent: null } }],
    ['another app host', { senderFrame: { url: 'app://evil/index.html', parent: null } }],
    ['no frame', { senderFrame: null }],
    ['a foreign web contents', { senderFrame: { url: 'app://bundle/index.html', parent: null }, sender: {} }],
  ])('refuses calls from %s', async (_label, event) => {
    const r = await call(IPC.listSamples, { sender: h.windows[0].webContents, ...event });
    expect(r.ok).toBe(false);
    expect(r.message).toMatch(/\[ipc\.untrusted-sender\]$/);
  });

  it('serves a trusted sender and checks its arguments', async () => {
    expect(await call(IPC.listSamples, trusted())).toEqual({ ok: true, value: ['grv07-demo.sgy'] });
    const opened = await call(IPC.openSample, trusted(), 'grv07-demo.sgy');
    expect(opened).toMatchObject({ ok: true, value: { name: 'grv07-demo.sgy', sizeBytes: 4000, demo: true } });
    const id = (opened.value as { fileId: string }).fileId;
    expect(await call(IPC.readRange, trusted(), id, 3990, 100)).toMatchObject({ ok: true });
    for (const args of [[id, -1, 4], [id, 0, 1e12], ['f77', 0, 4], [id, '0', 4], [{ toString: () => id }, 0, 4]]) {
      const r = await call(IPC.readRange, trusted(), ...args);
      expect(r.ok, JSON.stringify(args)).toBe(false);
      expect(r.message).toMatch(/\[input\.bad-argument\]$/);
    }
    expect((await call(IPC.openSample, trusted(), '../package.json')).message).toMatch(/\[input\.bad-argument\]$/);
    expect((await call(IPC.openRecent, trusted(), join(h.root, 'package.json'))).message).toMatch(/\[input\.bad-argument\]$/);
    expect((await call(IPC.saveDialog, trusted(), '../../x', 'segy')).message).toMatch(/\[input\.bad-argument\]$/);
    expect(await call(IPC.saveDialog, trusted(), 'x.sgy', 'segy')).toEqual({ ok: true, value: null });
  });
});

describe('app:// protocol', () => {
  const get = (url: string, method = 'GET') => main.handleAppRequest(new Request(url, { method }));

  it('serves the bundle with cross-origin isolation and a strict CSP', async () => {
    const r = await get('app://bundle/index.html');
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/^text\/html/);
    expect(r.headers.get('cross-origin-opener-policy')).toBe('same-origin');
    expect(r.headers.get('cross-origin-embedder-policy')).toBe('require-corp');
    const csp = r.headers.get('content-security-policy')!;
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toContain('unsafe-eval');
    expect(await r.text()).toContain('<title>Dipweave</title>');
    expect((await get('app://bundle/assets/app.js')).headers.get('content-type')).toMatch(/^text\/javascript/);
    expect((await get('app://bundle/')).status).toBe(200);
  });

  it.each([
    'app://bundle/..%2fpackage.json',
    'app://bundle/assets/..%2f..%2f..%2fpackage.json',
    'app://bundle/%2e%2e%5cpackage.json',
    'app://bundle/..%5c..%5cpackage.json',
    'app://bundle/a%00.html',
    'app://bundle/escape.json',
    'app://other/index.html',
  ])('refuses %s with 403', async (url) => {
    expect((await get(url)).status).toBe(403);
  });

  it('gives 404 for a missing file and 405 for other methods', async () => {
    expect((await get('app://bundle/nope.js')).status).toBe(404);
    expect((await get('app://bundle/index.html', 'POST')).status).toBe(405);
  });
});
