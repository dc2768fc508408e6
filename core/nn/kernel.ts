/**
 * Per-point forward and reverse passes of the coordinate network (core/nn/network.ts), and the batch-gradient
 * kernel that any worker type can run: (model, parameters, batch) → loss sums and gradient sums.
 *
 * Derivatives (methods.md §4.4): one forward tangent channel along a seed direction (dt̃, dx̃) gives the
 * directional derivative u_t̃·dt̃ + u_x̃·dx̃. With the seed (σ̃, 1) that is exactly the plane-wave residual
 * r = u_x̃ + σ̃ u_t̃, so the loss needs one tangent channel, not two (a third less work); seeds (1, 0) and (0, 1)
 * give u_t̃ and u_x̃ separately (netEvaluate). The reverse pass runs through values and tangents:
 *   a_{l−1} = φ'(z)⊙ā + φ''(z)⊙ż⊙ȧ ,  ȧ_{l−1} = φ'(z)⊙ȧ ,  ∂W += a hᵀ + ȧ ḣᵀ ,  ∂b += a.
 * All functions here are unchecked and allocation-free: sizes come from the model, buffers from NetScratch.
 */
import type { NetModel, NetScratch } from './network';

/** Value channel only. Leaves h and φ' per layer in the scratch for backwardValue. @returns u */
export function forwardValue(model: NetModel, p: Float64Array, s: NetScratch, tN: number, xN: number): number {
  const { nFreq, omegaT, omegaX, width, depth } = model;
  const h0 = s.h[0];
  for (let j = 0; j < nFreq; j++) {
    const ph = omegaT[j] * tN + omegaX[j] * xN;
    h0[2 * j] = Math.sin(ph);
    h0[2 * j + 1] = Math.cos(ph);
  }
  const isSin = model.activation === 'sin';
  for (let l = 0; l < depth; l++) {
    const hin = s.h[l];
    const hout = s.h[l + 1];
    const dphi = s.dphi[l];
    const nIn = l === 0 ? 2 * nFreq : width;
    const wo = model.weightOffset[l];
    const bo = model.biasOffset[l];
    for (let o = 0; o < width; o++) {
      let z = p[bo + o];
      const row = wo + o * nIn;
      for (let i = 0; i < nIn; i++) z += p[row + i] * hin[i];
      if (isSin) {
        hout[o] = Math.sin(z);
        dphi[o] = Math.cos(z);
      } else {
        const hv = Math.tanh(z);
        hout[o] = hv;
        dphi[o] = 1 - hv * hv;
      }
    }
  }
  const hL = s.h[depth];
  const ow = model.outWeightOffset;
  let u = p[model.outBiasOffset];
  for (let o = 0; o < width; o++) u += p[ow + o] * hL[o];
  s.uv[0] = u;
  s.uv[1] = 0;
  return u;
}

/** Adds gu·∂u/∂θ to g, after forwardValue at the same point. */
export function backwardValue(model: NetModel, p: Float64Array, s: NetScratch, gu: number, g: Float64Array): void {
  const { width, depth, nFreq } = model;
  const abar = s.abar;
  const a = s.a;
  const hL = s.h[depth];
  const ow = model.outWeightOffset;
  for (let o = 0; o < width; o++) {
    g[ow + o] += gu * hL[o];
    abar[o] = gu * p[ow + o];
  }
  g[model.outBiasOffset] += gu;
  for (let l = depth - 1; l >= 0; l--) {
    const dphi = s.dphi[l];
    for (let o = 0; o < width; o++) a[o] = dphi[o] * abar[o];
    const hin = s.h[l];
    const nIn = l === 0 ? 2 * nFreq : width;
    const wo = model.weightOffset[l];
    const bo = model.biasOffset[l];
    if (l > 0) {
      for (let i = 0; i < nIn; i++) abar[i] = 0;
      for (let o = 0; o < width; o++) {
        const ao = a[o];
        g[bo + o] += ao;
        const row = wo + o * nIn;
        for (let i = 0; i < nIn; i++) {
          g[row + i] += ao * hin[i];
          abar[i] += p[row + i] * ao;
        }
      }
    } else {
      for (let o = 0; o < width; o++) {
        const ao = a[o];
        g[bo + o] += ao;
        const row = wo + o * nIn;
        for (let i = 0; i < nIn; i++) g[row + i] += ao * hin[i];
      }
    }
  }
}

