/**
 * Gradient structure tensor slope estimator (van Vliet & Verbeek 1995; Fehmers & Höcker 2003; methods.md §2.7).
 * Gradients by Gaussian-derivative filters of the same width (GAUSS_SIGMA = 1 sample = 1 trace) on both axes,
 * evaluated at the pair positions p+½ (Gaussian weights at trace offsets ±½, ±1½, ±2½). With equal widths the
 * ratio g_x/g_t of a plane wave u = f(t − σx) is −σ independent of frequency (the Gaussian factors cancel), so the
 * estimate is unbiased while the sampled filters follow the continuous ones (|ω|, |σω| ≲ π/2).
 * J = T [g_t², g_t g_x; g_t g_x, g_x²] (T: triangle smoothing); normal angle φ = ½ atan2(2J_tx, J_tt − J_xx);
 * σ = −tan φ; coherence c = sqrt((J_tt−J_xx)² + 4J_tx²)/(J_tt+J_xx) ∈ [0, 1].
 * A pair whose six-trace footprint touches a missing trace (or leaves the gather) contributes nothing.
 * Layout: u trace-major (core/grid/gather.ts), outputs on the pair grid (core/slope/pair-grid.ts).
 */
import { createTriangle2D, triangle2DApply, type Triangle2D } from './triangle';

const GAUSS_SIGMA = 1;
const HALF_TIME = 3;
/** Trace offsets of the across-filter relative to the pair position: −2.5 … 2.5. */
const ACROSS = [-2.5, -1.5, -0.5, 0.5, 1.5, 2.5];

function gaussTaps(offsets: number[]): { g: Float64Array; d: Float64Array } {
  const g = new Float64Array(offsets.length), d = new Float64Array(offsets.length);
  let sg = 0, sd = 0;
  offsets.forEach((o, i) => {
    const w = Math.exp(-(o * o) / (2 * GAUSS_SIGMA * GAUSS_SIGMA));
    g[i] = w;
    d[i] = o * w;
    sg += w;
    sd += o * o * w;
  });
  // Σg = 1 (keeps constants), Σ d·o = 1 (exact derivative of a ramp)
  for (let i = 0; i < offsets.length; i++) { g[i] /= sg; d[i] /= sd; }
  return { g, d };
}

const TIME_TAPS = gaussTaps(Array.from({ length: 2 * HALF_TIME + 1 }, (_, i) => i - HALF_TIME));
const ACROSS_TAPS = gaussTaps(ACROSS);

export interface TensorWorkspace {
  readonly nTraces: number;
  readonly nSamples: number;
  readonly jtt: Float64Array;
  readonly jtx: Float64Array;
  readonly jxx: Float64Array;
  /** Per trace: time derivative and time-smoothed copies of u. */
  readonly dt: Float64Array;
  readonly st: Float64Array;
  readonly smoother: Triangle2D;
}

export function createTensorWorkspace(nTraces: number, nSamples: number, radiusTime: number, radiusAcross: number): TensorWorkspace {
  const n = (nTraces - 1) * nSamples;
  return {
    nTraces, nSamples,
    jtt: new Float64Array(n), jtx: new Float64Array(n), jxx: new Float64Array(n),
    dt: new Float64Array(nTraces * nSamples), st: new Float64Array(nTraces * nSamples),
    smoother: createTriangle2D(nTraces - 1, nSamples, radiusTime, radiusAcross),
  };
}

/**
 * Slopes (samples per trace, clamped to ±maxAbsSlope) and coherence on the pair grid. Allocation-free.
 * pairLive is per pair (1 when both traces live); a pair is used when all traces of its footprint are live.
 * @param energy optional out: smoothed gradient energy J_tt + J_xx (for confidence scaling)
 */
export function structureTensorSlopesUnchecked(
  ws: TensorWorkspace, outSlope: Float64Array, outCoherence: Float64Array, u: ArrayLike<number>, pairLive: Uint8Array,
  maxAbsSlope: number, energy?: Float64Array,
): void {
  const { nTraces, nSamples: ns, jtt, jtx, jxx, dt, st } = ws;
  const nPairs = nTraces - 1;
  const tg = TIME_TAPS.g, td = TIME_TAPS.d;
  // Time filters per trace (samples outside the trace count as zero).
  for (let x = 0; x < nTraces; x++) {
    const b = x * ns;
    for (let t = 0; t < ns; t++) {
      let a = 0, c = 0;
      const lo = Math.max(-HALF_TIME, -t), hi = Math.min(HALF_TIME, ns - 1 - t);
      for (let k = lo; k <= hi; k++) {
        const v = u[b + t + k];
        a += td[k + HALF_TIME] * v;
        c += tg[k + HALF_TIME] * v;
      }
      dt[b + t] = a;
      st[b + t] = c;
    }
  }
  const ag = ACROSS_TAPS.g, ad = ACROSS_TAPS.d;
  const nA = ACROSS.length;
  const first = -(nA / 2 - 1); // trace offset of tap 0 relative to p: p − 2
  for (let p = 0; p < nPairs; p++) {
    const L = p * ns;
    let ok = true;
    for (let i = 0; i < nA && ok; i++) {
      const x = p + first + i;
      if (x < 0 || x >= nTraces) ok = false;
      else if (i < nA - 1 && !pairLive[x] && x < nPairs) ok = false;
    }
    if (!ok || !pairLive[p]) {
      jtt.fill(0, L, L + ns); jtx.fill(0, L, L + ns); jxx.fill(0, L, L + ns);
      continue;
    }
    for (let t = 0; t < ns; t++) {
      let gt = 0, gx = 0;
      for (let i = 0; i < nA; i++) {
        const o = (p + first + i) * ns + t;
        gt += ag[i] * dt[o];
        gx += ad[i] * st[o];
      }
      jtt[L + t] = gt * gt;
      jtx[L + t] = gt * gx;
      jxx[L + t] = gx * gx;
    }
  }
  triangle2DApply(ws.smoother, jtt, jtt);
  triangle2DApply(ws.smoother, jtx, jtx);
  triangle2DApply(ws.smoother, jxx, jxx);
  const n = nPairs * ns;
  for (let i = 0; i < n; i++) {
    const a = jtt[i], b = jtx[i], c = jxx[i];
    const tr = a + c;
    if (energy) energy[i] = tr;
    if (!(tr > 0)) {
      outSlope[i] = 0;
      outCoherence[i] = 0;
      continue;
    }
    const phi = 0.5 * Math.atan2(2 * b, a - c);
    let sl = -Math.tan(phi);
    if (sl > maxAbsSlope) sl = maxAbsSlope;
    else if (sl < -maxAbsSlope) sl = -maxAbsSlope;
    outSlope[i] = sl;
    const coh = Math.sqrt((a - c) * (a - c) + 4 * b * b) / tr;
    outCoherence[i] = coh > 1 ? 1 : coh;
  }
}
