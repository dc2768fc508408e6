/**
 * Least-squares fill (methods.md §3.1; Fomel 2002; Claerbout's missing-data formulation): minimise
 * ||C(σ)(K d + M m)||² over the unknown samples m, known traces held exactly. Conjugate gradients on the
 * normal equations (CGLS) with the operator only, never a matrix; one independent problem per block of
 * consecutive unknown traces (core/fill/masked-operator.ts), each started from two-sided painting along the
 * slopes (core/fill/paint.ts) so wide gaps need few iterations.
 *
 * Layout: trace-major (core/grid/gather.ts); slopes on the pair grid (core/pwd/operator.ts).
 */
import type { PwdOrder } from '../pwd/maxflat';
import { buildPwdPlan, type PwdPlan } from '../pwd/operator';
import { throwIfCancelled } from '../problems';
import { blockAdjoint, blockApply, blockRange, blockResidual, type BlockRange } from './masked-operator';
import { paintBlock } from './paint';
import { unknownBlocks } from './plan';
import type { GapSolverInput, GapSolverResult } from './solver';

export interface LsqSettings {
  /** Destructor order N (1: 3-point, 2: 5-point). Integer+fraction split is always on for filling. */
  order: PwdOrder;
  /** CG iterations per block at most. */
  maxIterations: number;
  /** Stop when ||Aᵀr|| / ||Aᵀr₀|| falls below this. */
  tolerance: number;
  /** Stop when the residual energy fell by less than this fraction over the last 5 iterations. */
  plateau: number;
  /** Start from two-sided painting (true) or from zero traces (false). */
  paint: boolean;
  /**
   * Damping ε: minimise ||A Δ − r||² + ε²||Δ||² for the change Δ from the starting guess. Samples near the top
   * and bottom of a filled trace, where the stencil barely reaches, are otherwise nearly free (singular values
   * down to 1e-7 measured) and a long CG run lets them grow; ε bounds the condition number near ||A||/ε
   * (||A|| ≈ 2 for the maxflat destructor).
   */
  damping: number;
}

export const LSQ_DEFAULTS: Readonly<LsqSettings> = { order: 2, maxIterations: 300, tolerance: 1e-4, plateau: 1e-4, paint: true, damping: 1e-2 };

export interface CgStats {
  iterations: number;
  converged: boolean;
  /** Final / initial residual energy. */
  residualRatio: number;
}

/**
 * Records, for a hold-out fill, the error energy on the hidden traces after every CG iteration (iteration 0 is
 * the painted start), so the hold-out can choose how many iterations the real fill gets (methods.md §3.1:
 * stop when the leave-out SNR stops improving).
 */
export class IterationTracker {
  private readonly perBlock: Float64Array[] = [];
  constructor(readonly truth: Float64Array, readonly hidden: Uint8Array) {}

  add(errors: Float64Array): void {
    this.perBlock.push(errors);
  }

  /** Error energy on all hidden traces after n iterations per block (blocks that stopped keep their last value). */
  errorAt(n: number): number {
    let e = 0;
    for (const b of this.perBlock) e += b[Math.min(n, b.length - 1)];
    return e;
  }

  /** The iteration count with the least error, and that error (earliest on ties). */
  best(maxIterations: number): { iterations: number; error: number } {
    let longest = 0;
    for (const b of this.perBlock) longest = Math.max(longest, b.length - 1);
    let bi = 0;
    let be = this.errorAt(0);
    for (let n = 1; n <= Math.min(maxIterations, longest); n++) {
      const e = this.errorAt(n);
      if (e < be) [bi, be] = [n, e];
    }
    return { iterations: bi, error: be };
  }
}

function hiddenError(u: Float64Array, x: Float64Array, blk: BlockRange, nS: number, tr: IterationTracker): number {
  let e = 0;
  for (let tIdx = blk.a; tIdx <= blk.b; tIdx++) {
    if (!tr.hidden[tIdx]) continue;
    const off = tIdx * nS;
    const lo = (tIdx - blk.a) * nS;
    for (let t = 0; t < nS; t++) {
      const d = u[off + t] + x[lo + t] - tr.truth[off + t];
      e += d * d;
    }
  }
  return e;
}

/** Scratch for one block, sized for the largest block of a gather. */
interface Scratch {
  x: Float64Array;
  s: Float64Array;
  p: Float64Array;
  r: Float64Array;
  q: Float64Array;
}

function makeScratch(maxTraces: number, maxPairs: number, nSamples: number): Scratch {
  const nv = maxTraces * nSamples;
  const nr = maxPairs * nSamples;
  return { x: new Float64Array(nv), s: new Float64Array(nv), p: new Float64Array(nv), r: new Float64Array(nr), q: new Float64Array(nr) };
}

function dot(a: Float64Array, b: Float64Array, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += a[i] * b[i];
  return s;
}

/**
 * CGLS on one block: updates traces blk.a..blk.b of u in place so that ||C u|| on the block's pairs is least.
 * Unchecked.
 */
