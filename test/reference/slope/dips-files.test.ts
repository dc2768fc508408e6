/**
 * The files `dipweave dips` writes, read by outside tools (Debian's python3-numpy 1.24 and python3-segyio 1.8,
 * called as /usr/bin/python3; they never see Dipweave's code):
 *  - .npy: numpy.load gives a float32 C-order array of shape (traces, samples) (NEP 1 format);
 *  - SEG-Y: segyio opens it (ignore_geometry), reads format 5, the same sample count and trace count, the same
 *    trace values as the .npy, and the input's trace header fields (offset, receiver x) unchanged.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliContext } from '../../../app/cli/context';
import { runCli } from '../../../app/cli/runner';
import { encodeNpyFloat32 } from '../../../core/slope/npy';
import { missingOutside } from '../../support/outside';

const PY = '/usr/bin/python3';
const probe = spawnSync(PY, ['-c', 'import numpy, segyio'], { encoding: 'utf8' });
const havePy = probe.status === 0;
if (!havePy) {
  const msg = `SKIPPING dips file reference test: ${PY} with numpy and segyio is missing. Install Debian's python3-numpy and python3-segyio.`;
  missingOutside(msg);
}

const ROOT = new URL('../../../', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'dipweave-dips-ref-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function py(script: string, ...args: string[]): Record<string, unknown> {
  const r = spawnSync(PY, ['-c', script, ...args], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`python failed: ${r.stderr}`);
  return JSON.parse(r.stdout);
}

describe.skipIf(!havePy)('dips output read by numpy and segyio', () => {
  it('a small .npy encoded in memory loads with numpy.load, shape and values exact', () => {
    const values = Float32Array.from({ length: 12 }, (_, i) => i * 0.25 - 1);
    const path = join(dir, 'small.npy');
    writeFileSync(path, encodeNpyFloat32(values, [3, 4]));
    const j = py('import json,sys,numpy as np; a=np.load(sys.argv[1]); print(json.dumps({"shape":list(a.shape),"dtype":str(a.dtype),"c":bool(a.flags["C_CONTIGUOUS"]),"v":a.ravel().tolist()}))', path);
    expect(j).toEqual({ shape: [3, 4], dtype: 'float32', c: true, v: Array.from(values) });
  });

  it('dipweave dips: .npy and SEG-Y agree with each other and with the input headers', async () => {
    const input = join(ROOT, 'test/fixtures/segy/two-gathers.sgy');
    const ctx: CliContext = { cwd: dir, stdout: () => {}, stderr: () => {}, cancel: { cancelled: false }, cores: 1 };
    expect(await runCli(['dips', input, '--out', 'd.npy', '--confidence', 'c.npy'], ctx)).toBe(0);
    expect(await runCli(['dips', input, '--out', 'd.sgy'], ctx)).toBe(0);
    const j = py(`
import json, sys, numpy as np, segyio
a = np.load(sys.argv[1]); c = np.load(sys.argv[2])
with segyio.open(sys.argv[3], ignore_geometry=True) as f, segyio.open(sys.argv[4], ignore_geometry=True) as g:
    d = segyio.tools.collect(f.trace[:])
    text = segyio.tools.wrap(f.text[0])
    same = all(f.header[i][segyio.TraceField.offset] == g.header[i][segyio.TraceField.offset] and
               f.header[i][segyio.TraceField.GroupX] == g.header[i][segyio.TraceField.GroupX] for i in range(f.tracecount))
    print(json.dumps({"shape": list(a.shape), "cshape": list(c.shape), "fmt": int(f.format), "n": f.tracecount, "ns": len(f.samples),
        "ninput": g.tracecount, "maxdiff": float(np.max(np.abs(d - a))), "cmin": float(c.min()), "cmax": float(c.max()),
        "headers": bool(same), "unit": "SLOPE IN SAMPLES/TRACE" in text}))
`, join(dir, 'd.npy'), join(dir, 'c.npy'), join(dir, 'd.sgy'), input);
    expect(j).toMatchObject({ shape: [22, 40], cshape: [22, 40], fmt: 5, n: 22, ns: 40, ninput: 22, headers: true, unit: true });
    expect(j.maxdiff).toBe(0);
    expect(j.cmin as number).toBeGreaterThanOrEqual(0);
    expect(j.cmax as number).toBeLessThanOrEqual(1);
  });
});
