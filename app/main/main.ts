/**
 * Electron main process: one window over the bundled renderer, served from app://bundle with
 * cross-origin isolation; validated IPC handlers over HostFiles; the application menu.
 * Security: sandboxed, context-isolated renderer without Node; no remote content (http(s)/ws requests
 * cancelled, navigation and new windows refused, permissions denied); every IPC call checks its sender
 * (a top-level frame of our own window on app://bundle) and its arguments.
 * Written as exported functions so tests import it with electron mocked; start() runs only inside Electron.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session, type IpcMainInvokeEvent, type WebContents } from 'electron';
import { join } from 'node:path';
import { InputFileError } from '../../core/problems';
import { IPC, type MenuCommand, type SaveKind } from '../shared/ipc';
import { APP_HOST, APP_ORIGIN, APP_SCHEME, APP_START_URL, serveAppRequest } from './app-protocol';
import { HostFiles } from './host-files';
import { buildMenuTemplate } from './menu';

/** Set after any caller options, so nothing can turn them off (as VS Code does). */
export const SECURE_WEB_PREFERENCES = {
  contextIsolation: true,
  sandbox: true,
  nodeIntegration: false,
  nodeIntegrationInWorker: false,
  nodeIntegrationInSubFrames: false,
  webSecurity: true,
  allowRunningInsecureContent: false,
  experimentalFeatures: false,
  webviewTag: false,
  spellcheck: false,
} as const;

const SAVE_FILTERS: Record<SaveKind, { name: string; extensions: string[] }> = {
  segy: { name: 'SEG-Y', extensions: ['sgy', 'segy'] },
  png: { name: 'PNG image', extensions: ['png'] },
  recipe: { name: 'Dipweave recipe', extensions: ['json'] },
  npy: { name: 'NumPy array', extensions: ['npy'] },
};

let host: HostFiles | null = null;
let mainWindow: BrowserWindow | null = null;

/** Folder holding package.json, dist/, dist-electron/ and samples/. */
export function appRoot(): string {
  return app.getAppPath();
}

export function handleAppRequest(request: Request): Promise<Response> {
  return serveAppRequest(request, join(appRoot(), 'dist', 'renderer'));
}

/** True only for a top-level frame of one of our windows showing app://bundle. */
export function isTrustedSender(event: Pick<IpcMainInvokeEvent, 'senderFrame' | 'sender'>): boolean {
  const frame = event.senderFrame;
  if (!frame || frame.parent !== null) return false;
  let url: URL;
  try {
    url = new URL(frame.url);
  } catch {
    return false;
  }
  if (url.protocol !== `${APP_SCHEME}:` || url.host !== APP_HOST) return false;
  return BrowserWindow.fromWebContents(event.sender) !== null;
}

function refused(channel: string): InputFileError {
  return new InputFileError({
    code: 'ipc.untrusted-sender',
    severity: 'error',
    message: `The call ${channel} came from a frame that is not Dipweave's own page and was refused.`,
  });
}

/** Registers one handler per channel; each checks the sender before looking at any argument. */
export function registerIpc(files: HostFiles, onRecentChanged: () => void = () => undefined): void {
  const handle = (channel: string, fn: (...args: unknown[]) => Promise<unknown>) => {
    ipcMain.handle(channel, async (event: IpcMainInvokeEvent, ...args: unknown[]) => {
      if (!isTrustedSender(event)) {
        console.warn(`dipweave: refused ${channel} from ${event.senderFrame?.url ?? 'an unknown frame'}`);
        throw refused(channel);
      }
      return fn(...args);
    });
  };
  handle(IPC.openFileDialog, async () => {
    const f = await files.openFileDialog();
    onRecentChanged();
    return f;
  });
  handle(IPC.listSamples, () => files.listSamples());
  handle(IPC.openSample, (name) => files.openSample(name));
  handle(IPC.readRange, (id, offset, length) => files.readRange(id, offset, length));
  handle(IPC.closeFile, (id) => files.closeFile(id));
  handle(IPC.recentFiles, () => files.recentFiles());
  handle(IPC.openRecent, async (path) => {
    const f = await files.openRecent(path);
    onRecentChanged();
    return f;
  });
  handle(IPC.saveDialog, (name, kind) => files.saveDialog(name, kind));
  handle(IPC.writeChunk, (id, bytes) => files.writeChunk(id, bytes));
  handle(IPC.finishSave, (id) => files.finishSave(id));
  handle(IPC.abortSave, (id) => files.abortSave(id));
}

