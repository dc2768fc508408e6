// Gradient checks of the hand-written forward tangents and reverse pass against central finite differences in
// float64 (methods.md §4.4 asks for < 1e-5 relative; central differences: common practice, no source).
import { describe, expect, it } from 'vitest';
import {
  allocNetBatch, backwardTangent, backwardValue, forwardTangent, forwardValue, netBatchGradient, netEvaluate,
} from '../../../../core/nn/kernel';
import { buildNetModel, createNetScratch, initNetParams, type Activation, type NetModel } from '../../../../core/nn/network';
import { Rng } from '../../../../core/rng';

function smallModel(activation: Activation, seed: number, depth = 3): NetModel {
  const rng = new Rng(seed);
  const nFreq = 4;
  const omegaT = new Float64Array(nFreq).map(() => 6 * rng.normal());
  const omegaX = new Float64Array(nFreq).map(() => 3 * rng.normal());
  return buildNetModel({ width: 9, depth, activation }, omegaT, omegaX);
}

/** Parameter groups: [name, start, end). */
function groups(m: NetModel): [string, number, number][] {
  const g: [string, number, number][] = [];
  for (let l = 0; l < m.depth; l++) {
    g.push([`W${l + 1}`, m.weightOffset[l], m.biasOffset[l]]);
    g.push([`b${l + 1}`, m.biasOffset[l], m.biasOffset[l] + m.width]);
  }
  g.push(['w_out', m.outWeightOffset, m.outWeightOffset + m.width]);
  g.push(['c_out', m.outBiasOffset, m.outBiasOffset + 1]);
  return g;
}

/** Checks an analytic gradient against central differences, group by group, element by element. */
function checkGradient(m: NetModel, p: Float64Array, loss: (q: Float64Array) => number, grad: Float64Array, label: string, zeroGroup = '') {
  const h = 1e-6;
  const q = Float64Array.from(p);
  for (const [name, a, b] of groups(m)) {
    if (name === zeroGroup) {
      // A derivative does not depend on an additive constant: this group must be exactly zero, and FD agrees.
      for (let i = a; i < b; i++) expect(grad[i]).toBe(0);
      q[a] = p[a] + 1e-3;
      expect(loss(q)).toBeCloseTo(loss(p), 12);
      q[a] = p[a];
      continue;
    }
    let maxAbs = 0;
    for (let i = a; i < b; i++) maxAbs = Math.max(maxAbs, Math.abs(grad[i]));
    expect(maxAbs, `${label} ${name}: gradient is all zero, the check would be empty`).toBeGreaterThan(0);
    for (let i = a; i < b; i++) {
      q[i] = p[i] + h;
      const lp = loss(q);
      q[i] = p[i] - h;
      const lm = loss(q);
      q[i] = p[i];
      const fd = (lp - lm) / (2 * h);
      // Relative to the element, floored at 1e-3 of the group's largest entry (cancellation noise of tiny entries).
      const rel = Math.abs(fd - grad[i]) / Math.max(Math.abs(grad[i]), Math.abs(fd), 1e-3 * maxAbs);
      expect(rel, `${label} ${name}[${i - a}]: analytic ${grad[i]}, central difference ${fd}`).toBeLessThan(1e-5);
    }
  }
}

