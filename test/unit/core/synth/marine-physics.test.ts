// Physical sanity of the synthetic shot records, measured on the generated data and compared with analytic
// relations of the trade (common practice, no source unless named):
// - the direct wave travels at the water velocity: its slope is group interval / 1500 m/s, in samples per trace;
// - its amplitude falls as 1/distance (spherical spreading of a point source);
// - a reflection's local slope follows the hyperbolic moveout dt/dx = x / (v² t);
// - a ghost (surface reflection coefficient ≈ −1, delay 2·d·cosφ/v) puts a spectral notch at v / (2·d·cosφ);
// - the noise is band-limited and at the stated level.
import { describe, expect, it } from 'vitest';
import { DEMO_SCENARIO as SC, type DemoScenario } from '../../../../core/synth/demo-scenario';
import { type MarineLine, diffractionTimeS, directWaveTimeS, reflectorTimeS, seabedMultipleTimeS, seabedTimeS, synthesizeMarineLine } from '../../../../core/synth/marine-shot';
import { ricker } from '../../../../core/synth/events';

const line = synthesizeMarineLine(SC);
const dtS = SC.sampleIntervalUs * 1e-6;
const trace = (shot: number, channel: number) => line.data.subarray((shot * SC.nChannels + channel - 1) * SC.nSamples, (shot * SC.nChannels + channel) * SC.nSamples);

/** Sample of the largest value within [lo, hi], refined by a parabola through its neighbours. */
function peakTime(x: ArrayLike<number>, lo: number, hi: number): { t: number; a: number } {
  let best = lo;
  for (let i = lo; i <= hi; i++) if (x[i] > x[best]) best = i;
  const y0 = x[best - 1], y1 = x[best], y2 = x[best + 1];
  const d = (y0 - y2) / (2 * (y0 - 2 * y1 + y2));
  return { t: best + d, a: y1 - 0.25 * (y0 - y2) * d };
}

/** b at a fractional sample position: Hann-windowed sinc, 16 samples each side (band-limited data). */
function sincAt(b: ArrayLike<number>, x: number): number {
  const i0 = Math.floor(x);
  let s = 0;
  for (let k = i0 - 15; k <= i0 + 16; k++) {
    const u = x - k;
    const sinc = u === 0 ? 1 : Math.sin(Math.PI * u) / (Math.PI * u);
    s += b[k] * sinc * (0.5 + 0.5 * Math.cos((Math.PI * u) / 17));
  }
  return s;
}

/**
 * Lag (samples) of b relative to a: maximum of the windowed cross-correlation, searched at integer lags and
 * then refined on a 0.005-sample grid with sinc-interpolated b (a parabola through three integer lags is
 * biased by up to 0.1 sample on these sharp ghosted wavelets).
 */
function lag(a: ArrayLike<number>, b: ArrayLike<number>, centre: number, halfWindow: number, maxLag: number): number {
  const cc = (l: number) => {
    let s = 0;
    for (let i = centre - halfWindow; i <= centre + halfWindow; i++) s += a[i] * (Number.isInteger(l) ? b[i + l] : sincAt(b, i + l));
    return s;
  };
  let best = -maxLag;
  for (let l = -maxLag; l <= maxLag; l++) if (cc(l) > cc(best)) best = l;
  let fine = best, fineValue = cc(best);
  for (let l = best - 1; l <= best + 1; l += 0.005) {
    const v = cc(l);
    if (v > fineValue) { fineValue = v; fine = l; }
  }
  return fine;
}

/** Times (s) of every other event on one trace, to pick traces where the event of interest stands alone. */
function otherTimes(sc: DemoScenario, s: number, r: number, exclude: string): number[] {
  const t: Record<string, number> = { direct: directWaveTimeS(sc, s - r), seabed: seabedTimeS(sc, s, r), multiple: seabedMultipleTimeS(sc, s, r), diffraction: diffractionTimeS(sc, s, r) };
  sc.reflectors.forEach((refl, i) => (t[`r${i}`] = reflectorTimeS(sc, refl, s, r)));
  return Object.entries(t).filter(([k]) => k !== exclude).map(([, v]) => v);
}