/** Refuses navigation away from the bundle, new windows and embedded web views. */
export function hardenWebContents(contents: WebContents): void {
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
  const guard = (e: { preventDefault(): void }, url: string) => {
    if (!url.startsWith(`${APP_ORIGIN}/`)) e.preventDefault();
  };
  contents.on('will-navigate', guard);
  contents.on('will-redirect', guard);
  contents.on('will-attach-webview', (e) => e.preventDefault());
}

export function sendMenuCommand(command: MenuCommand): void {
  mainWindow?.webContents.send(IPC.menuCommand, command);
}

export async function rebuildMenu(): Promise<void> {
  const recent = host ? await host.recentFiles() : [];
  const template = buildMenuTemplate(
    recent,
    {
      send: sendMenuCommand,
      openRecent: (path) => {
        void host
          ?.openRecent(path)
          .then((file) => {
            if (file) sendMenuCommand({ type: 'opened', file });
            return rebuildMenu();
          })
          .catch((err: unknown) => dialog.showErrorBox('Dipweave could not open the file', err instanceof Error ? err.message : String(err)));
      },
      quit: () => app.quit(),
    },
    process.platform === 'darwin',
  );
  Menu.setApplicationMenu(Menu.buildFromTemplate(template));
}

export function createWindow(): BrowserWindow {
  const win = new BrowserWindow({
    width: 1440,
    height: 900,
    minWidth: 900,
    minHeight: 600,
    show: false,
    title: 'Dipweave',
    backgroundColor: '#1d2126',
    webPreferences: { preload: join(__dirname, 'preload.cjs'), ...SECURE_WEB_PREFERENCES },
  });
  hardenWebContents(win.webContents);
  win.once('ready-to-show', () => win.show());
  win.on('closed', () => {
    if (mainWindow === win) mainWindow = null;
  });
  void win.loadURL(APP_START_URL);
  mainWindow = win;
  return win;
}

function makeHost(): HostFiles {
  return new HostFiles({
    // In a package the demo files sit beside the archive (electron.config.ts asarUnpack).
    samplesDir: join(appRoot().replace(/\.asar$/, '.asar.unpacked'), 'samples'),
    recentStorePath: join(app.getPath('userData'), 'recent-files.json'),
    chooseOpenPath: async () => {
      const options = {
        title: 'Open a gather file',
        properties: ['openFile' as const],
        filters: [{ name: 'SEG-Y', extensions: ['sgy', 'segy', 'SGY', 'SEGY'] }, { name: 'All files', extensions: ['*'] }],
      };
      const r = mainWindow ? await dialog.showOpenDialog(mainWindow, options) : await dialog.showOpenDialog(options);
      return r.canceled || r.filePaths.length === 0 ? null : r.filePaths[0];
    },
    chooseSavePath: async (defaultName, kind) => {
      const options = { title: 'Save as', defaultPath: join(app.getPath('documents'), defaultName), filters: [SAVE_FILTERS[kind]] };
      const r = mainWindow ? await dialog.showSaveDialog(mainWindow, options) : await dialog.showSaveDialog(options);
      return r.canceled || !r.filePath ? null : r.filePath;
    },
  });
}

/** Everything that must happen before 'ready' runs synchronously here; the rest after whenReady(). */
export async function start(): Promise<void> {
  protocol.registerSchemesAsPrivileged([
    { scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true, stream: true } },
  ]);
  app.enableSandbox();
  app.on('web-contents-created', (_e, contents) => hardenWebContents(contents));
  await app.whenReady();
  protocol.handle(APP_SCHEME, handleAppRequest);
  session.defaultSession.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));
  session.defaultSession.webRequest.onBeforeRequest(
    { urls: ['http://*/*', 'https://*/*', 'ws://*/*', 'wss://*/*', 'ftp://*/*'] },
    (_details, callback) => callback({ cancel: true }),
  );
  host = makeHost();
  registerIpc(host, () => void rebuildMenu());
  await rebuildMenu();
  createWindow();
  app.on('activate', () => {
    if (BrowserWindow.getAllWindows().length === 0) createWindow();
  });
  app.on('window-all-closed', () => {
    if (process.platform !== 'darwin') app.quit();
  });
  app.on('will-quit', () => void host?.dispose());
}

// Runs only inside Electron; importing this module elsewhere (tests with electron mocked) starts nothing.
if (process.versions.electron !== undefined) void start();