describe.each(['sin', 'tanh'] as Activation[])('network kernel, activation %s', (activation) => {
  it('forward tangents u_t̃ and u_x̃ match central differences of u', () => {
    const m = smallModel(activation, 1);
    const p = initNetParams(m, 2);
    const s = createNetScratch(m);
    const rng = new Rng(3);
    const out = new Float64Array(3);
    const h = 1e-6;
    for (let k = 0; k < 20; k++) {
      const t = 2 * rng.uniform() - 1;
      const x = 2 * rng.uniform() - 1;
      netEvaluate(out, m, p, t, x, s);
      const ft = (forwardValue(m, p, s, t + h, x) - forwardValue(m, p, s, t - h, x)) / (2 * h);
      const fx = (forwardValue(m, p, s, t, x + h) - forwardValue(m, p, s, t, x - h)) / (2 * h);
      expect(Math.abs(ft - out[1]) / Math.max(Math.abs(out[1]), 1e-3)).toBeLessThan(1e-6);
      expect(Math.abs(fx - out[2]) / Math.max(Math.abs(out[2]), 1e-3)).toBeLessThan(1e-6);
      expect(forwardValue(m, p, s, t, x)).toBe(out[0]);
    }
  });

  // Both derivative channels on their own (seed (1,0) = u_t̃, seed (0,1) = u_x̃), with value and tangent seeds
  // active together so the φ'' cross term is exercised.
  it.each([[1, 0, 'u_t channel'], [0, 1, 'u_x channel'], [0.37, 1, 'residual direction']] as [number, number, string][])(
    'reverse pass through value and tangent, seed (%s, %s): %s', (dirT, dirX, label) => {
      const m = smallModel(activation, 5);
      const rng = new Rng(6);
      const p = initNetParams(m, 7).map((v) => v + 0.1 * rng.normal());
      const s = createNetScratch(m);
      const pts = Array.from({ length: 7 }, () => [2 * rng.uniform() - 1, 2 * rng.uniform() - 1]);
      const alpha = 0.7;
      const loss = (q: Float64Array) => {
        let l = 0;
        for (const [t, x] of pts) {
          const ud = forwardTangent(m, q, s, t, x, dirT, dirX);
          l += alpha * s.uv[0] + ud * ud;
        }
        return l;
      };
      const g = new Float64Array(m.nParams);
      for (const [t, x] of pts) {
        const ud = forwardTangent(m, p, s, t, x, dirT, dirX);
        backwardTangent(m, p, s, alpha, 2 * ud, g);
      }
      checkGradient(m, p, loss, g, label);
    });

  // Dot-product test of the linearised network J: θ → (u at 6 points) against the reverse pass Jᵀ:
  // <J δθ, r> = <δθ, Jᵀ r>, with J δθ by central differences along δθ (so the tolerance is the differencing one).
  it('dot-product test: reverse pass is the adjoint of the linearised forward map', () => {
    const m = smallModel(activation, 13);
    const rng = new Rng(14);
    const p = initNetParams(m, 15);
    const s = createNetScratch(m);
    const pts = Array.from({ length: 6 }, () => [2 * rng.uniform() - 1, 2 * rng.uniform() - 1]);
    const dtheta = new Float64Array(m.nParams).map(() => rng.normal());
    const r = pts.map(() => rng.normal());
    const h = 1e-6;
    const qp = p.map((v, i) => v + h * dtheta[i]);
    const qm = p.map((v, i) => v - h * dtheta[i]);
    let lhs = 0;
    pts.forEach(([t, x], k) => (lhs += r[k] * (forwardValue(m, qp, s, t, x) - forwardValue(m, qm, s, t, x)) / (2 * h)));
    const jtr = new Float64Array(m.nParams);
    pts.forEach(([t, x], k) => {
      forwardValue(m, p, s, t, x);
      backwardValue(m, p, s, r[k], jtr);
    });
    const rhs = dtheta.reduce((a, v, i) => a + v * jtr[i], 0);
    expect(Math.abs(lhs - rhs) / Math.max(Math.abs(lhs), Math.abs(rhs))).toBeLessThan(1e-7);
  });

  it('value-only reverse pass', () => {
    const m = smallModel(activation, 8, 2);
    const p = initNetParams(m, 9);
    const s = createNetScratch(m);
    const loss = (q: Float64Array) => forwardValue(m, q, s, 0.3, -0.6) ** 2;
    const g = new Float64Array(m.nParams);
    const u = forwardValue(m, p, s, 0.3, -0.6);
    backwardValue(m, p, s, 2 * u, g);
    checkGradient(m, p, loss, g, 'value');
  });

  it('batch kernel: data and plane-wave terms with their gradient sums; sub-ranges add up to the whole', () => {
    const m = smallModel(activation, 10);
    const rng = new Rng(11);
    const p = initNetParams(m, 12).map((v) => v + 0.05 * rng.normal());
    const s = createNetScratch(m);
    const b = allocNetBatch(9, 8, true);
    b.nData = 9;
    b.nColloc = 8;
    for (let k = 0; k < 9; k++) {
      b.dataT[k] = 2 * rng.uniform() - 1;
      b.dataX[k] = 2 * rng.uniform() - 1;
      b.dataTarget[k] = rng.normal();
      b.dataWeight![k] = 0.5 + rng.uniform();
    }
    for (let k = 0; k < 8; k++) {
      b.collocT[k] = 2 * rng.uniform() - 1;
      b.collocX[k] = 2 * rng.uniform() - 1;
      b.collocSlope[k] = 3 * rng.normal();
    }
    const sums = new Float64Array(2);
    const gd = new Float64Array(m.nParams);
    const gp = new Float64Array(m.nParams);
    netBatchGradient(sums, gd, gp, m, p, b, 0, 9, 0, 8, s);
    const term = (i: number) => (q: Float64Array) =>
      netBatchGradient(new Float64Array(2), new Float64Array(m.nParams), new Float64Array(m.nParams), m, q, b, 0, 9, 0, 8, s)[i];
    checkGradient(m, p, term(0), gd, 'data term');
    checkGradient(m, p, term(1), gp, 'plane-wave term', 'c_out');
    // Residual by definition: u_x̃ + σ̃ u_t̃ from the two separate channels.
    const out = new Float64Array(3);
    let pde = 0;
    for (let k = 0; k < 8; k++) {
      netEvaluate(out, m, p, b.collocT[k], b.collocX[k], s);
      pde += (out[2] + b.collocSlope[k] * out[1]) ** 2;
    }
    expect(Math.abs(pde - sums[1]) / sums[1]).toBeLessThan(1e-12);
    // Splitting the batch (as workers do) gives the same sums to rounding.
    const s2 = new Float64Array(2);
    const gd2 = new Float64Array(m.nParams);
    const gp2 = new Float64Array(m.nParams);
    netBatchGradient(s2, gd2, gp2, m, p, b, 0, 4, 0, 3, s);
    netBatchGradient(s2, gd2, gp2, m, p, b, 4, 9, 3, 8, s);
    expect(Math.abs(s2[0] - sums[0]) / sums[0]).toBeLessThan(1e-13);
    for (let i = 0; i < m.nParams; i++) expect(Math.abs(gp2[i] - gp[i])).toBeLessThan(1e-12 * (1 + Math.abs(gp[i])));
  });
});
