import { describe, expect, it } from 'vitest';
import { createRealFftPlan, realFftForward, realFftInverse, nextPowerOfTwo, complexFftForward, complexFftInverse } from '../../../../core/fft/real-fft';
import { lowpassTraces } from '../../../../core/fft/lowpass';
import { Rng } from '../../../../core/rng';

describe('typed fft.js wrapper', () => {
  // Checked against the DFT definition X_k = Σ x_n e^{−2πikn/N} (numpy.fft.fft convention).
  it.each([2, 8, 64])('real forward transform equals the naive DFT (n = %s), round trip returns the input', (n) => {
    const rng = new Rng(n);
    const x = new Float64Array(n).map(() => rng.normal());
    const plan = createRealFftPlan(n);
    const X = realFftForward(plan, new Float64Array(2 * n), x);
    for (let k = 0; k < n; k++) {
      let re = 0, im = 0;
      for (let j = 0; j < n; j++) { re += x[j] * Math.cos((-2 * Math.PI * k * j) / n); im += x[j] * Math.sin((-2 * Math.PI * k * j) / n); }
      expect(X[2 * k]).toBeCloseTo(re, 10);
      expect(X[2 * k + 1]).toBeCloseTo(im, 10);
    }
    const back = realFftInverse(plan, new Float64Array(n), X);
    for (let j = 0; j < n; j++) expect(back[j]).toBeCloseTo(x[j], 12);
    const c = new Float64Array(2 * n); for (let j = 0; j < n; j++) c[2 * j] = x[j];
    const C = complexFftForward(plan, new Float64Array(2 * n), c);
    for (let k = 0; k < 2 * n; k++) expect(C[k]).toBeCloseTo(X[k], 10);
    const cb = complexFftInverse(plan, new Float64Array(2 * n), C);
    for (let j = 0; j < n; j++) expect(cb[2 * j]).toBeCloseTo(x[j], 12);
  });

  it('refuses non-powers of two, wrong lengths and aliasing', () => {
    expect(() => createRealFftPlan(12)).toThrow(/power of two/);
    const p = createRealFftPlan(8);
    expect(() => realFftForward(p, new Float64Array(8), new Float64Array(8))).toThrow(RangeError);
    const buf = new Float64Array(24);
    expect(() => realFftForward(p, buf.subarray(0, 16), buf.subarray(16))).toThrow(/different/);
    expect(nextPowerOfTwo(1)).toBe(2);
    expect(nextPowerOfTwo(600)).toBe(1024);
  });
});

describe('trace low-pass', () => {
  it('keeps a sinusoid below the pass band and removes one above the stop band (interior samples)', () => {
    const nS = 300, nT = 2;
    const x = new Float64Array(nT * nS);
    for (let t = 0; t < nS; t++) { x[t] = Math.sin(2 * Math.PI * 0.04 * t); x[nS + t] = Math.sin(2 * Math.PI * 0.3 * t); }
    const y = lowpassTraces(x, nT, nS, 0.1, 0.15);
    let eKeep = 0, eGone = 0, n = 0;
    for (let t = 60; t < nS - 60; t++) { eKeep = Math.max(eKeep, Math.abs(y[t] - x[t])); eGone = Math.max(eGone, Math.abs(y[nS + t])); n++; }
    expect(eKeep).toBeLessThan(0.02);
    expect(eGone).toBeLessThan(0.02);
    expect(n).toBeGreaterThan(0);
  });

  it('two traces packed in one complex transform give the same result as each trace alone (odd count, zero trace)', () => {
    const rng = new Rng(9);
    const nS = 77;
    const x = new Float64Array(3 * nS).map(() => rng.normal());
    x.fill(0, nS, 2 * nS);
    const all = lowpassTraces(x, 3, nS, 0.1, 0.2);
    for (let tr = 0; tr < 3; tr++) {
      const one = lowpassTraces(x.slice(tr * nS, (tr + 1) * nS), 1, nS, 0.1, 0.2);
      for (let i = 0; i < nS; i++) expect(all[tr * nS + i]).toBeCloseTo(one[i], 12);
    }
  });

  it('is zero-phase: a symmetric pulse stays centred', () => {
    const nS = 101;
    const x = new Float64Array(nS); x[50] = 1;
    const y = lowpassTraces(x, 1, nS, 0.1, 0.2);
    for (let k = 1; k < 40; k++) expect(y[50 - k]).toBeCloseTo(y[50 + k], 12);
    expect(y.indexOf(Math.max(...y))).toBe(50);
  });
});
