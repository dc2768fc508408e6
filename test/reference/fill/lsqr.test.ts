// Reference: the conjugate-gradient fill equals the explicit sparse least-squares system solved by
// scipy.sparse.linalg.lsqr (Debian python3-scipy, called as /usr/bin/python3). The matrix is built column by
// column from the operator and exported as COO triplets; scipy never sees Dipweave's code.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { blockApply, blockRange, blockResidual } from '../../../core/fill/masked-operator';
import { solveLeastSquares } from '../../../core/fill/lsq';
import { buildPwdPlan } from '../../../core/pwd/operator';
import { addPlaneWave } from '../../../core/synth/events';
import { Rng } from '../../../core/rng';

const PY = '/usr/bin/python3';
const DAMP = 1e-2; // the solver's default damping; lsqr minimises ||Ax − b||² + damp²||x||², the same objective
const probe = spawnSync(PY, ['-c', 'import scipy.sparse.linalg, numpy'], { encoding: 'utf8' });
const havePy = probe.status === 0;
if (!havePy) {
  const msg = `SKIPPING scipy reference test: ${PY} with scipy is missing. Install Debian's python3-scipy (apt-get install python3-scipy).`;
  missingOutside(msg);
}

const dir = mkdtempSync(join(tmpdir(), 'dipweave-lsqr-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const SCRIPT = `
import json, sys, numpy as np
from scipy.sparse import coo_matrix
from scipy.sparse.linalg import lsqr
p = json.load(open(sys.argv[1]))
A = coo_matrix((p['v'], (p['i'], p['j'])), shape=(p['rows'], p['cols'])).tocsr()
x = lsqr(A, np.array(p['b']), damp=p['damp'], atol=1e-15, btol=1e-15, conlim=1e12, iter_lim=100000)[0]
json.dump({'x': x.tolist()}, open(sys.argv[2], 'w'))
`;
import { missingOutside } from '../../support/outside';

describe.skipIf(!havePy)('least-squares fill against scipy.sparse.linalg.lsqr', () => {
  it.each([1, 2] as const)('order %i: CG solution equals the lsqr solution of the explicit system to 1e-5 relative', (order) => {
    const nT = 9, nS = 48;
    const rng = new Rng(40 + order);
    const u = addPlaneWave(new Float64Array(nT * nS), nT, nS, { t0Samples: 12, slopeSamplesPerTrace: 1.7, fpCyclesPerSample: 0.09 });
    addPlaneWave(u, nT, nS, { t0Samples: 30, slopeSamplesPerTrace: -0.6, fpCyclesPerSample: 0.12, amplitude: 0.5 });
    for (let i = 0; i < u.length; i++) u[i] += 0.05 * rng.normal();
    // A smoothly varying slope field, steep enough that the integer+fraction split is exercised.
    const slopes = new Float64Array((nT - 1) * nS);
    for (let p = 0; p < nT - 1; p++) for (let t = 0; t < nS; t++) slopes[p * nS + t] = 1.2 + 0.6 * Math.sin(t / 9 + p / 3);
    const a = 3, b = 5;
    const unknown = new Uint8Array(nT).fill(1, a, b + 1);
    const d = u.slice();
    d.fill(0, a * nS, (b + 1) * nS);

    // Explicit matrix A = C·M and right-hand side −C·K·d, column by column from the operator.
    const plan = buildPwdPlan(slopes, nT, nS, { order, split: true });
    const blk = blockRange(a, b, nT);
    const cols = (b - a + 1) * nS, rows = (blk.p1 - blk.p0) * nS;
    const I: number[] = [], J: number[] = [], V: number[] = [];
    const e = new Float64Array(cols), col = new Float64Array(rows);
    for (let j = 0; j < cols; j++) {
      e[j] = 1;
      blockApply(plan, col, e, blk);
      e[j] = 0;
      for (let i = 0; i < rows; i++) if (col[i] !== 0) { I.push(i); J.push(j); V.push(col[i]); }
    }
    const rhs = Array.from(blockResidual(plan, new Float64Array(rows), d, blk), (v) => -v);
    const inPath = join(dir, `sys${order}.json`), outPath = join(dir, `x${order}.json`);
    writeFileSync(inPath, JSON.stringify({ rows, cols, i: I, j: J, v: V, b: rhs, damp: DAMP }));
    const run = spawnSync(PY, ['-c', SCRIPT, inPath, outPath], { encoding: 'utf8' });
    expect(run.stderr).toBe('');
    const ref: number[] = JSON.parse(readFileSync(outPath, 'utf8')).x;

    // CGLS from a zero start converges to the same minimum-norm solution as lsqr.
    const res = solveLeastSquares({ data: d, nTraces: nT, nSamples: nS, unknownTraces: unknown, slopePairs: slopes }, { order, paint: false, damping: DAMP, tolerance: 1e-13, plateau: 0, maxIterations: 5000 });
    let num = 0, den = 0;
    for (let j = 0; j < cols; j++) {
      const diff = res.data[a * nS + j] - ref[j];
      num += diff * diff;
      den += ref[j] * ref[j];
    }
    expect(den).toBeGreaterThan(0);
    expect(Math.sqrt(num / den)).toBeLessThan(1e-5);
  });
});
