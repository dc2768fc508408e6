/**
 * Starting guess for the least-squares fill: two-sided painting along slopes (methods.md §3.2 (b), after
 * predictive painting, Fomel 2010). Each sample of an unknown trace follows its characteristic
 * dt/dx = σ back to the nearest known trace on the left and forward to the one on the right; the two
 * predictions are blended linearly by distance. Following the characteristic and interpolating once
 * (instead of predicting trace by trace) keeps the wavelet from being smoothed a little at every step.
 *
 * Layout: trace-major gather; slopes on the pair grid (core/pwd/operator.ts). Unchecked.
 */

const TAPS = 6; // half-length of the windowed-sinc interpolator
const KAISER_BETA = 6;
const TABLE_STEPS = 512; // fractional offsets tabulated per sample; linear between rows

function besselI0(x: number): number {
  let s = 1;
  let term = 1;
  for (let k = 1; k < 40; k++) {
    term *= (x / (2 * k)) ** 2;
    s += term;
  }
  return s;
}

/** Row i holds the 2·TAPS weights for fraction i/TABLE_STEPS, normalised to unit sum (unit gain at 0 Hz). */
const SINC_TABLE: Float64Array = (() => {
  const w = 2 * TAPS;
  const tab = new Float64Array((TABLE_STEPS + 1) * w);
  const norm = besselI0(KAISER_BETA);
  for (let i = 0; i <= TABLE_STEPS; i++) {
    const f = i / TABLE_STEPS;
    let sum = 0;
    for (let j = -TAPS + 1; j <= TAPS; j++) {
      const x = j - f;
      const px = Math.PI * x;
      const sinc = Math.abs(x) < 1e-12 ? 1 : Math.sin(px) / px;
      const r = x / TAPS;
      const win = Math.abs(r) >= 1 ? 0 : besselI0(KAISER_BETA * Math.sqrt(1 - r * r)) / norm;
      tab[i * w + j + TAPS - 1] = sinc * win;
      sum += sinc * win;
    }
    for (let j = 0; j < w; j++) tab[i * w + j] /= sum;
  }
  return tab;
})();

/**
 * Value of trace `base` at fractional sample τ: Kaiser-windowed sinc (12 taps, β = 6; error below 5e-4 of the
 * peak for a Ricker wavelet at 0.1 cycles per sample), 0 outside the trace.
 */
export function sampleAt(u: Float64Array, base: number, nSamples: number, tau: number): number {
  if (!(tau > -1) || !(tau < nSamples)) return 0;
  const i0 = Math.floor(tau);
  const f = tau - i0;
  if (f === 0) return u[base + i0];
  const pos = f * TABLE_STEPS;
  // f can round to exactly 1 for τ just below an integer: stay inside the table.
  const row = Math.min(TABLE_STEPS - 1, Math.floor(pos));
  const g = pos - row;
  const w = 2 * TAPS;
  const r0 = row * w;
  const r1 = r0 + w;
  let acc = 0;
  for (let j = 0; j < w; j++) {
    const s = i0 + j - TAPS + 1;
    if (s >= 0 && s < nSamples) acc += ((1 - g) * SINC_TABLE[r0 + j] + g * SINC_TABLE[r1 + j]) * u[base + s];
  }
  return acc;
}

/** Slope of pair p at fractional time τ (linear in time, clamped to the trace). */
function slopeAt(slopePairs: Float64Array, p: number, nSamples: number, tau: number): number {
  const base = p * nSamples;
  if (tau <= 0) return slopePairs[base];
  if (tau >= nSamples - 1) return slopePairs[base + nSamples - 1];
  const i = Math.floor(tau);
  const f = tau - i;
  return slopePairs[base + i] * (1 - f) + slopePairs[base + i + 1] * f;
}

/** Time at trace `to` of the characteristic through (trace `from`, time τ); midpoint rule per pair. */
export function followCharacteristic(slopePairs: Float64Array, nSamples: number, from: number, to: number, tau: number): number {
  if (to > from) {
    for (let p = from; p < to; p++) {
      const s1 = slopeAt(slopePairs, p, nSamples, tau);
      tau += slopeAt(slopePairs, p, nSamples, tau + s1 / 2);
    }
  } else {
    for (let p = from - 1; p >= to; p--) {
      const s1 = slopeAt(slopePairs, p, nSamples, tau);
      tau -= slopeAt(slopePairs, p, nSamples, tau - s1 / 2);
    }
  }
  return tau;
}

/**
 * Overwrites traces a..b of u with the painted guess from the known traces a−1 and b+1 (one side only at the
 * edges of the gather; zeros when neither exists). @returns u
 */
export function paintBlock(u: Float64Array, nTraces: number, nSamples: number, slopePairs: Float64Array, a: number, b: number): Float64Array {
  const left = a - 1;
  const right = b + 1;
  const hasL = left >= 0;
  const hasR = right < nTraces;
  for (let x = a; x <= b; x++) {
    const w = hasL && hasR ? (x - left) / (right - left) : hasR ? 1 : 0;
    const out = x * nSamples;
    for (let t = 0; t < nSamples; t++) {
      let v = 0;
      if (hasL && w < 1) v += (1 - w) * sampleAt(u, left * nSamples, nSamples, followCharacteristic(slopePairs, nSamples, x, left, t));
      if (hasR && w > 0) v += w * sampleAt(u, right * nSamples, nSamples, followCharacteristic(slopePairs, nSamples, x, right, t));
      u[out + t] = v;
    }
  }
  return u;
}
