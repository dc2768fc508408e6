/**
 * Time decimation by 2 for the coarse-to-fine levels: a zero-phase half-band FIR low-pass (windowed sinc, cut-off
 * 0.25 cycles per input sample, Blackman window, 2·HALF+1 taps; odd taps other than the centre are zero) followed by
 * taking every second sample. Cheaper than an FFT per trace; the alias band it lets through (0.2–0.3 cycles/sample)
 * is small for slope estimation, which only needs the coarse level to start the finer one
 * (design: common practice for half-band decimators, no source). Layout: trace-major (core/grid/gather.ts).
 */

const HALF = 11;
const TAPS: Float64Array = (() => {
  const h = new Float64Array(2 * HALF + 1);
  let s = 0;
  for (let k = -HALF; k <= HALF; k++) {
    const sinc = k === 0 ? 0.5 : k % 2 === 0 ? 0 : Math.sin((Math.PI * k) / 2) / (Math.PI * k);
    const w = 0.42 + 0.5 * Math.cos((Math.PI * k) / (HALF + 1)) + 0.08 * Math.cos((2 * Math.PI * k) / (HALF + 1));
    h[k + HALF] = sinc * w;
    s += sinc * w;
  }
  for (let i = 0; i < h.length; i++) h[i] /= s; // unit gain at zero frequency
  return h;
})();

/** Half-band tap k (−HALF..HALF), for tests. */
export function halfBandTap(k: number): number {
  return Math.abs(k) > HALF ? 0 : TAPS[k + HALF];
}

/** Low-pass by the half-band filter and keep samples 0, 2, 4, …; samples beyond the trace count as zero. */
export function halveTime(u: ArrayLike<number>, nTraces: number, nSamples: number): { data: Float64Array; nSamples: number } {
  const nsOut = Math.ceil(nSamples / 2);
  const out = new Float64Array(nTraces * nsOut);
  for (let x = 0; x < nTraces; x++) {
    const b = x * nSamples;
    const o = x * nsOut;
    for (let j = 0; j < nsOut; j++) {
      const t = 2 * j;
      let acc = TAPS[HALF] * u[b + t];
      for (let k = 1; k <= HALF; k += 2) {
        const w = TAPS[HALF + k];
        const lo = t - k, hi = t + k;
        acc += w * ((lo >= 0 ? u[b + lo] : 0) + (hi < nSamples ? u[b + hi] : 0));
      }
      out[o + j] = acc;
    }
  }
  return { data: out, nSamples: nsOut };
}
