// Preload with electron mocked: only named functions reach the page, each on its own channel;
// ipcRenderer itself is never exposed; rejected calls keep the main process's "[code]".
import { describe, expect, it, vi } from 'vitest';

const h = vi.hoisted(() => ({
  exposed: [] as [string, Record<string, unknown>][],
  invoke: vi.fn(async (..._a: unknown[]): Promise<unknown> => null),
  listeners: new Map<string, ((...a: unknown[]) => void)[]>(),
}));

vi.mock('electron', () => ({
  contextBridge: { exposeInMainWorld: vi.fn((k: string, v: Record<string, unknown>) => h.exposed.push([k, v])) },
  ipcRenderer: {
    invoke: h.invoke,
    on: vi.fn((c: string, fn: (...a: unknown[]) => void) => h.listeners.set(c, [...(h.listeners.get(c) ?? []), fn])),
    removeListener: vi.fn((c: string, fn: (...a: unknown[]) => void) => h.listeners.set(c, (h.listeners.get(c) ?? []).filter((f) => f !== fn))),
  },
}));

import '../../../../app/preload/preload';
import { cleanRemoteMessage } from '../../../../app/preload/preload';
import { IPC, ipcProblemCode, type DipweaveDesktopApi, type MenuCommand } from '../../../../app/shared/ipc';

const names = ['openFileDialog', 'listSamples', 'openSample', 'readRange', 'closeFile', 'recentFiles', 'openRecent', 'saveDialog', 'writeChunk', 'finishSave', 'abortSave', 'onMenuCommand'];

describe('preload', () => {
  it('exposes exactly one object, window.dipweave, of named functions', () => {
    expect(h.exposed.length).toBe(1);
    const [key, api] = h.exposed[0];
    expect(key).toBe('dipweave');
    expect(Object.keys(api).sort()).toEqual([...names].sort());
    for (const n of names) expect(typeof api[n]).toBe('function');
    for (const forbidden of ['invoke', 'send', 'on', 'ipcRenderer', 'require']) expect(api[forbidden]).toBeUndefined();
  });

  it('routes each call to its own channel with its arguments', async () => {
    const api = h.exposed[0][1] as unknown as DipweaveDesktopApi;
    const bytes = Uint8Array.of(1, 2);
    await api.readRange('f1', 3600, 240);
    await api.saveDialog('line.sgy', 'segy');
    await api.writeChunk('s1', bytes);
    await api.openSample('grv07-gap.sgy');
    expect(h.invoke.mock.calls).toEqual([
      [IPC.readRange, 'f1', 3600, 240],
      [IPC.saveDialog, 'line.sgy', 'segy'],
      [IPC.writeChunk, 's1', bytes],
      [IPC.openSample, 'grv07-gap.sgy'],
    ]);
  });

  it('rejects with the problem text and code, without Electron\'s prefix', async () => {
    const api = h.exposed[0][1] as unknown as DipweaveDesktopApi;
    h.invoke.mockRejectedValueOnce(new Error("Error invoking remote method 'dipweave:read-range': InputFileError: offsetBytes: refused. [input.bad-argument]"));
    const err = await api.readRange('f1', -1, 1).catch((e: unknown) => e);
    expect((err as Error).message).toBe('offsetBytes: refused. [input.bad-argument]');
    expect(ipcProblemCode(err)).toBe('input.bad-argument');
    expect(cleanRemoteMessage('plain')).toBe('plain');
    expect(ipcProblemCode(new Error('no code here'))).toBeNull();
  });

  it('relays menu commands and unsubscribes', () => {
    const api = h.exposed[0][1] as unknown as DipweaveDesktopApi;
    const got: MenuCommand[] = [];
    const off = api.onMenuCommand((c) => got.push(c));
    for (const fn of h.listeners.get(IPC.menuCommand) ?? []) fn({ senderId: 0 }, { type: 'open-demo' });
    off();
    for (const fn of h.listeners.get(IPC.menuCommand) ?? []) fn({ senderId: 0 }, { type: 'open' });
    expect(got).toEqual([{ type: 'open-demo' }]);
    expect(() => api.onMenuCommand('x' as never)).toThrow(TypeError);
  });
});

describe('preload bundle', () => {
  it('bundles to one CommonJS file whose only require is electron (a sandboxed preload cannot require more)', async () => {
    // Same options as scripts/build-node.mjs (stack.md §3: sandboxed preloads must be a single file).
    const { build } = await import('esbuild');
    const r = await build({
      entryPoints: [new URL('../../../../app/preload/preload.ts', import.meta.url).pathname],
      bundle: true, platform: 'node', format: 'cjs', target: 'node20', external: ['electron'], write: false, logLevel: 'silent',
    });
    expect(r.outputFiles.length).toBe(1);
    const requires = [...r.outputFiles[0].text.matchAll(/require\(["']([^"']+)["']\)/g)].map((m) => m[1]);
    expect(new Set(requires)).toEqual(new Set(['electron']));
  });
});
