/**
 * Where the data say nothing, the slope settles to a smooth background (our engineering choice, docs/slopes.md
 * "Quiet and incoherent zones"). Gauss-Newton on balanced data fits whatever is there: in noise or silence its
 * answer is arbitrary (measured: up to 34 samples per trace on pure noise). After the estimate, each pair sample
 * keeps its own slope in proportion to how well it destroys the data, and otherwise takes the background
 *   B = T(c σ) / (T(c) + ε),  c = confidence (normalised destruction residual, gauss-newton.ts),
 * a confidence-weighted average of the trusted slopes around it, widely smoothed (T: triangle smoothing with
 * radii ×8), that fades to 0 (flat) far from any trusted slope (ε).
 *   keep = clamp((c − C_LOW) / (C_HIGH − C_LOW), 0, 1),   σ ← keep σ + (1 − keep) B.
 * Confident slopes (c ≥ C_HIGH) are untouched, so accuracy on coherent events does not change.
 * Layout: pair grid (core/slope/pair-grid.ts).
 */
import { createTriangle2D, triangle2DApply } from './triangle';

/** Below this confidence the slope is the background's. Pure noise scores 0.2 on average (measured, 600 × 120 Gaussian noise); set low enough that the F3 check of test/reference/fill/f3.test.ts keeps its figures (0.2–0.45 moved one inline by 3 dB). */
export const SETTLE_LOW = 0.1;
/** From this confidence on the estimate is kept as it is. */
export const SETTLE_HIGH = 0.3;
/** Background radii relative to the estimate's. */
const WIDE = 8;
/** Weight of the flat fallback, relative to a fully trusted neighbourhood. */
const EPS = 0.02;

/**
 * In place on sigma. Allocates its scratch (called once per estimate).
 * @param only  when given, only pair samples marked 1 may move (the others still inform the background)
 * @returns the number of pair samples that moved toward the background (keep < 1)
 */
export function settleIncoherentSlopes(
  sigma: Float64Array, conf: Float64Array, nPairs: number, nSamples: number, radiusTimeSamples: number, radiusTraces: number,
  only?: Uint8Array,
): number {
  const n = nPairs * nSamples;
  const w = new Float64Array(n), ws = new Float64Array(n);
  let any = false;
  for (let i = 0; i < n; i++) {
    const c = conf[i];
    w[i] = c;
    ws[i] = c * sigma[i];
    if (c < SETTLE_HIGH && (!only || only[i])) any = true;
  }
  if (!any) return 0;
  const tri = createTriangle2D(nPairs, nSamples, Math.max(2, WIDE * radiusTimeSamples), Math.max(2, WIDE * radiusTraces));
  triangle2DApply(tri, w, w);
  triangle2DApply(tri, ws, ws);
  let moved = 0;
  const span = SETTLE_HIGH - SETTLE_LOW;
  for (let i = 0; i < n; i++) {
    const c = conf[i];
    if (c >= SETTLE_HIGH || (only && !only[i])) continue;
    const keep = c <= SETTLE_LOW ? 0 : (c - SETTLE_LOW) / span;
    const bg = ws[i] / (w[i] + EPS);
    sigma[i] = keep * sigma[i] + (1 - keep) * bg;
    moved++;
  }
  return moved;
}