describe('direct wave', () => {
  // Channels where no reflection from below the seabed or diffraction arrives within 40 ms of the direct wave.
  // The seabed reflection and its multiple travel in water too and approach the direct wave at long offsets
  // (t_seabed − x/v ≈ t0² v / 2x: 2 ms at 1.5 km), as in any shallow-water record; they stay in.
  const shot = 1;
  const isolated: number[] = [];
  for (let c = 10; c <= SC.nChannels; c++) {
    const g = line.geometry[shot * SC.nChannels + c - 1];
    const td = directWaveTimeS(SC, g.offsetM);
    const others = otherTimes(SC, g.sourceAlongM, g.receiverAlongM, 'direct');
    // otherTimes order: seabed, multiple, diffraction, reflectors
    if (others.slice(2).every((t) => Math.abs(t - td) > 0.04)) isolated.push(c);
  }

  it('has slope = group interval / 1500 m/s = 4.167 samples per trace (picked peaks, least-squares line)', () => {
    expect(isolated.length).toBeGreaterThan(20);
    // Picks in a wide window (±60 ms) around offset / 1500: the pick itself does not assume the slope.
    const xs: number[] = [], ts: number[] = [];
    for (const c of isolated) {
      const off = line.geometry[shot * SC.nChannels + c - 1].offsetM;
      const guess = Math.round(off / SC.waterVelocityMps / dtS);
      xs.push(c);
      ts.push(peakTime(trace(shot, c), guess - 30, guess + 30).t);
    }
    const n = xs.length, mx = xs.reduce((a, b) => a + b) / n, mt = ts.reduce((a, b) => a + b) / n;
    let sxx = 0, sxt = 0;
    for (let i = 0; i < n; i++) { sxx += (xs[i] - mx) ** 2; sxt += (xs[i] - mx) * (ts[i] - mt); }
    const slope = sxt / sxx;
    const expected = SC.groupIntervalM / 1500 / dtS; // 12.5 m / 1500 m/s / 2 ms
    expect(expected).toBeCloseTo(4.1667, 4);
    expect(Math.abs(slope - expected)).toBeLessThan(0.005);
  });

  it('falls in amplitude as 1/distance', () => {
    const a = isolated[0], b = isolated[isolated.length - 1];
    const ga = line.geometry[shot * SC.nChannels + a - 1], gb = line.geometry[shot * SC.nChannels + b - 1];
    const pa = peakTime(trace(shot, a), Math.round(directWaveTimeS(SC, ga.offsetM) / dtS) - 5, Math.round(directWaveTimeS(SC, ga.offsetM) / dtS) + 5);
    const pb = peakTime(trace(shot, b), Math.round(directWaveTimeS(SC, gb.offsetM) / dtS) - 5, Math.round(directWaveTimeS(SC, gb.offsetM) / dtS) + 5);
    expect(gb.offsetM / ga.offsetM).toBeGreaterThan(1.5);
    expect((pa.a / pb.a) / (gb.offsetM / ga.offsetM)).toBeGreaterThan(0.97);
    expect((pa.a / pb.a) / (gb.offsetM / ga.offsetM)).toBeLessThan(1.03);
  });
});

describe('reflection moveout', () => {
  // Local slope of the flat reflector at 0.19 s between channels c and c+1, measured by cross-correlation,
  // against the hyperbolic moveout t² = t0² + x²/v² ⇒ dt/dx = x/(v² t), in samples per trace.
  function slopeErrors(l: MarineLine): number[] {
    const refl = SC.reflectors[0];
    expect(refl.dT0dxSecondsPerM).toBe(0);
    const errors: number[] = [];
    for (let c = 2; c < SC.nChannels; c++) {
      const g = l.geometry[c - 1];
      const tS = reflectorTimeS(SC, refl, g.sourceAlongM, g.receiverAlongM);
      if (!otherTimes(SC, g.sourceAlongM, g.receiverAlongM, 'r0').every((t) => Math.abs(t - tS) > 0.05)) continue;
      const x = g.offsetM + SC.groupIntervalM / 2;
      const t = Math.sqrt(refl.t0Seconds ** 2 + (x / refl.vRmsMps) ** 2);
      const expected = ((x / (refl.vRmsMps ** 2 * t)) * SC.groupIntervalM) / dtS;
      const a = l.data.subarray((c - 1) * SC.nSamples, c * SC.nSamples);
      const b = l.data.subarray(c * SC.nSamples, (c + 1) * SC.nSamples);
      errors.push(lag(a, b, Math.round(tS / dtS), 12, 6) - expected);
    }
    return errors;
  }

  it('holds exactly on the kinematics (same line without ghosts and noise)', () => {
    const errors = slopeErrors(synthesizeMarineLine({ ...SC, noiseRelative: 0, surfaceReflectionCoefficient: 0 }));
    expect(errors.length).toBeGreaterThanOrEqual(8);
    for (const e of errors) expect(Math.abs(e)).toBeLessThan(0.005);
  });

  it('holds on the demo gather itself within the scatter its ghosts and noise cause', () => {
    // Ghosts change the waveform inside the fixed window (bias ≈ −0.03 sample/trace without noise); the noise
    // adds up to ≈ 0.1 on single pairs. Measured on this line: mean |error| 0.03, max 0.11 (10 channel pairs).
    const errors = slopeErrors(line);
    expect(errors.length).toBeGreaterThanOrEqual(8);
    expect(errors.reduce((s, e) => s + Math.abs(e), 0) / errors.length).toBeLessThan(0.06);
    for (const e of errors) expect(Math.abs(e)).toBeLessThan(0.15);
  });
});

