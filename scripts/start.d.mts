// Types for scripts/start.mjs (a plain Node script, so `npm start` needs no build step of its own).
import type { Server } from 'node:http';

export interface ElectronStatus {
  available: boolean;
  binaryPath: string | null;
  reason: string;
}
export function electronStatus(root?: string, env?: Record<string, string | undefined>): ElectronStatus;
export const ISOLATION_HEADERS: Readonly<Record<string, string>>;
export const CONTENT_SECURITY_POLICY: string;
export function resolveInside(base: string, urlPath: string): string | null;
export function createUiServer(dirs: { rendererDir: string; samplesDir: string }): Server;
export function listenLocal(server: Server, port: number, tries?: number): Promise<string>;
