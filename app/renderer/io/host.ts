/**
 * What the page needs from its surroundings, in the desktop shell (window.dipweave, app/shared/ipc.ts) or
 * in a plain browser (downloads, names of recent files in localStorage). Nothing here is ever written over
 * an input file: the desktop save dialog refuses opened inputs, and the browser saves only as downloads.
 */
import { MAX_CHUNK_BYTES, type DipweaveDesktopApi, type SaveKind } from '../../shared/ipc';

export function desktop(): DipweaveDesktopApi | null {
  return typeof window !== 'undefined' && window.dipweave ? window.dipweave : null;
}

export type SaveOutcome = { saved: true; name: string; sizeBytes: number } | { saved: false };

/** Saves bytes through the desktop dialog, or as a browser download. */
export async function saveBytes(defaultName: string, kind: SaveKind, data: Uint8Array | Blob): Promise<SaveOutcome> {
  const api = desktop();
  const blob = data instanceof Blob ? data : new Blob([data as Uint8Array<ArrayBuffer>], { type: 'application/octet-stream' });
  if (api) {
    const target = await api.saveDialog(defaultName, kind);
    if (!target) return { saved: false };
    try {
      for (let off = 0; off < blob.size; off += MAX_CHUNK_BYTES) {
        const chunk = new Uint8Array(await blob.slice(off, Math.min(blob.size, off + MAX_CHUNK_BYTES)).arrayBuffer());
        await api.writeChunk(target.saveId, chunk);
      }
      const done = await api.finishSave(target.saveId);
      return { saved: true, name: done.name, sizeBytes: done.sizeBytes };
    } catch (e) {
      await api.abortSave(target.saveId).catch(() => undefined);
      throw e;
    }
  }
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = defaultName;
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
  return { saved: true, name: defaultName, sizeBytes: blob.size };
}

/** Names of recently opened files in a browser (a browser cannot reopen a file by name: these are reminders). */
export interface RecentStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

const RECENT_KEY = 'dipweave.recent.v1';

export function readRecentNames(store: RecentStore): string[] {
  try {
    const v = JSON.parse(store.getItem(RECENT_KEY) ?? '[]');
    return Array.isArray(v) ? v.filter((s): s is string => typeof s === 'string').slice(0, 10) : [];
  } catch {
    return [];
  }
}

export function pushRecentName(store: RecentStore, name: string): string[] {
  const next = [name, ...readRecentNames(store).filter((n) => n !== name)].slice(0, 10);
  store.setItem(RECENT_KEY, JSON.stringify(next));
  return next;
}
