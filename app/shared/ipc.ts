/**
 * The desktop API the preload script publishes as `window.dipweave`, and the IPC channel names behind it.
 * No electron import here: the renderer imports these types, and in a plain browser `window.dipweave` is
 * absent (the renderer then reads files through File/Blob and saves through downloads).
 *
 * Only plain data crosses the process boundary. A failed call rejects with an Error whose message is the
 * main process's one-line problem text ending in "[code]" (core/problems.ts formatProblem); read the code
 * with ipcProblemCode().
 */

/** Kinds of file the save dialog offers; each has its own extension filter. */
export type SaveKind = 'segy' | 'png' | 'recipe' | 'npy';
export const SAVE_KINDS: readonly SaveKind[] = ['segy', 'png', 'recipe', 'npy'];

/** A file the main process opened for reading; `fileId` is the only handle the renderer gets. */
export interface OpenedFile {
  fileId: string;
  /** Base name for display (no directory). */
  name: string;
  sizeBytes: number;
  /** True for a bundled demo file (samples/). */
  demo: boolean;
}

export interface RecentFile {
  /** Full path, shown in the menu and passed back to openRecent(); only paths from the recent list are accepted. */
  path: string;
  name: string;
}

export interface SavedFile {
  name: string;
  sizeBytes: number;
}

/** Commands from the application menu, sent to the renderer. */
export type MenuCommand =
  | { type: 'open' }
  | { type: 'open-demo' }
  | { type: 'opened'; file: OpenedFile }
  | { type: 'export-gather' }
  | { type: 'export-all-gathers' }
  | { type: 'export-slopes' }
  | { type: 'export-image' }
  | { type: 'save-recipe' }
  | { type: 'about' };

export interface DipweaveDesktopApi {
  /** Shows the open dialog (SEG-Y filter). Null when the user cancels. */
  openFileDialog(): Promise<OpenedFile | null>;
  /** Names of the bundled demo files (samples/*.sgy), e.g. "grv07-gap.sgy". */
  listSamples(): Promise<string[]>;
  openSample(name: string): Promise<OpenedFile>;
  /** Reads up to lengthBytes from offsetBytes; shorter only at the end of the file. Length at most MAX_READ_BYTES. */
  readRange(fileId: string, offsetBytes: number, lengthBytes: number): Promise<Uint8Array>;
  closeFile(fileId: string): Promise<void>;
  recentFiles(): Promise<RecentFile[]>;
  openRecent(path: string): Promise<OpenedFile | null>;
  /** Shows the save dialog. Null when the user cancels. Refuses the path of any opened input file. */
  saveDialog(defaultName: string, kind: SaveKind): Promise<{ saveId: string } | null>;
  /** Appends bytes (at most MAX_CHUNK_BYTES) to the temporary file of the save. */
  writeChunk(saveId: string, bytes: Uint8Array): Promise<void>;
  /** Renames the temporary file onto the chosen path. */
  finishSave(saveId: string): Promise<SavedFile>;
  /** Deletes the temporary file; the chosen path is left untouched. */
  abortSave(saveId: string): Promise<void>;
  /** Subscribes to menu commands; returns the unsubscribe function. */
  onMenuCommand(listener: (command: MenuCommand) => void): () => void;
}

/** Largest single readRange and writeChunk, bytes. */
export const MAX_READ_BYTES = 64 * 1024 * 1024;
export const MAX_CHUNK_BYTES = 64 * 1024 * 1024;

/** Channel names; every channel starts with "dipweave:" and the main process accepts no other. */
export const IPC = {
  openFileDialog: 'dipweave:open-file-dialog',
  listSamples: 'dipweave:list-samples',
  openSample: 'dipweave:open-sample',
  readRange: 'dipweave:read-range',
  closeFile: 'dipweave:close-file',
  recentFiles: 'dipweave:recent-files',
  openRecent: 'dipweave:open-recent',
  saveDialog: 'dipweave:save-dialog',
  writeChunk: 'dipweave:write-chunk',
  finishSave: 'dipweave:finish-save',
  abortSave: 'dipweave:abort-save',
  menuCommand: 'dipweave:menu-command',
} as const;

export type InvokeChannel = Exclude<(typeof IPC)[keyof typeof IPC], typeof IPC.menuCommand>;

/** The problem code at the end of a rejected call's message ("... [input.bad-argument]"), or null. */
export function ipcProblemCode(error: unknown): string | null {
  const message = error instanceof Error ? error.message : typeof error === 'string' ? error : '';
  const m = /\[([a-z]+\.[a-z-]+)\]\s*$/.exec(message);
  return m ? m[1] : null;
}

declare global {
  interface Window {
    /** Present only in the desktop app (set by the preload script). */
    dipweave?: DipweaveDesktopApi;
  }
}
