import { describe, expect, it } from 'vitest';
import { createTriangle2D, triangle2DApply } from '../../../../core/slope/triangle';
import { createSmoothDivideWorkspace, smoothDivideUnchecked } from '../../../../core/slope/smooth-divide';
import { Rng } from '../../../../core/rng';

/** Dense Gaussian elimination with partial pivoting (test-only reference). */
function solveDense(a: number[][], b: number[]): number[] {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[piv][c])) piv = r;
    [m[c], m[piv]] = [m[piv], m[c]];
    for (let r = c + 1; r < n; r++) {
      const f = m[r][c] / m[c][c];
      for (let k = c; k <= n; k++) m[r][k] -= f * m[c][k];
    }
  }
  const x = new Array(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = m[r][n];
    for (let k = r + 1; k < n; k++) s -= m[r][k] * x[k];
    x[r] = s / m[r][r];
  }
  return x;
}

describe('smooth division by shaping regularisation', () => {
  // Fomel 2007 (Geophysics 72(2) R29), eq. for shaping: m = [λ²I + S(LᵀL − λ²I)]⁻¹ S Lᵀd with S = T², L = diag(g).
  // Here num = Lᵀd and den = LᵀL; the CG solution of the symmetric form must equal the dense solve of this formula.
  it('matches a dense solve of Fomel 2007 (non-symmetric form) to 1e-8', () => {
    const rng = new Rng(11);
    const nc = 6, ns = 9, n = nc * ns;
    const tri = createTriangle2D(nc, ns, 3, 2);
    const den = new Float64Array(n).map(() => (rng.uniform() < 0.2 ? 0 : rng.uniform() * 2));
    const num = new Float64Array(n).map((_, i) => den[i] * (0.5 + rng.normal()));
    let lambda2 = 0, c = 0;
    for (const d of den) if (d > 0) { lambda2 += d; c++; }
    lambda2 /= c;
    // S as a dense matrix, column by column
    const T: number[][] = Array.from({ length: n }, () => new Array(n).fill(0));
    for (let j = 0; j < n; j++) {
      const e = new Float64Array(n); e[j] = 1;
      const col = triangle2DApply(tri, new Float64Array(n), e);
      for (let i = 0; i < n; i++) T[i][j] = col[i];
    }
    const S = T.map((row) => T[0].map((_, j) => row.reduce((s, v, k) => s + v * T[k][j], 0)));
    const A = S.map((row, i) => row.map((v, j) => (i === j ? lambda2 : 0) + v * (den[j] - lambda2)));
    const rhs = S.map((row) => row.reduce((s, v, k) => s + v * num[k], 0));
    const ref = solveDense(A, rhs);
    const ws = createSmoothDivideWorkspace(tri);
    const out = new Float64Array(n);
    const rep = smoothDivideUnchecked(ws, out, num, den, 500, 1e-14);
    expect(rep.lambdaSquared).toBeCloseTo(lambda2, 14);
    for (let i = 0; i < n; i++) expect(Math.abs(out[i] - ref[i])).toBeLessThan(1e-8 * Math.max(1, Math.abs(ref[i])));
  });

  // Known solution: num = den·m0 with den constant ⇒ λ² = den, the system is λ²p = T num ⇒ m = T²m0 (exact).
  it('constant denominator: m = T² (num/den) exactly', () => {
    const nc = 8, ns = 30, n = nc * ns;
    const tri = createTriangle2D(nc, ns, 4, 2);
    const m0 = new Float64Array(n).map((_, i) => Math.sin(i / 7));
    const den = new Float64Array(n).fill(3);
    const num = m0.map((v) => 3 * v);
    const out = new Float64Array(n);
    smoothDivideUnchecked(createSmoothDivideWorkspace(tri), out, num, den, 50, 1e-14);
    const ref = triangle2DApply(tri, new Float64Array(n), triangle2DApply(tri, new Float64Array(n), m0));
    for (let i = 0; i < n; i++) expect(out[i]).toBeCloseTo(ref[i], 10);
  });

  it('all-zero denominator gives zero and no iterations', () => {
    const tri = createTriangle2D(3, 5, 2, 2);
    const out = new Float64Array(15).fill(7);
    const rep = smoothDivideUnchecked(createSmoothDivideWorkspace(tri), out, new Float64Array(15), new Float64Array(15), 10, 1e-6);
    expect(rep.iterations).toBe(0);
    expect(Array.from(out)).toEqual(new Array(15).fill(0));
  });
});
