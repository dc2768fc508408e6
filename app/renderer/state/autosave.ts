/**
 * Autosave of the user's work on a file: dip edits and marked-bad traces per gather, plus settings.
 * Written to localStorage (synchronous: once setItem returns, a kill of the app cannot lose it) at most
 * `delayMs` after each change, so a crash loses at most that much. Restored when the same file (name and
 * size) is opened again. Plain TypeScript with an injected store, testable in node.
 */
export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

export interface GatherWork {
  /** Dip edits (core/slope/edits.ts, JSON form), oldest first. */
  edits: unknown[];
  /** Recorded traces marked bad (grid positions). */
  bad: number[];
}

export interface SavedWork {
  version: 1;
  fileName: string;
  sizeBytes: number;
  gatherKey: string;
  savedAtIso: string;
  /** By gather key value (stable across regrouping of the same key; index would not be). */
  gathers: Record<string, GatherWork>;
  settings: Record<string, unknown>;
}

const PREFIX = 'dipweave.autosave.v1:';
const LAST = 'dipweave.autosave.last';

export function workKey(fileName: string, sizeBytes: number): string {
  return `${PREFIX}${fileName}:${sizeBytes}`;
}

/** Reads saved work; null when absent or unreadable (a damaged entry is dropped, never thrown at the user). */
export function loadWork(store: KeyValueStore, fileName: string, sizeBytes: number): SavedWork | null {
  const raw = store.getItem(workKey(fileName, sizeBytes));
  if (!raw) return null;
  try {
    const v = JSON.parse(raw) as SavedWork;
    if (v?.version !== 1 || v.fileName !== fileName || v.sizeBytes !== sizeBytes || typeof v.gathers !== 'object' || v.gathers === null) return null;
    for (const g of Object.values(v.gathers)) {
      if (!Array.isArray(g?.edits) || !Array.isArray(g?.bad)) return null;
    }
    return v;
  } catch {
    return null;
  }
}

/** The last file worked on, for "restore on the next start". */
export function lastWork(store: KeyValueStore): { fileName: string; sizeBytes: number } | null {
  try {
    const v = JSON.parse(store.getItem(LAST) ?? 'null');
    return v && typeof v.fileName === 'string' && Number.isFinite(v.sizeBytes) ? v : null;
  } catch {
    return null;
  }
}

export class Autosaver {
  #store: KeyValueStore;
  #delayMs: number;
  #timer: ReturnType<typeof setTimeout> | null = null;
  #pending: (() => SavedWork) | null = null;
  lastSavedIso: string | null = null;
  lastError: string | null = null;

  constructor(store: KeyValueStore, delayMs = 800) {
    this.#store = store;
    this.#delayMs = delayMs;
  }

  /** Schedules a save; `snapshot` is called when the save happens, so it sees the latest state. */
  schedule(snapshot: () => SavedWork): void {
    this.#pending = snapshot;
    if (this.#timer === null) this.#timer = setTimeout(() => this.flush(), this.#delayMs);
  }

  /** Writes now (also called on page hide). */
  flush(): void {
    if (this.#timer !== null) clearTimeout(this.#timer);
    this.#timer = null;
    const snap = this.#pending;
    this.#pending = null;
    if (!snap) return;
    const work = snap();
    try {
      this.#store.setItem(workKey(work.fileName, work.sizeBytes), JSON.stringify(work));
      this.#store.setItem(LAST, JSON.stringify({ fileName: work.fileName, sizeBytes: work.sizeBytes }));
      this.lastSavedIso = work.savedAtIso;
      this.lastError = null;
    } catch (e) {
      // Storage full or disabled: say so on screen rather than failing silently.
      this.lastError = e instanceof Error ? e.message : String(e);
    }
  }

  get pending(): boolean {
    return this.#pending !== null;
  }
}
