// The bundled main process (what Electron loads: dist-electron/main.cjs, built as scripts/build-node.mjs does)
// runs against a stubbed electron module: it registers the app:// scheme before 'ready', then opens a
// sandboxed window on app://bundle/index.html. Only node:* built-ins and 'electron' may be required.
import { describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';

describe('bundled main process', () => {
  it('starts inside Electron (stubbed) and requires nothing outside node built-ins and electron', async () => {
    const { build } = await import('esbuild');
    const r = await build({
      entryPoints: [new URL('../../../../app/main/main.ts', import.meta.url).pathname],
      bundle: true, platform: 'node', format: 'cjs', target: 'node20', external: ['electron'], write: false, logLevel: 'silent',
    });
    const code = r.outputFiles[0].text;
    const requires = new Set([...code.matchAll(/require\(["']([^"']+)["']\)/g)].map((m) => m[1]));
    for (const name of requires) expect(name === 'electron' || name.startsWith('node:') || ['fs', 'path', 'fs/promises'].includes(name), name).toBe(true);

    const calls: string[] = [];
    const windows: { opts: { webPreferences: Record<string, unknown> }; url?: string }[] = [];
    let ready: () => void = () => undefined;
    const readyPromise = new Promise<void>((res) => (ready = res));
    const noop = () => undefined;
    class BrowserWindow {
      static getAllWindows = () => windows;
      static fromWebContents = () => null;
      webContents = { on: noop, setWindowOpenHandler: noop, send: noop };
      url?: string;
      constructor(public opts: { webPreferences: Record<string, unknown> }) {
        windows.push(this);
        calls.push('BrowserWindow');
      }
      loadURL(u: string) { this.url = u; return Promise.resolve(); }
      once = noop;
      on = noop;
    }
    const electron = {
      app: {
        getAppPath: () => '/nonexistent/app', getPath: () => '/nonexistent/user', on: noop, quit: noop,
        enableSandbox: () => calls.push('enableSandbox'),
        whenReady: () => { calls.push('whenReady'); return readyPromise; },
      },
      BrowserWindow,
      ipcMain: { handle: () => calls.push('ipc') },
      protocol: { registerSchemesAsPrivileged: () => calls.push('registerSchemes'), handle: () => calls.push('protocol.handle') },
      Menu: { buildFromTemplate: (t: unknown) => t, setApplicationMenu: () => calls.push('menu') },
      dialog: {},
      session: { defaultSession: { setPermissionRequestHandler: noop, webRequest: { onBeforeRequest: noop } } },
    };
    const nodeRequire = createRequire(import.meta.url);
    const fakeRequire = (name: string) => (name === 'electron' ? electron : nodeRequire(name));
    const fakeProcess = new Proxy(process, {
      get: (target, key) => (key === 'versions' ? { ...target.versions, electron: '45.5.0' } : Reflect.get(target, key)),
    });
    const mod = { exports: {} };
    new Function('require', 'module', 'exports', '__dirname', '__filename', 'process', code)(fakeRequire, mod, mod.exports, '/nonexistent/app/dist-electron', '/nonexistent/app/dist-electron/main.cjs', fakeProcess);
    // Before 'ready': the scheme is registered, nothing else happened yet.
    expect(calls.slice(0, 3)).toEqual(['registerSchemes', 'enableSandbox', 'whenReady']);
    ready();
    await new Promise((res) => setTimeout(res, 50));
    expect(calls).toContain('protocol.handle');
    expect(calls.filter((c) => c === 'ipc').length).toBe(11);
    expect(windows.length).toBe(1);
    expect(windows[0].url).toBe('app://bundle/index.html');
    expect(windows[0].opts.webPreferences).toMatchObject({ sandbox: true, contextIsolation: true, nodeIntegration: false, preload: '/nonexistent/app/dist-electron/preload.cjs' });
  });
});