/**
 * Value and one tangent channel along (dirT, dirX) in scaled coordinates. Writes [u, u̇] to s.uv.
 * @returns u̇ = u_t̃·dirT + u_x̃·dirX
 */
export function forwardTangent(model: NetModel, p: Float64Array, s: NetScratch, tN: number, xN: number, dirT: number, dirX: number): number {
  const { nFreq, omegaT, omegaX, width, depth } = model;
  const h0 = s.h[0];
  const hd0 = s.hd[0];
  for (let j = 0; j < nFreq; j++) {
    const ph = omegaT[j] * tN + omegaX[j] * xN;
    const sn = Math.sin(ph);
    const cs = Math.cos(ph);
    const dd = omegaT[j] * dirT + omegaX[j] * dirX;
    h0[2 * j] = sn;
    h0[2 * j + 1] = cs;
    hd0[2 * j] = cs * dd;
    hd0[2 * j + 1] = -sn * dd;
  }
  const isSin = model.activation === 'sin';
  for (let l = 0; l < depth; l++) {
    const hin = s.h[l];
    const hdin = s.hd[l];
    const hout = s.h[l + 1];
    const hdout = s.hd[l + 1];
    const dphi = s.dphi[l];
    const zd = s.zd[l];
    const nIn = l === 0 ? 2 * nFreq : width;
    const wo = model.weightOffset[l];
    const bo = model.biasOffset[l];
    for (let o = 0; o < width; o++) {
      let z = p[bo + o];
      let zt = 0;
      const row = wo + o * nIn;
      for (let i = 0; i < nIn; i++) {
        const w = p[row + i];
        z += w * hin[i];
        zt += w * hdin[i];
      }
      let hv: number;
      let dv: number;
      if (isSin) {
        hv = Math.sin(z);
        dv = Math.cos(z);
      } else {
        hv = Math.tanh(z);
        dv = 1 - hv * hv;
      }
      hout[o] = hv;
      dphi[o] = dv;
      zd[o] = zt;
      hdout[o] = dv * zt;
    }
  }
  const hL = s.h[depth];
  const hdL = s.hd[depth];
  const ow = model.outWeightOffset;
  let u = p[model.outBiasOffset];
  let ud = 0;
  for (let o = 0; o < width; o++) {
    u += p[ow + o] * hL[o];
    ud += p[ow + o] * hdL[o];
  }
  s.uv[0] = u;
  s.uv[1] = ud;
  return ud;
}

/** Adds gu·∂u/∂θ + gud·∂u̇/∂θ to g, after forwardTangent at the same point. φ'' is included. */
export function backwardTangent(model: NetModel, p: Float64Array, s: NetScratch, gu: number, gud: number, g: Float64Array): void {
  const { width, depth, nFreq } = model;
  const isSin = model.activation === 'sin';
  const { abar, adbar, a, ad } = s;
  const hL = s.h[depth];
  const hdL = s.hd[depth];
  const ow = model.outWeightOffset;
  for (let o = 0; o < width; o++) {
    const w = p[ow + o];
    g[ow + o] += gu * hL[o] + gud * hdL[o];
    abar[o] = gu * w;
    adbar[o] = gud * w;
  }
  g[model.outBiasOffset] += gu;
  for (let l = depth - 1; l >= 0; l--) {
    const dphi = s.dphi[l];
    const zd = s.zd[l];
    const hout = s.h[l + 1];
    for (let o = 0; o < width; o++) {
      const d1 = dphi[o];
      // φ'' from stored values: sin'' = −sin = −h; tanh'' = −2h(1−h²) = −2h·φ'.
      const d2 = isSin ? -hout[o] : -2 * hout[o] * d1;
      a[o] = d1 * abar[o] + d2 * zd[o] * adbar[o];
      ad[o] = d1 * adbar[o];
    }
    const hin = s.h[l];
    const hdin = s.hd[l];
    const nIn = l === 0 ? 2 * nFreq : width;
    const wo = model.weightOffset[l];
    const bo = model.biasOffset[l];
    if (l > 0) {
      for (let i = 0; i < nIn; i++) {
        abar[i] = 0;
        adbar[i] = 0;
      }
      for (let o = 0; o < width; o++) {
        const ao = a[o];
        const ado = ad[o];
        g[bo + o] += ao;
        const row = wo + o * nIn;
        for (let i = 0; i < nIn; i++) {
          const w = p[row + i];
          g[row + i] += ao * hin[i] + ado * hdin[i];
          abar[i] += w * ao;
          adbar[i] += w * ado;
        }
      }
    } else {
      for (let o = 0; o < width; o++) {
        const ao = a[o];
        const ado = ad[o];
        g[bo + o] += ao;
        const row = wo + o * nIn;
        for (let i = 0; i < nIn; i++) g[row + i] += ao * hin[i] + ado * hdin[i];
      }
    }
  }
}

