/**
 * Slope estimation by plane-wave destruction at one resolution (Fomel 2002 "Slope estimation"; shaping after
 * Fomel 2007; methods.md §2.1–2.3): regularised Gauss-Newton whose Jacobian is diagonal, so each step is a
 * smooth division. The unknown is the deviation from a prior, δ = σ − σ_prior, so where the data say nothing
 * (zero weight: stencils touching a missing trace, run-off at the ends of the traces, dead zones) the shaping
 * pulls δ to 0 and σ falls back to the prior, not to zero.
 *   repeat outer: r = C(σ)u, g = ∂r/∂σ, w = stencil weight
 *                 num = w g (g (σ − σ_prior) − r) [+ w_obs λ² (σ_obs − σ_prior)],  den = w g² [+ w_obs λ²]
 *                 δ = smoothDivide(num, den);  σ ← clip(σ_prior + δ, σ ± stepLimit)
 * Layout: u trace-major; σ, prior, shift on the pair grid (core/slope/pair-grid.ts).
 */
import type { PwdOrder } from '../pwd/maxflat';
import { throwIfCancelled, type CancelToken } from '../problems';
import { destructionResidualAndSlopeDerivativeUnchecked, destructionSideEnergyUnchecked } from './destruction';
import { smoothDivideUnchecked, type SmoothDivideWorkspace } from './smooth-divide';
import { createTriangle2D, triangle2DApply, type Triangle2D } from './triangle';

export interface GaussNewtonSettings {
  readonly order: PwdOrder;
  readonly outerIterations: number;
  readonly innerIterations: number;
  /** Largest change of σ per outer iteration, samples per trace. */
  readonly stepLimit: number;
  readonly radiusTimeSamples: number;
  readonly radiusTraces: number;
  /** Stop after a step (from the second on) whose rms change of σ over fitted samples is below this (samples per trace). */
  readonly convergedStep?: number;
}

export interface SlopeObservations {
  /** Target slopes on the pair grid. */
  readonly value: Float64Array;
  /** Weight in [0, 1] per pair sample, relative to the data term's mean (λ²). */
  readonly weight: Float64Array;
}

export interface GaussNewtonWorkspace {
  readonly nTraces: number;
  readonly nSamples: number;
  readonly r: Float64Array;
  readonly g: Float64Array;
  readonly w: Float64Array;
  readonly num: Float64Array;
  readonly den: Float64Array;
  readonly delta: Float64Array;
  readonly divide: SmoothDivideWorkspace;
}

/**
 * Allocates the workspace, or carves it out of a larger one (`reuse`, e.g. the finest level's) so coarse-to-fine
 * levels share memory: views only, no copies.
 */
export function createGaussNewtonWorkspace(nTraces: number, nSamples: number, radiusTimeSamples: number, radiusTraces: number, reuse?: GaussNewtonWorkspace): GaussNewtonWorkspace {
  const n = (nTraces - 1) * nSamples;
  const take = (a: Float64Array | undefined): Float64Array => (a && a.length >= n ? new Float64Array(a.buffer, a.byteOffset, n) : new Float64Array(n));
  const len = Math.max(nSamples + radiusTimeSamples, (nTraces - 1 + radiusTraces) * nSamples);
  const old = reuse?.divide.smoother.scratch;
  const tri: Triangle2D = {
    nCols: nTraces - 1, nSamples, radiusTime: radiusTimeSamples, radiusAcross: radiusTraces,
    scratch: old && old.length >= len ? old : createTriangle2D(nTraces - 1, nSamples, radiusTimeSamples, radiusTraces).scratch,
  };
  const d = reuse?.divide;
  return {
    nTraces, nSamples,
    r: take(reuse?.r), g: take(reuse?.g), w: take(reuse?.w),
    num: take(reuse?.num), den: take(reuse?.den), delta: take(reuse?.delta),
    divide: { smoother: tri, p: take(d?.p), resid: take(d?.resid), dir: take(d?.dir), aDir: take(d?.aDir), tmp: take(d?.tmp) },
  };
}

export interface GaussNewtonReport {
  outerIterations: number;
  innerIterations: number;
  /** Mean of w g² (λ²) at the last step; 0 when no sample carried an equation. */
  lambdaSquared: number;
  /** Σ r² / Σ u² over weighted stencils at the start and at the end. */
  residualStart: number;
  residualEnd: number;
}

function residualEnergy(ws: GaussNewtonWorkspace): number {
  let s = 0;
  const { r, w } = ws;
  for (let i = 0; i < r.length; i++) s += w[i] * r[i] * r[i];
  return s;
}

/**
 * Refines sigma (in place, pair grid) from its current value toward the data, relative to prior.
 * sigma and prior must not alias. shift: frozen integer part (or null). Allocation-free in its loops.
 */