describe('ghosts', () => {
  it('put the receiver-ghost notch at v / (2 d cosφ) ≈ 150 Hz for a 5 m streamer', () => {
    // A single noise-free trace with only the seabed, sampled finely: the ghosts are the only filter.
    const sc: DemoScenario = {
      ...SC, nShots: 1, nChannels: 1, nSamples: 4096, sampleIntervalUs: 250, peakFrequencyHz: 90, noiseRelative: 0,
      seabedDepthM: 200, seabedSlope: 0, reflectors: [], directWaveAmplitude: 0, diffractor: { ...SC.diffractor, amplitude: 0 },
    };
    const one = synthesizeMarineLine(sc);
    const dt = 250e-6;
    const s = one.geometry[0].sourceAlongM, r = one.geometry[0].receiverAlongM;
    const t0 = seabedTimeS(sc, s, r) / dt;
    // Window the primary and its ghosts (the multiple is 0.27 s later).
    const lo = Math.floor(t0 - 80), hi = Math.ceil(t0 + 160);
    const amp = (x: (i: number) => number, f: number) => {
      let re = 0, im = 0;
      for (let i = lo; i <= hi; i++) { re += x(i) * Math.cos(2 * Math.PI * f * i * dt); im -= x(i) * Math.sin(2 * Math.PI * f * i * dt); }
      return Math.hypot(re, im);
    };
    const fp = 90 * dt;
    let bestF = 0, bestRatio = Infinity;
    for (let f = 100; f <= 200; f += 0.25) {
      const ratio = amp((i) => one.data[i], f) / amp((i) => ricker(i - t0, fp), f);
      if (ratio < bestRatio) { bestRatio = ratio; bestF = f; }
    }
    // Emergence angle from the ray parameter p = x / (v² t) of the seabed reflection.
    const p = (s - r) / (1500 * 1500 * (t0 * dt));
    const cosPhi = Math.sqrt(1 - (p * 1500) ** 2);
    const expected = 1500 / (2 * sc.streamerDepthM * cosPhi);
    expect(Math.abs(bestF - expected)).toBeLessThan(1);
    expect(bestRatio).toBeLessThan(0.2); // a deep notch (|1 + R| = 0.05 for R = −0.95, times the source ghost)
  });
});

describe('noise', () => {
  it('has the stated RMS and is band-limited (little energy above 4× the peak frequency)', () => {
    // Before the first arrival on far channels there is only noise.
    const shot = 4, c = SC.nChannels;
    const g = line.geometry[shot * SC.nChannels + c - 1];
    const first = Math.min(directWaveTimeS(SC, g.offsetM), seabedTimeS(SC, g.sourceAlongM, g.receiverAlongM), diffractionTimeS(SC, g.sourceAlongM, g.receiverAlongM));
    const n = Math.floor(first / dtS) - 60;
    expect(n).toBeGreaterThan(300);
    const x = trace(shot, c).subarray(0, n);
    const rms = Math.sqrt(x.reduce((a, v) => a + v * v, 0) / n);
    const target = SC.noiseRelative * SC.seabedReflectionCoefficient;
    expect(rms / target).toBeGreaterThan(0.85);
    expect(rms / target).toBeLessThan(1.15);
    let low = 0, high = 0;
    for (let k = 1; k < n / 2; k++) {
      const f = k / (n * dtS);
      let re = 0, im = 0;
      for (let i = 0; i < n; i++) { re += x[i] * Math.cos((2 * Math.PI * k * i) / n); im -= x[i] * Math.sin((2 * Math.PI * k * i) / n); }
      if (f > 4 * SC.peakFrequencyHz) high += re * re + im * im; else low += re * re + im * im;
    }
    expect(high / (low + high)).toBeLessThan(0.01);
  });
});