/**
 * One training batch in scaled coordinates. Data points carry a target (and an optional weight); collocation
 * points carry σ̃, the slope in scaled coordinates (σ̃ = σ·(nx−1)/(nt−1), methods.md §4.3).
 * Only typed arrays and numbers: it crosses postMessage as is.
 */
export interface NetBatch {
  nData: number;
  dataT: Float64Array;
  dataX: Float64Array;
  dataTarget: Float64Array;
  /** Per-point weight, or null for 1. */
  dataWeight: Float64Array | null;
  nColloc: number;
  collocT: Float64Array;
  collocX: Float64Array;
  collocSlope: Float64Array;
}

export function allocNetBatch(maxData: number, maxColloc: number, weighted = false): NetBatch {
  return {
    nData: 0,
    dataT: new Float64Array(maxData),
    dataX: new Float64Array(maxData),
    dataTarget: new Float64Array(maxData),
    dataWeight: weighted ? new Float64Array(maxData) : null,
    nColloc: 0,
    collocT: new Float64Array(maxColloc),
    collocX: new Float64Array(maxColloc),
    collocSlope: new Float64Array(maxColloc),
  };
}

/**
 * The batch-gradient kernel. For data points [d0, d1) and collocation points [c0, c1):
 *   sums[0] += Σ w (u − d)²          gradData += ∂/∂θ of that sum
 *   sums[1] += Σ (u_x̃ + σ̃ u_t̃)²      gradPde  += ∂/∂θ of that sum
 * Sums, not means: the caller normalises, so sub-batches from several workers simply add up.
 * Unchecked and allocation-free. @returns sums
 */
export function netBatchGradient(
  sums: Float64Array, gradData: Float64Array, gradPde: Float64Array,
  model: NetModel, p: Float64Array, batch: NetBatch,
  d0: number, d1: number, c0: number, c1: number, s: NetScratch,
): Float64Array {
  const { dataT, dataX, dataTarget, dataWeight, collocT, collocX, collocSlope } = batch;
  let dataSum = 0;
  for (let k = d0; k < d1; k++) {
    const u = forwardValue(model, p, s, dataT[k], dataX[k]);
    const w = dataWeight === null ? 1 : dataWeight[k];
    const e = u - dataTarget[k];
    dataSum += w * e * e;
    backwardValue(model, p, s, 2 * w * e, gradData);
  }
  let pdeSum = 0;
  for (let k = c0; k < c1; k++) {
    const r = forwardTangent(model, p, s, collocT[k], collocX[k], collocSlope[k], 1);
    pdeSum += r * r;
    backwardTangent(model, p, s, 0, 2 * r, gradPde);
  }
  sums[0] += dataSum;
  sums[1] += pdeSum;
  return sums;
}

/**
 * u, u_t̃ and u_x̃ at one point (two tangent passes). out = [u, u_t̃, u_x̃]. @returns out
 */
export function netEvaluate(out: Float64Array, model: NetModel, p: Float64Array, tN: number, xN: number, s: NetScratch): Float64Array {
  out[1] = forwardTangent(model, p, s, tN, xN, 1, 0);
  out[0] = s.uv[0];
  out[2] = forwardTangent(model, p, s, tN, xN, 0, 1);
  return out;
}
