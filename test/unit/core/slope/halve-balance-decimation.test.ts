import { describe, expect, it } from 'vitest';
import { halveTime, halfBandTap } from '../../../../core/slope/halve';
import { balanceAmplitudes } from '../../../../core/slope/balance';
import { coarseGridOf, coarsePairsToFinePairs, detectDecimationFactor, extractCoarse } from '../../../../core/slope/decimation';
import { npyHeaderFloat32, NPY_HEADER_BYTES } from '../../../../core/slope/npy';

describe('half-band time decimation', () => {
  // Half-band filter design facts (common practice, no source): zero at every even tap except the centre, unit DC gain,
  // so a sinusoid well inside the pass band survives decimation and one near the old Nyquist is removed.
  it('taps: even taps other than the centre vanish, symmetric, unit sum', () => {
    let sum = 0;
    for (let k = -11; k <= 11; k++) {
      sum += halfBandTap(k);
      expect(halfBandTap(k)).toBeCloseTo(halfBandTap(-k), 15);
      if (k !== 0 && k % 2 === 0) expect(halfBandTap(k)).toBe(0);
    }
    expect(sum).toBeCloseTo(1, 14);
  });

  it('keeps 0.05 cycles/sample (to 1 %) and removes 0.45 cycles/sample (below 1 %) away from the ends', () => {
    const nS = 400;
    const x = new Float64Array(2 * nS);
    for (let t = 0; t < nS; t++) { x[t] = Math.cos(2 * Math.PI * 0.05 * t); x[nS + t] = Math.cos(2 * Math.PI * 0.45 * t); }
    const h = halveTime(x, 2, nS);
    expect(h.nSamples).toBe(200);
    for (let j = 20; j < 180; j++) {
      expect(Math.abs(h.data[j] - Math.cos(2 * Math.PI * 0.05 * 2 * j))).toBeLessThan(0.01);
      expect(Math.abs(h.data[200 + j])).toBeLessThan(0.01);
    }
  });
});

describe('amplitude balance', () => {
  it('brings a trace decaying by 60 dB to about unit level and keeps zero traces zero', () => {
    const nS = 500;
    const u = new Float64Array(2 * nS);
    for (let t = 0; t < nS; t++) u[t] = Math.sin(0.3 * t) * 10 ** (-3 * (t / nS));
    const b = balanceAmplitudes(u, 2, nS, 20, 1);
    const rms = (a: number, z: number) => { let s = 0; for (let t = a; t < z; t++) s += b[t] * b[t]; return Math.sqrt(s / (z - a)); };
    expect(rms(50, 100)).toBeGreaterThan(0.6);
    expect(rms(400, 450)).toBeGreaterThan(0.6);
    expect(rms(400, 450) / rms(50, 100)).toBeGreaterThan(0.8);
    for (let t = 0; t < nS; t++) expect(b[nS + t]).toBe(0);
  });
});

describe('decimation grid', () => {
  it('detects the factor from the live mask, tolerating a missing coarse trace', () => {
    const live = new Uint8Array(31);
    for (let x = 1; x < 31; x += 3) live[x] = 1;
    expect(detectDecimationFactor(live)).toBe(3);
    live[10] = 0; // a gap on the coarse grid
    expect(detectDecimationFactor(live)).toBe(3);
    expect(detectDecimationFactor(new Uint8Array(10).fill(1))).toBe(1);
    const g = coarseGridOf(live, 3);
    expect(g.phase).toBe(1);
    expect(Array.from(g.fineIndex)).toEqual([1, 4, 7, 10, 13, 16, 19, 22, 25, 28]);
    const c = extractCoarse(new Float64Array(31 * 2).map((_, i) => i), 2, g, live);
    expect(Array.from(c.live)).toEqual([1, 1, 1, 0, 1, 1, 1, 1, 1, 1]);
    expect(c.data[2]).toBe(8); // trace 4, sample 0
  });

  // σ_f = σ_c / k at fine pair positions p + ½, linear along x (methods.md §2.6, §3.4): exact for a coarse field that
  // is linear in position, between the first and last coarse pair positions.
  it('maps a field linear in position exactly onto the fine pairs, divided by k', () => {
    const k = 4, nFine = 29, nS = 2;
    const live = new Uint8Array(nFine);
    for (let x = 0; x < nFine; x += k) live[x] = 1;
    const g = coarseGridOf(live, k);
    const nc = g.fineIndex.length - 1;
    const f = (pos: number, t: number) => 0.1 * pos + t;
    const coarse = new Float64Array(nc * nS);
    for (let j = 0; j < nc; j++) for (let t = 0; t < nS; t++) coarse[j * nS + t] = f(g.phase + j * k + k / 2, t);
    const fine = coarsePairsToFinePairs(new Float64Array((nFine - 1) * nS), coarse, g, nFine, nS, 1 / k);
    for (let p = 2; p < nFine - 3; p++) for (let t = 0; t < nS; t++) expect(fine[p * nS + t]).toBeCloseTo(f(p + 0.5, t) / k, 12);
  });
});

describe('npy header (NEP 1, format version 1.0)', () => {
  it('magic, version, little-endian header length, dict, 64-byte aligned data start', () => {
    const h = npyHeaderFloat32([22, 40]);
    expect(h.length).toBe(NPY_HEADER_BYTES);
    expect(Array.from(h.slice(0, 8))).toEqual([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0]);
    expect(h[8] + 256 * h[9]).toBe(NPY_HEADER_BYTES - 10);
    const dict = String.fromCharCode(...h.slice(10));
    expect(dict).toMatch(/^\{'descr': '<f4', 'fortran_order': False, 'shape': \(22, 40\), \} *\n$/);
    expect(NPY_HEADER_BYTES % 64).toBe(0);
  });
});
