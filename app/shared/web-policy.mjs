// The web policy of every page Dipweave serves: the Electron window (app/main/app-protocol.ts) and the
// browser fallback of `npm start` (scripts/start.mjs). Plain JavaScript so that start.mjs can import it
// before anything is built. Types in web-policy.d.mts.

/** Cross-origin isolation (SharedArrayBuffer for the workers) and no cross-origin embedding. */
export const ISOLATION_HEADERS = Object.freeze({
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Embedder-Policy': 'require-corp',
  'Cross-Origin-Resource-Policy': 'same-origin',
});

/** No remote content: everything comes from the bundle; workers may be blob: URLs; no eval. */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "worker-src 'self' blob:",
  "connect-src 'self' blob: data:",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
].join('; ');
