/**
 * The block hold-out re-estimates slopes on a window around the hidden block only (core/fill/fill-slopes.ts).
 * Check against the whole-gather re-estimate it replaces, on analytic hyperbolas (core/synth/events.ts): the
 * pairs the hold-out fill reads agree with it, and with the exact slopes, about as well as the whole-gather
 * estimate does; all other pairs keep the gather's own slopes.
 */
import { describe, expect, it } from 'vitest';
import { holdoutSlopesNearBlock, slopeEstimator, slopesForFill } from '../../../../core/fill/fill-slopes';
import { addHyperbola, hyperbolaSlopeField, type HyperbolaSpec } from '../../../../core/synth/events';

describe('hold-out slopes near a hidden block', () => {
  it('match a whole-gather re-estimate on the block pairs and leave other pairs alone', () => {
    const nT = 120, nS = 400;
    const events: HyperbolaSpec[] = [0.25, 0.5, 0.75].map((f) => ({ t0Samples: f * nS, velocityTracesPerSample: 1, apexTrace: 0, fpCyclesPerSample: 0.08 }));
    const u = new Float64Array(nT * nS);
    for (const e of events) addHyperbola(u, nT, nS, e);
    const exact = hyperbolaSlopeField(new Float64Array((nT - 1) * nS), Array.from({ length: nT - 1 }, (_, p) => p + 0.5), nS, events);
    const gap = Array.from({ length: 16 }, (_, i) => 52 + i);
    const hidden = Array.from({ length: 16 }, (_, i) => 20 + i);
    const unk = new Uint8Array(nT), unkH = new Uint8Array(nT);
    for (const g of gap) unk[g] = unkH[g] = 1;
    for (const h of hidden) unkH[h] = 1;
    const d = Float64Array.from(u), dH = Float64Array.from(u);
    for (const g of gap) { d.fill(0, g * nS, (g + 1) * nS); dH.fill(0, g * nS, (g + 1) * nS); }
    for (const h of hidden) dH.fill(0, h * nS, (h + 1) * nS);
    const est = slopeEstimator();
    const main = slopesForFill(d, nT, nS, unk, est, 1);
    const whole = slopesForFill(dH, nT, nS, unkH, est, 1);
    const near = holdoutSlopesNearBlock(main, dH, nT, nS, unkH, hidden, est);
    // Pairs read by the hold-out fill: 19..35 (beside and inside the block); rms error against the exact slopes
    // near events (|u| above 10 % of the peak), whole-gather re-estimate versus window.
    let peak = 0;
    for (const v of u) peak = Math.max(peak, Math.abs(v));
    const rmsErr = (s: Float64Array) => {
      let e = 0, n = 0;
      for (let p = 19; p <= 35; p++) for (let t = 20; t < nS - 20; t++) {
        if (Math.abs(u[p * nS + t]) + Math.abs(u[(p + 1) * nS + t]) < 0.1 * peak) continue; // truth, hidden or not
        e += (s[p * nS + t] - exact[p * nS + t]) ** 2;
        n++;
      }
      return Math.sqrt(e / n);
    };
    const eWhole = rmsErr(whole), eNear = rmsErr(near);
    expect(eNear).toBeLessThan(Math.max(1.5 * eWhole, eWhole + 0.02));
    // Outside the replaced pairs (15..39) the gather's own slopes are kept.
    for (let p = 0; p < nT - 1; p++) {
      if (p >= 15 && p <= 39) continue;
      for (let t = 0; t < nS; t += 37) expect(near[p * nS + t]).toBe(main[p * nS + t]);
    }
    console.log(`hold-out slopes near a block: rms error ${eNear.toFixed(4)} (window) vs ${eWhole.toFixed(4)} (whole gather) samples per trace`);
  });
});
