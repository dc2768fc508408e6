/**
 * Preload script (sandboxed, context-isolated): publishes `window.dipweave` with named functions only.
 * ipcRenderer itself never reaches the page. Bundled by scripts/build-node.mjs into one CommonJS file whose
 * only require is 'electron', as a sandboxed preload must be (stack.md §3).
 */
import { contextBridge, ipcRenderer, type IpcRendererEvent } from 'electron';
import { IPC, type DipweaveDesktopApi, type InvokeChannel, type MenuCommand } from '../shared/ipc';

/** Electron prefixes rejected invocations with "Error invoking remote method '…': Error: "; keep the problem text. */
export function cleanRemoteMessage(message: string): string {
  return message.replace(/^Error invoking remote method '[^']*': (?:[A-Za-z]*Error: )?/, '');
}

function call<T>(channel: InvokeChannel, ...args: unknown[]): Promise<T> {
  return ipcRenderer.invoke(channel, ...args).catch((err: unknown) => {
    throw new Error(cleanRemoteMessage(err instanceof Error ? err.message : String(err)));
  }) as Promise<T>;
}

export const desktopApi: DipweaveDesktopApi = {
  openFileDialog: () => call(IPC.openFileDialog),
  listSamples: () => call(IPC.listSamples),
  openSample: (name) => call(IPC.openSample, name),
  readRange: (fileId, offsetBytes, lengthBytes) => call(IPC.readRange, fileId, offsetBytes, lengthBytes),
  closeFile: (fileId) => call(IPC.closeFile, fileId),
  recentFiles: () => call(IPC.recentFiles),
  openRecent: (path) => call(IPC.openRecent, path),
  saveDialog: (defaultName, kind) => call(IPC.saveDialog, defaultName, kind),
  writeChunk: (saveId, bytes) => call(IPC.writeChunk, saveId, bytes),
  finishSave: (saveId) => call(IPC.finishSave, saveId),
  abortSave: (saveId) => call(IPC.abortSave, saveId),
  onMenuCommand(listener) {
    if (typeof listener !== 'function') throw new TypeError('onMenuCommand needs a function');
    const relay = (_event: IpcRendererEvent, command: MenuCommand) => listener(command);
    ipcRenderer.on(IPC.menuCommand, relay);
    return () => {
      ipcRenderer.removeListener(IPC.menuCommand, relay);
    };
  },
};

contextBridge.exposeInMainWorld('dipweave', desktopApi);
