/**
 * Amplitude balance before slope estimation (common practice, no source: automatic gain control).
 * Shot gathers decay by orders of magnitude with time and offset; destruction residuals would then be ruled by
 * the strongest samples. out = u / sqrt(T(u²) + ε), with T a triangle smoother along time (radius
 * windowRadiusSamples) and across traces (radius windowRadiusTraces; 1 = trace by trace), ε = 1e-12 · mean(u²) (120 dB below the mean level)
 * so exact zeros (missing traces, mutes) stay zero. Only the estimate uses the balanced copy; fills use true
 * amplitudes. Layout: trace-major (core/grid/gather.ts).
 */
import { createTriangle2D, triangle2DApply } from './triangle';

export function balanceAmplitudes(u: ArrayLike<number>, nTraces: number, nSamples: number, windowRadiusSamples: number, windowRadiusTraces = 1): Float64Array {
  const n = nTraces * nSamples;
  const energy = new Float64Array(n);
  let mean = 0;
  for (let i = 0; i < n; i++) {
    const v = u[i];
    energy[i] = v * v;
    mean += v * v;
  }
  mean /= Math.max(1, n);
  const out = new Float64Array(n);
  if (!(mean > 0)) return out;
  const tri = createTriangle2D(nTraces, nSamples, Math.max(1, Math.round(windowRadiusSamples)), Math.max(1, Math.round(windowRadiusTraces)));
  triangle2DApply(tri, energy, energy);
  const eps = 1e-12 * mean;
  for (let i = 0; i < n; i++) out[i] = u[i] / Math.sqrt(Math.max(0, energy[i]) + eps);
  return out;
}
