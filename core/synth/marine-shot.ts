/**
 * Synthetic towed-streamer shot records for the demo line (core/synth/demo-scenario.ts).
 *
 * Physics (common practice, no source unless named):
 * - direct wave through the water at the water velocity (its own surface ghost is left out so that the
 *   steep event stays visible; a real direct arrival is weakened by that ghost at long offsets);
 * - the seabed and deeper reflectors with hyperbolic moveout t² = t0m² + x² cos²θ / v² where t0m is the
 *   normal-incidence time at the midpoint and θ the reflector dip (Levin 1971, exact for one dipping plane
 *   under a constant velocity; for deeper layers the usual hyperbolic approximation with the RMS velocity);
 * - the first seabed surface multiple;
 * - a diffraction from a point scatterer: double-square-root time (√(z²+(s−x_d)²) + √(z²+(r−x_d)²)) / v;
 * - spherical-divergence-like decay: amplitude ∝ R / (v_rms² t) (Newman 1973, from memory);
 * - source and receiver ghosts: a copy scaled by the surface reflection coefficient (≈ −1) and delayed by
 *   2·depth·cosφ / v_water, φ the emergence angle from the local ray parameter (sin φ = p·v_water);
 * - band-limited Gaussian noise (white noise convolved with the source wavelet), seeded.
 * Travel times are measured as if source and groups were at the surface; the tow depths enter the ghosts.
 * Layout of the result: trace-major (core/grid/gather.ts), trace index = shot·nChannels + channel − 1.
 */
import { Rng } from '../rng';
import { ricker } from './events';
import type { DemoScenario, ReflectorSpec } from './demo-scenario';
import { seabedDepthM, traceGeometry, type MarineTraceGeometry } from './marine-geometry';

export interface MarineLine {
  readonly nShots: number;
  readonly nChannels: number;
  readonly nSamples: number;
  readonly sampleIntervalUs: number;
  /** Shot-major: geometry[shot * nChannels + channel - 1]. */
  readonly geometry: readonly MarineTraceGeometry[];
  /** Trace-major samples of all shots, same trace order as `geometry`. */
  readonly data: Float32Array;
}

export function directWaveTimeS(sc: DemoScenario, offsetM: number): number {
  const dz = sc.streamerDepthM - sc.sourceDepthM;
  return Math.sqrt(offsetM * offsetM + dz * dz) / sc.waterVelocityMps;
}

/** Dipping-plane moveout (Levin 1971): t² = t0m² + x² cos²θ / v². */
function dippingMoveoutS(t0mS: number, offsetM: number, vMps: number, sinTheta: number): number {
  const cos2 = 1 - sinTheta * sinTheta;
  return Math.sqrt(t0mS * t0mS + (offsetM * offsetM * cos2) / (vMps * vMps));
}

export function seabedTimeS(sc: DemoScenario, sourceM: number, receiverM: number): number {
  const m = 0.5 * (sourceM + receiverM);
  const cosT = 1 / Math.sqrt(1 + sc.seabedSlope * sc.seabedSlope);
  const t0m = (2 * seabedDepthM(sc, m) * cosT) / sc.waterVelocityMps;
  return dippingMoveoutS(t0m, sourceM - receiverM, sc.waterVelocityMps, sc.seabedSlope * cosT);
}

/** First surface multiple of the seabed: twice the normal-incidence time, twice the dip. */
export function seabedMultipleTimeS(sc: DemoScenario, sourceM: number, receiverM: number): number {
  const m = 0.5 * (sourceM + receiverM);
  const theta = Math.atan(sc.seabedSlope);
  const t0m = (4 * seabedDepthM(sc, m) * Math.cos(theta)) / sc.waterVelocityMps;
  return dippingMoveoutS(t0m, sourceM - receiverM, sc.waterVelocityMps, Math.sin(2 * theta));
}

export function reflectorTimeS(sc: DemoScenario, refl: ReflectorSpec, sourceM: number, receiverM: number): number {
  const m = 0.5 * (sourceM + receiverM);
  const t0m = refl.t0Seconds + refl.dT0dxSecondsPerM * (m - sc.reflectorReferenceAlongM);
  return dippingMoveoutS(t0m, sourceM - receiverM, refl.vRmsMps, (refl.vRmsMps * refl.dT0dxSecondsPerM) / 2);
}

export function diffractionTimeS(sc: DemoScenario, sourceM: number, receiverM: number): number {
  const d = sc.diffractor;
  const rs = Math.hypot(d.depthM, sourceM - d.alongLineM);
  const rr = Math.hypot(d.depthM, receiverM - d.alongLineM);
  return (rs + rr) / d.velocityMps;
}

interface Arrival {
  timeS: (s: number, r: number) => number;
  amplitude: (s: number, r: number, tS: number) => number;
  ghosted: boolean;
}

