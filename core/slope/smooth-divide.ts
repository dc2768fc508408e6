/**
 * Smooth division by shaping regularisation (Fomel 2007, Geophysics 72(2) R29–R36): find m with
 * den ⊙ m ≈ num, shaped by the smoother S = T² (T: the symmetric 2-D triangle smoother, core/slope/triangle.ts).
 * Symmetric form solved by conjugate gradients (methods.md §2.2):
 *   [λ² I + T (diag(den) − λ² I) T] p = T num,   m = T p,   λ² = mean(den) over samples with den > 0.
 * Where den = 0 the solution is pulled toward 0 by λ² (so callers divide for a deviation from a prior).
 * Layout: any nCols × nSamples column-major field (pair grid for slopes).
 */
import { triangle2DApply, type Triangle2D } from './triangle';

export interface SmoothDivideWorkspace {
  readonly smoother: Triangle2D;
  /** CG state; p is kept between calls as a warm start (zero it to start cold). */
  readonly p: Float64Array;
  readonly resid: Float64Array;
  readonly dir: Float64Array;
  readonly aDir: Float64Array;
  readonly tmp: Float64Array;
}

export function createSmoothDivideWorkspace(smoother: Triangle2D): SmoothDivideWorkspace {
  const n = smoother.nCols * smoother.nSamples;
  return { smoother, p: new Float64Array(n), resid: new Float64Array(n), dir: new Float64Array(n), aDir: new Float64Array(n), tmp: new Float64Array(n) };
}

export interface SmoothDivideResult {
  iterations: number;
  /** ‖residual‖/‖rhs‖ of the symmetric system at the end. */
  relativeResidual: number;
  lambdaSquared: number;
}

/** y = A x with A = λ² x + T((den − λ²) ⊙ (T x)). Uses ws.tmp. */
function applyShapingOperator(ws: SmoothDivideWorkspace, y: Float64Array, x: Float64Array, den: Float64Array, lambda2: number): void {
  const tmp = ws.tmp;
  triangle2DApply(ws.smoother, tmp, x);
  scaleByShifted(tmp, den, lambda2);
  triangle2DApply(ws.smoother, tmp, tmp);
  axpyInto(y, lambda2, x, tmp);
}

// Small vector kernels kept as separate functions: V8 optimises them far better than loops inlined in one
// long function.
function scaleByShifted(a: Float64Array, den: Float64Array, shift: number): void {
  for (let i = 0; i < a.length; i++) a[i] *= den[i] - shift;
}
function axpyInto(y: Float64Array, alpha: number, x: Float64Array, b: Float64Array): void {
  for (let i = 0; i < y.length; i++) y[i] = alpha * x[i] + b[i];
}
function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}
/** p += α d; r −= α q; returns ‖r‖². */
function cgUpdate(p: Float64Array, r: Float64Array, d: Float64Array, q: Float64Array, alpha: number): number {
  let g = 0;
  for (let i = 0; i < p.length; i++) {
    p[i] += alpha * d[i];
    const v = r[i] - alpha * q[i];
    r[i] = v;
    g += v * v;
  }
  return g;
}
function cgDirection(d: Float64Array, r: Float64Array, beta: number): void {
  for (let i = 0; i < d.length; i++) d[i] = r[i] + beta * d[i];
}

/**
 * m ≈ num / den, shaped. out: the solution m (may not alias num or den). Allocation-free.
 * @param lambdaSquared  scale of the regulariser; pass NaN for mean(den) over den > 0.
 * @returns iteration count and final relative residual
 */
export function smoothDivideUnchecked(
  ws: SmoothDivideWorkspace, out: Float64Array, num: Float64Array, den: Float64Array,
  maxIterations: number, tolerance: number, lambdaSquared = NaN,
): SmoothDivideResult {
  const n = num.length;
  let lambda2 = lambdaSquared;
  if (!(lambda2 > 0)) {
    let s = 0, c = 0;
    for (let i = 0; i < n; i++) if (den[i] > 0) { s += den[i]; c++; }
    lambda2 = c > 0 ? s / c : 0;
  }
  const { p, resid, dir, aDir } = ws;
  if (!(lambda2 > 0)) {
    out.fill(0, 0, n);
    p.fill(0);
    return { iterations: 0, relativeResidual: 0, lambdaSquared: 0 };
  }
  // rhs = T num, kept in out until the end.
  triangle2DApply(ws.smoother, out, num);
  let rhsNorm2 = 0;
  for (let i = 0; i < n; i++) rhsNorm2 += out[i] * out[i];
  if (rhsNorm2 === 0) {
    p.fill(0);
    out.fill(0, 0, n);
    return { iterations: 0, relativeResidual: 0, lambdaSquared: lambda2 };
  }
  let warm = false;
  for (let i = 0; i < n && !warm; i++) if (p[i] !== 0) warm = true;
  if (warm) applyShapingOperator(ws, aDir, p, den, lambda2);
  else aDir.fill(0);
  let gamma = 0;
  for (let i = 0; i < n; i++) {
    const r = out[i] - aDir[i];
    resid[i] = r;
    dir[i] = r;
    gamma += r * r;
  }
  let it = 0;
  const stop = tolerance * tolerance * rhsNorm2;
  while (it < maxIterations && gamma > stop) {
    applyShapingOperator(ws, aDir, dir, den, lambda2);
    const dAd = dot(dir, aDir);
    if (!(dAd > 0)) break;
    const alpha = gamma / dAd;
    const gNew = cgUpdate(p, resid, dir, aDir, alpha);
    cgDirection(dir, resid, gNew / gamma);
    gamma = gNew;
    it++;
  }
  triangle2DApply(ws.smoother, out, p);
  return { iterations: it, relativeResidual: Math.sqrt(gamma / rhsNorm2), lambdaSquared: lambda2 };
}