export function solveBlockCgls(plan: PwdPlan, u: Float64Array, blk: BlockRange, settings: LsqSettings, sc: Scratch, cancel?: { readonly cancelled: boolean }, tracker?: IterationTracker): CgStats {
  const nS = plan.nSamples;
  const nv = (blk.b - blk.a + 1) * nS;
  const nr = (blk.p1 - blk.p0) * nS;
  const { x, s, p, r, q } = sc;
  x.fill(0, 0, nv);
  blockResidual(plan, r, u, blk);
  for (let i = 0; i < nr; i++) r[i] = -r[i];
  const rr0 = dot(r, r, nr);
  blockAdjoint(plan, s, r, blk);
  let gamma = dot(s, s, nv);
  const gamma0 = gamma;
  const eps2 = settings.damping * settings.damping;
  p.set(s.subarray(0, nv));
  const history: number[] = [rr0];
  let tracks = false;
  for (let q = blk.a; q <= blk.b && tracker; q++) if (tracker.hidden[q]) tracks = true;
  const errs: number[] = tracks ? [hiddenError(u, x, blk, nS, tracker!)] : [];
  let it = 0;
  let converged = gamma0 === 0;
  let rr = rr0;
  while (!converged && it < settings.maxIterations) {
    if ((it & 7) === 7) throwIfCancelled(cancel);
    blockApply(plan, q, p, blk);
    const delta = dot(q, q, nr) + eps2 * dot(p, p, nv);
    if (delta === 0) break;
    const alpha = gamma / delta;
    for (let i = 0; i < nv; i++) x[i] += alpha * p[i];
    for (let i = 0; i < nr; i++) r[i] -= alpha * q[i];
    blockAdjoint(plan, s, r, blk);
    if (eps2 > 0) for (let i = 0; i < nv; i++) s[i] -= eps2 * x[i];
    const gammaNew = dot(s, s, nv);
    it++;
    rr = dot(r, r, nr) + eps2 * dot(x, x, nv);
    history.push(rr);
    if (tracks) errs.push(hiddenError(u, x, blk, nS, tracker!));
    if (gammaNew <= settings.tolerance * settings.tolerance * gamma0) {
      converged = true;
      break;
    }
    if (it >= 5 && history[it - 5] - rr < settings.plateau * history[it - 5]) {
      converged = true;
      break;
    }
    const beta = gammaNew / gamma;
    gamma = gammaNew;
    for (let i = 0; i < nv; i++) p[i] = s[i] + beta * p[i];
  }
  const off = blk.a * nS;
  for (let i = 0; i < nv; i++) u[off + i] += x[i];
  if (tracks) tracker!.add(Float64Array.from(errs));
  return { iterations: it, converged, residualRatio: rr0 > 0 ? rr / rr0 : 0 };
}

/**
 * Fills every block of unknown traces. Meets the solver contract of core/fill/solver.ts.
 * @param tracker  hold-out fills only: records the error on hidden traces per iteration
 */
export function solveLeastSquares(input: GapSolverInput, settings: Partial<LsqSettings> = {}, tracker?: IterationTracker): GapSolverResult {
  const start = Date.now();
  const st: LsqSettings = { ...LSQ_DEFAULTS, ...settings };
  const { nTraces, nSamples, unknownTraces, slopePairs } = input;
  if (input.data.length !== nTraces * nSamples) throw new RangeError(`solveLeastSquares: data length ${input.data.length} ≠ ${nTraces}×${nSamples}`);
  if (slopePairs.length !== Math.max(0, nTraces - 1) * nSamples) throw new RangeError(`solveLeastSquares: slope length ${slopePairs.length} ≠ (${nTraces}−1)×${nSamples}`);
  if (unknownTraces.length !== nTraces) throw new RangeError(`solveLeastSquares: unknownTraces length ${unknownTraces.length} ≠ ${nTraces}`);
  const u = Float64Array.from(input.data);
  const blocks = unknownBlocks(unknownTraces);
  if (blocks.length === 0 || nTraces < 2) {
    return { data: u, iterations: 0, converged: true, seconds: (Date.now() - start) / 1000, details: { blocks: 0, maxIterations: 0 } };
  }
  const plan = buildPwdPlan(slopePairs, nTraces, nSamples, { order: st.order, split: true });
  let maxT = 0;
  for (const [a, b] of blocks) maxT = Math.max(maxT, b - a + 1);
  const sc = makeScratch(maxT, maxT + 1, nSamples);
  let total = 0;
  let most = 0;
  let allConverged = true;
  let worstRatio = 0;
  const totalTraces = blocks.reduce((s, [a, b]) => s + b - a + 1, 0);
  let doneTraces = 0;
  for (const [a, b] of blocks) {
    throwIfCancelled(input.cancel);
    if (st.paint) paintBlock(u, nTraces, nSamples, slopePairs, a, b);
    else u.fill(0, a * nSamples, (b + 1) * nSamples);
    const stats = solveBlockCgls(plan, u, blockRange(a, b, nTraces), st, sc, input.cancel, tracker);
    total += stats.iterations;
    most = Math.max(most, stats.iterations);
    allConverged &&= stats.converged;
    worstRatio = Math.max(worstRatio, stats.residualRatio);
    doneTraces += b - a + 1;
    if (input.onProgress) {
      const elapsed = (Date.now() - start) / 1000;
      input.onProgress({ step: doneTraces, totalSteps: totalTraces, terms: { residualRatio: stats.residualRatio }, elapsedSeconds: elapsed, secondsLeft: (elapsed * (totalTraces - doneTraces)) / doneTraces });
    }
  }
  return {
    data: u,
    iterations: most,
    converged: allConverged,
    seconds: (Date.now() - start) / 1000,
    details: { blocks: blocks.length, totalIterations: total, worstResidualRatio: worstRatio, order: st.order },
  };
}