function arrivals(sc: DemoScenario): Arrival[] {
  const vw = sc.waterVelocityMps;
  const tRefS = (2 * sc.seabedDepthM) / vw;
  // Spherical-divergence-like gain: 1 at the seabed's zero-offset time in water.
  const spread = (tS: number, vMps: number) => (tRefS / tS) * ((vw * vw) / (vMps * vMps));
  const list: Arrival[] = [
    {
      timeS: (s, r) => directWaveTimeS(sc, s - r),
      amplitude: (s, r) => (sc.directWaveAmplitude * sc.nearOffsetM) / Math.max(Math.abs(s - r), 1),
      ghosted: false,
    },
    {
      timeS: (s, r) => seabedTimeS(sc, s, r),
      amplitude: (_s, _r, t) => sc.seabedReflectionCoefficient * spread(t, vw),
      ghosted: true,
    },
    {
      timeS: (s, r) => seabedMultipleTimeS(sc, s, r),
      amplitude: (_s, _r, t) =>
        sc.seabedReflectionCoefficient * sc.surfaceReflectionCoefficient * sc.seabedReflectionCoefficient * spread(t, vw),
      ghosted: true,
    },
    {
      timeS: (s, r) => diffractionTimeS(sc, s, r),
      amplitude: (s, r) => {
        const d = sc.diffractor;
        const rs = Math.hypot(d.depthM, s - d.alongLineM);
        const rr = Math.hypot(d.depthM, r - d.alongLineM);
        return (d.amplitude * d.depthM * d.depthM) / (rs * rr);
      },
      ghosted: true,
    },
  ];
  for (const refl of sc.reflectors) {
    list.push({
      timeS: (s, r) => reflectorTimeS(sc, refl, s, r),
      amplitude: (_s, _r, t) => refl.reflectionCoefficient * spread(t, refl.vRmsMps),
      ghosted: true,
    });
  }
  return list;
}

/** Ghost delay 2·d·cosφ/v for a ray with horizontal slowness p (s/m). */
function ghostDelayS(depthM: number, pSPerM: number, vMps: number): number {
  const sin = Math.min(1, Math.abs(pSPerM) * vMps);
  return (2 * depthM * Math.sqrt(1 - sin * sin)) / vMps;
}

/** Adds A·w(t − T) at sample positions into one trace, only where the wavelet is not negligible. */
function addWavelet(trace: Float64Array, arrivalSamples: number, amplitude: number, fp: number, halfWidth: number): void {
  const lo = Math.max(0, Math.ceil(arrivalSamples - halfWidth));
  const hi = Math.min(trace.length - 1, Math.floor(arrivalSamples + halfWidth));
  for (let t = lo; t <= hi; t++) trace[t] += amplitude * ricker(t - arrivalSamples, fp);
}

/** Band-limited noise: white Gaussian convolved with the wavelet, scaled to the given RMS. */
function addNoise(trace: Float64Array, rng: Rng, kernel: Float64Array, halfWidth: number, rms: number, white: Float64Array): void {
  for (let i = 0; i < white.length; i++) white[i] = rng.normal();
  for (let t = 0; t < trace.length; t++) {
    let acc = 0;
    for (let k = -halfWidth; k <= halfWidth; k++) acc += kernel[k + halfWidth] * white[t + halfWidth - k];
    trace[t] += rms * acc;
  }
}

/** Synthesizes every shot of the line. Deterministic for a given scenario (noise seeded by noiseSeed). */
export function synthesizeMarineLine(sc: DemoScenario): MarineLine {
  const nTraces = sc.nShots * sc.nChannels;
  const nSamples = sc.nSamples;
  const dtS = sc.sampleIntervalUs * 1e-6;
  const fp = sc.peakFrequencyHz * dtS;
  const halfWidth = Math.ceil(6 / (Math.PI * fp));
  const list = arrivals(sc);
  const rng = new Rng(sc.noiseSeed);
  const kernel = new Float64Array(2 * halfWidth + 1);
  let k2 = 0;
  for (let k = -halfWidth; k <= halfWidth; k++) {
    kernel[k + halfWidth] = ricker(k, fp);
    k2 += kernel[k + halfWidth] ** 2;
  }
  for (let i = 0; i < kernel.length; i++) kernel[i] /= Math.sqrt(k2);
  const noiseRms = sc.noiseRelative * sc.seabedReflectionCoefficient;
  const white = new Float64Array(nSamples + 2 * halfWidth);
  const trace = new Float64Array(nSamples);
  const data = new Float32Array(nTraces * nSamples);
  const geometry: MarineTraceGeometry[] = [];
  const h = 0.01; // metres, for the ray parameters by central differences
  const rSurf = sc.surfaceReflectionCoefficient;
  for (let shot = 0; shot < sc.nShots; shot++) {
    for (let c = 1; c <= sc.nChannels; c++) {
      const g = traceGeometry(sc, shot, c);
      geometry.push(g);
      trace.fill(0);
      const s = g.sourceAlongM;
      const r = g.receiverAlongM;
      for (const a of list) {
        const tS = a.timeS(s, r);
        const amp = a.amplitude(s, r, tS);
        const tSamples = tS / dtS;
        addWavelet(trace, tSamples, amp, fp, halfWidth);
        if (!a.ghosted) continue;
        const pS = (a.timeS(s + h, r) - a.timeS(s - h, r)) / (2 * h);
        const pR = (a.timeS(s, r + h) - a.timeS(s, r - h)) / (2 * h);
        const tauS = ghostDelayS(sc.sourceDepthM, pS, sc.waterVelocityMps) / dtS;
        const tauR = ghostDelayS(sc.streamerDepthM, pR, sc.waterVelocityMps) / dtS;
        addWavelet(trace, tSamples + tauS, amp * rSurf, fp, halfWidth);
        addWavelet(trace, tSamples + tauR, amp * rSurf, fp, halfWidth);
        addWavelet(trace, tSamples + tauS + tauR, amp * rSurf * rSurf, fp, halfWidth);
      }
      addNoise(trace, rng, kernel, halfWidth, noiseRms, white);
      data.set(trace, (shot * sc.nChannels + c - 1) * nSamples);
    }
  }
  return { nShots: sc.nShots, nChannels: sc.nChannels, nSamples, sampleIntervalUs: sc.sampleIntervalUs, geometry, data };
}
