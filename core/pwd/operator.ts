/**
 * Plane-wave destruction operator on a whole gather (Fomel 2002), its exact adjoint and its σ-derivative.
 *
 * Layout: the gather u is trace-major (core/grid/gather.ts), Float64Array of nTraces*nSamples.
 * The slope σ and the output r live on the PAIR grid: pair p sits between traces p and p+1 (position p+½),
 * nPairs = nTraces−1, stored pair-major: field[p * nSamples + t]. core/slope/pair-grid.ts maps pairs to traces.
 *
 * Sign convention: σ = dt/dx in samples per trace, positive where events arrive later at higher trace
 * index, as in u_x + σ u_t = 0; u = f(t − σx) is destroyed:
 *   r[p, t] = Σ_{k=−N..N} b_k(f) · ( u[p+1, t+k+n] − u[p, t−k] ),  σ = n + f.
 * With `split` off, n = 0 and f = σ (smooth in σ: use for estimation). With `split` on, n = round(σ) and
 * |f| ≤ ½ (integer delay plus fractional all-pass; accurate for any slope: use for filling).
 * Where the stencil would leave the trace (t−N < 0, t+N ≥ nSamples, or the shifted window outside),
 * r = 0 and the sample carries no equation ("valid" = 0).
 */
import { maxflatCoefficients, maxflatDerivatives, type PwdOrder } from './maxflat';

export interface PwdPlan {
  readonly order: PwdOrder;
  readonly nTraces: number;
  readonly nSamples: number;
  /** b_k per pair sample: coef[(p*nSamples + t)*(2N+1) + k+N]. */
  readonly coef: Float64Array;
  /** db_k/dσ per pair sample, same layout; present when built with derivatives. */
  readonly dcoef: Float64Array | null;
  /** Integer delay n per pair sample (0 without split). */
  readonly shift: Int32Array;
  /** 1 where the stencil fits inside the trace, else 0. */
  readonly valid: Uint8Array;
}

export interface PwdPlanOptions {
  order?: PwdOrder;
  split?: boolean;
  derivatives?: boolean;
}

/** Precompute coefficients for a fixed slope field (pair grid). Allocates the plan; apply/adjoint do not. */
export function buildPwdPlan(sigma: Float64Array, nTraces: number, nSamples: number, options: PwdPlanOptions = {}): PwdPlan {
  const order = options.order ?? 1;
  const nPairs = Math.max(0, nTraces - 1);
  if (sigma.length !== nPairs * nSamples)
    throw new RangeError(`buildPwdPlan: slope length ${sigma.length} must be (nTraces−1)*nSamples = ${nPairs * nSamples}`);
  const w = 2 * order + 1;
  const coef = new Float64Array(nPairs * nSamples * w);
  const dcoef = options.derivatives ? new Float64Array(nPairs * nSamples * w) : null;
  const shift = new Int32Array(nPairs * nSamples);
  const valid = new Uint8Array(nPairs * nSamples);
  for (let i = 0; i < nPairs * nSamples; i++) {
    const s = sigma[i];
    if (!Number.isFinite(s)) throw new RangeError(`buildPwdPlan: slope at pair-sample ${i} is not finite (${s})`);
    const n = options.split ? Math.round(s) : 0;
    const f = s - n;
    shift[i] = n;
    maxflatCoefficients(coef, f, order, i * w);
    if (dcoef) maxflatDerivatives(dcoef, f, order, i * w);
    const t = i % nSamples;
    valid[i] = t - order >= 0 && t + order < nSamples && t + n - order >= 0 && t + n + order < nSamples ? 1 : 0;
  }
  return { order, nTraces, nSamples, coef, dcoef, shift, valid };
}

/** r = C(σ) u. out: pair grid, length (nTraces−1)*nSamples. Unchecked. @returns out */
export function pwdApply(plan: PwdPlan, out: Float64Array, u: Float64Array): Float64Array {
  return applyTable(plan, plan.coef, out, u);
}

/** g = (∂C/∂σ) u, the diagonal Jacobian of r with respect to σ. Needs a plan built with derivatives. */
export function pwdApplySlopeDerivative(plan: PwdPlan, out: Float64Array, u: Float64Array): Float64Array {
  if (!plan.dcoef) throw new RangeError('pwdApplySlopeDerivative: plan was built without derivatives');
  return applyTable(plan, plan.dcoef, out, u);
}

function applyTable(plan: PwdPlan, table: Float64Array, out: Float64Array, u: Float64Array): Float64Array {
  const { order: n, nTraces, nSamples, shift, valid } = plan;
  const w = 2 * n + 1;
  const nPairs = nTraces - 1;
  for (let p = 0; p < nPairs; p++) {
    const left = p * nSamples;
    const right = left + nSamples;
    for (let t = 0; t < nSamples; t++) {
      const i = left + t;
      if (valid[i] === 0) {
        out[i] = 0;
        continue;
      }
      const c = i * w + n;
      const rt = right + t + shift[i];
      let acc = 0;
      for (let k = -n; k <= n; k++) acc += table[c + k] * (u[rt + k] - u[i - k]);
      out[i] = acc;
    }
  }
  return out;
}

/** u += Cᵀ r (exact adjoint of pwdApply, boundaries included). Set `accumulate` false to overwrite. @returns out */
export function pwdAdjoint(plan: PwdPlan, out: Float64Array, r: Float64Array, accumulate = false): Float64Array {
  const { order: n, nTraces, nSamples, coef, shift, valid } = plan;
  if (!accumulate) out.fill(0);
  const w = 2 * n + 1;
  const nPairs = nTraces - 1;
  for (let p = 0; p < nPairs; p++) {
    const left = p * nSamples;
    const right = left + nSamples;
    for (let t = 0; t < nSamples; t++) {
      const i = left + t;
      if (valid[i] === 0) continue;
      const ri = r[i];
      if (ri === 0) continue;
      const c = i * w + n;
      const rt = right + t + shift[i];
      for (let k = -n; k <= n; k++) {
        const b = coef[c + k] * ri;
        out[rt + k] += b;
        out[i - k] -= b;
      }
    }
  }
  return out;
}
