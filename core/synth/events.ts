/**
 * Analytic events for tests and the demo: band-limited plane waves and hyperbolas with their exact slopes.
 * Units: sample and trace indices (Δt = Δx = 1); slopes in samples per trace (methods.md §6.6).
 * Layout: trace-major (core/grid/gather.ts).
 */

/** Ricker wavelet at time t (samples) with peak frequency fp (cycles per sample). */
export function ricker(t: number, fpCyclesPerSample: number): number {
  const a = (Math.PI * fpCyclesPerSample * t) ** 2;
  return (1 - 2 * a) * Math.exp(-a);
}

export interface PlaneWaveSpec {
  /** Arrival time at trace 0, in samples. */
  t0Samples: number;
  slopeSamplesPerTrace: number;
  fpCyclesPerSample: number;
  amplitude?: number;
}

/** Adds u(t, x) = A·ricker(t − t0 − σx) into out. @returns out */
export function addPlaneWave(out: Float64Array, nTraces: number, nSamples: number, spec: PlaneWaveSpec): Float64Array {
  const a = spec.amplitude ?? 1;
  for (let x = 0; x < nTraces; x++) {
    const arrival = spec.t0Samples + spec.slopeSamplesPerTrace * x;
    for (let t = 0; t < nSamples; t++) out[x * nSamples + t] += a * ricker(t - arrival, spec.fpCyclesPerSample);
  }
  return out;
}

export interface HyperbolaSpec {
  /** Zero-offset time, in samples. */
  t0Samples: number;
  /** Moveout velocity in traces per sample (t(x) = sqrt(t0² + (x − x0)²/v²)). */
  velocityTracesPerSample: number;
  /** Apex position (trace index, may be fractional or outside the gather). */
  apexTrace: number;
  fpCyclesPerSample: number;
  amplitude?: number;
}

export function hyperbolaTime(spec: HyperbolaSpec, x: number): number {
  const h = (x - spec.apexTrace) / spec.velocityTracesPerSample;
  return Math.sqrt(spec.t0Samples * spec.t0Samples + h * h);
}

/** Exact local slope dt/dx of the event at trace position x: (x − x0)/(v² t(x)). */
export function hyperbolaSlope(spec: HyperbolaSpec, x: number): number {
  const v = spec.velocityTracesPerSample;
  return (x - spec.apexTrace) / (v * v * hyperbolaTime(spec, x));
}

/** Adds A·ricker(t − t(x)) for a hyperbolic event into out. @returns out */
export function addHyperbola(out: Float64Array, nTraces: number, nSamples: number, spec: HyperbolaSpec): Float64Array {
  const a = spec.amplitude ?? 1;
  for (let x = 0; x < nTraces; x++) {
    const arrival = hyperbolaTime(spec, x);
    for (let t = 0; t < nSamples; t++) out[x * nSamples + t] += a * ricker(t - arrival, spec.fpCyclesPerSample);
  }
  return out;
}

/**
 * Exact slope field of a sum of hyperbolas, on any grid of positions: at each (x, t) the slope of the event
 * whose arrival is nearest to t (the moveout relation, methods.md §6.6). `positionsTrace` gives x per column.
 */
export function hyperbolaSlopeField(out: Float64Array, positionsTrace: ArrayLike<number>, nSamples: number, events: readonly HyperbolaSpec[]): Float64Array {
  for (let c = 0; c < positionsTrace.length; c++) {
    const x = positionsTrace[c];
    const times = events.map((e) => hyperbolaTime(e, x));
    const slopes = events.map((e) => hyperbolaSlope(e, x));
    for (let t = 0; t < nSamples; t++) {
      let best = 0;
      for (let e = 1; e < events.length; e++) if (Math.abs(times[e] - t) < Math.abs(times[best] - t)) best = e;
      out[c * nSamples + t] = slopes[best];
    }
  }
  return out;
}