export function gaussNewtonSlopes(
  ws: GaussNewtonWorkspace, sigma: Float64Array, u: ArrayLike<number>, pairLive: Uint8Array, prior: Float64Array,
  shift: Int32Array | null, s: GaussNewtonSettings, observations?: SlopeObservations, cancel?: CancelToken,
): GaussNewtonReport {
  const { nTraces, nSamples, r, g, w, num, den, delta } = ws;
  const n = (nTraces - 1) * nSamples;
  let uEnergy = 0;
  for (let i = 0; i < nTraces * nSamples; i++) uEnergy += u[i] * u[i];
  uEnergy = Math.max(uEnergy, 1e-300);
  ws.divide.p.fill(0);
  let inner = 0;
  let lambda2 = 0;
  let res0 = NaN;
  let outer = 0;
  for (; outer < s.outerIterations; outer++) {
    throwIfCancelled(cancel);
    destructionResidualAndSlopeDerivativeUnchecked(r, g, w, u, sigma, shift, pairLive, nTraces, nSamples, s.order);
    if (outer === 0) res0 = residualEnergy(ws) / uEnergy;
    let sumDen = 0, count = 0;
    for (let i = 0; i < n; i++) {
      const wi = w[i], gi = g[i];
      num[i] = wi * gi * (gi * (sigma[i] - prior[i]) - r[i]);
      const d = wi * gi * gi;
      den[i] = d;
      if (wi > 0) { sumDen += d; count++; }
    }
    lambda2 = count > 0 ? sumDen / count : 0;
    if (!(lambda2 > 0)) break;
    if (observations) {
      const { value, weight } = observations;
      for (let i = 0; i < n; i++) {
        const wo = weight[i];
        if (wo > 0) {
          num[i] += wo * lambda2 * (value[i] - prior[i]);
          den[i] += wo * lambda2;
        }
      }
    }
    const rep = smoothDivideUnchecked(ws.divide, delta, num, den, s.innerIterations, 1e-6, lambda2);
    inner += rep.iterations;
    const lim = s.stepLimit;
    let step2 = 0;
    for (let i = 0; i < n; i++) {
      const target = prior[i] + delta[i];
      const old = sigma[i];
      const v = target > old + lim ? old + lim : target < old - lim ? old - lim : target;
      sigma[i] = v;
      if (w[i] > 0) step2 += (v - old) * (v - old);
    }
    // Converged: the step moved the fitted slopes by less than convergedStep (rms, samples per trace).
    if (outer >= 1 && s.convergedStep !== undefined && count > 0 && Math.sqrt(step2 / count) < s.convergedStep) { outer++; break; }
  }
  destructionResidualAndSlopeDerivativeUnchecked(r, g, w, u, sigma, shift, pairLive, nTraces, nSamples, s.order);
  const res1 = residualEnergy(ws) / uEnergy;
  return { outerIterations: outer, innerIterations: inner, lambdaSquared: lambda2, residualStart: Number.isNaN(res0) ? res1 : res0, residualEnd: res1 };
}

/**
 * Confidence from the normalised destruction residual (pair grid, [0, 1]):
 *   c = 1 − T(w r²) / T(w e),  e = energy of the two filtered sides (destruction.ts),
 * 1 for a perfectly destroyed plane wave, about 0 for incoherent traces; 0 where no stencil fits.
 * Allocates its scratch unless a Gauss-Newton workspace of this size is passed (its buffers are overwritten).
 */
export function destructionConfidence(
  out: Float64Array, u: ArrayLike<number>, sigma: Float64Array, shift: Int32Array | null, pairLive: Uint8Array,
  nTraces: number, nSamples: number, order: PwdOrder, radiusTimeSamples: number, radiusTraces: number,
  scratch?: GaussNewtonWorkspace,
): Float64Array {
  const n = (nTraces - 1) * nSamples;
  const fits = scratch !== undefined && scratch.nTraces === nTraces && scratch.nSamples === nSamples;
  const r = fits ? scratch.r : new Float64Array(n), g = fits ? scratch.g : new Float64Array(n);
  const w = fits ? scratch.w : new Float64Array(n), e = fits ? scratch.num : new Float64Array(n);
  destructionResidualAndSlopeDerivativeUnchecked(r, g, w, u, sigma, shift, pairLive, nTraces, nSamples, order);
  destructionSideEnergyUnchecked(e, u, sigma, shift, pairLive, nTraces, nSamples, order);
  for (let i = 0; i < n; i++) r[i] = w[i] * r[i] * r[i];
  const tri = createTriangle2D(nTraces - 1, nSamples, radiusTimeSamples, radiusTraces);
  triangle2DApply(tri, r, r);
  triangle2DApply(tri, e, e);
  triangle2DApply(tri, w, w);
  let meanE = 0, c = 0;
  for (let i = 0; i < n; i++) if (e[i] > 0) { meanE += e[i]; c++; }
  meanE = c > 0 ? meanE / c : 0;
  for (let i = 0; i < n; i++) {
    const ei = e[i];
    if (!(ei > 1e-9 * meanE) || !(w[i] > 1e-6)) {
      out[i] = 0;
      continue;
    }
    const v = 1 - r[i] / ei;
    out[i] = v < 0 ? 0 : v > 1 ? 1 : v;
  }
  return out;
}
