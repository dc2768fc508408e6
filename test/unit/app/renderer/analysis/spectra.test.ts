// Spectra of the check step against numpy.fft (Debian python3-numpy, called as /usr/bin/python3): numpy never
// sees Dipweave's code, only the input samples. Display gain percentile against numpy.percentile (linear).
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { fkSpectrum, meanAmplitude, energyBeyondWavenumber } from '../../../../../app/renderer/analysis/spectra';
import { computeDisplayGain, percentileAbs } from '../../../../../app/renderer/render/gain';
import { Rng } from '../../../../../core/rng';
import { addPlaneWave } from '../../../../../core/synth/events';
import { missingOutside } from '../../../../support/outside';

const PY = '/usr/bin/python3';
const probe = spawnSync(PY, ['-c', 'import numpy'], { encoding: 'utf8' });
const havePy = probe.status === 0;
if (!havePy) {
  const msg = `SKIPPING numpy reference checks: ${PY} with numpy is missing. Install Debian's python3-numpy (apt-get install python3-numpy).`;
  missingOutside(msg);
}

function numpy(script: string, input: unknown): unknown {
  const r = spawnSync(PY, ['-c', `import json, sys, numpy as np\np = json.load(sys.stdin)\n${script}`], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.status !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout);
}

function gather(nTraces: number, nSamples: number, seed: number): Float32Array {
  const d = new Float64Array(nTraces * nSamples);
  addPlaneWave(d, nTraces, nSamples, { t0Samples: 20, slopeSamplesPerTrace: 0.7, fpCyclesPerSample: 0.08 });
  const rng = new Rng(seed);
  for (let i = 0; i < d.length; i++) d[i] += 0.05 * rng.normal();
  return Float32Array.from(d);
}

describe.skipIf(!havePy)('spectra against numpy.fft', () => {
  it('mean amplitude spectrum (Hann taper, zero padding to a power of two) equals numpy rfft', () => {
    const nTraces = 7, nSamples = 100, dt = 0.002;
    const d = gather(nTraces, nSamples, 1);
    const traces = [0, 2, 3, 6];
    const ours = meanAmplitude(d, nSamples, traces, dt);
    const ref = numpy(`
d = np.array(p['d']).reshape(p['nx'], p['nt'])[p['traces']]
w = np.hanning(p['nt'])
n = 128
a = np.abs(np.fft.rfft(d * w, n=n, axis=1)).mean(axis=0)
print(json.dumps({'a': a.tolist(), 'f': np.fft.rfftfreq(n, p['dt']).tolist()}))`, { d: Array.from(d), nx: nTraces, nt: nSamples, traces, dt }) as { a: number[]; f: number[] };
    expect(ours.amplitude.length).toBe(ref.a.length);
    for (let i = 0; i < ref.a.length; i++) {
      expect(Math.abs(ours.amplitude[i] - ref.a[i])).toBeLessThan(1e-9 * Math.max(1, ref.a[i]));
      expect(ours.frequencyHz[i]).toBeCloseTo(ref.f[i], 9);
    }
  });

  it('f-k amplitude (Hann in t and x, fftshift in k) equals numpy fft2', () => {
    const nTraces = 12, nSamples = 40, dt = 0.004, dx = 12.5;
    const d = gather(nTraces, nSamples, 2);
    const fk = fkSpectrum(d, nTraces, nSamples, dt, dx);
    const ref = numpy(`
d = np.array(p['d']).reshape(p['nx'], p['nt'])
d = d * np.hanning(p['nt'])[None, :] * np.hanning(p['nx'])[:, None]
F = np.fft.fft2(d, s=(16, 64))
A = np.abs(np.fft.fftshift(F[:, :33], axes=0))
k = np.fft.fftshift(np.fft.fftfreq(16, p['dx']))
print(json.dumps({'A': A.ravel().tolist(), 'k': k.tolist()}))`, { d: Array.from(d), nx: nTraces, nt: nSamples, dx }) as { A: number[]; k: number[] };
    expect(fk.nK).toBe(16);
    expect(fk.nF).toBe(33);
    for (let i = 0; i < ref.A.length; i++) expect(Math.abs(fk.amplitude[i] - ref.A[i])).toBeLessThan(1e-9 * Math.max(1, ref.A[i]));
    for (let k = 0; k < 16; k++) expect(fk.wavenumber[k]).toBeCloseTo(ref.k[k], 12);
  });

  it('decimation with zero traces puts energy at high wavenumbers; the full gather has less there', () => {
    // Replicas shifted by 1/(2Δx) in k appear when every second trace is zero (methods.md §5).
    const nTraces = 64, nSamples = 128;
    const full = gather(nTraces, nSamples, 3);
    const dec = full.slice();
    for (let x = 1; x < nTraces; x += 2) dec.fill(0, x * nSamples, (x + 1) * nSamples);
    const kCut = 0.25; // cycles per trace: half the fine-grid Nyquist
    const eFull = energyBeyondWavenumber(fkSpectrum(full, nTraces, nSamples, 0.004, null), kCut);
    const eDec = energyBeyondWavenumber(fkSpectrum(dec, nTraces, nSamples, 0.004, null), kCut);
    expect(eDec).toBeGreaterThan(0.3);
    expect(eFull).toBeLessThan(0.1);
  });
});

describe.skipIf(!havePy)('display gain', () => {
  it('the clip percentile equals numpy.percentile (linear interpolation) of |x| over live traces', () => {
    const nTraces = 9, nSamples = 70;
    const d = gather(nTraces, nSamples, 4);
    const live = Uint8Array.from({ length: nTraces }, (_, i) => (i === 4 ? 0 : 1));
    const ones = new Float32Array(d.length).fill(1);
    const ours = percentileAbs(d, ones, nTraces, nSamples, live, 97.5);
    const ref = numpy(`
d = np.abs(np.array(p['d'], dtype=np.float32).reshape(p['nx'], p['nt'])[np.array(p['live']) == 1])
print(json.dumps(float(np.percentile(d, 97.5))))`, { d: Array.from(d), nx: nTraces, nt: nSamples, live: Array.from(live) }) as number;
    expect(Math.abs(ours - ref)).toBeLessThan(1e-6 * ref);
  });

  it('AGC divides by the RMS in a centred window (clipped at the ends), as numpy computes it', () => {
    const nTraces = 3, nSamples = 120, dt = 0.004;
    const d = gather(nTraces, nSamples, 5);
    const live = new Uint8Array(nTraces).fill(1);
    const g = computeDisplayGain(d, nTraces, nSamples, live, dt, { traceBalance: false, agcWindowMs: 40, clipPercentile: 100 });
    const ref = numpy(`
d = np.array(p['d'], dtype=np.float32).astype(np.float64).reshape(p['nx'], p['nt'])
h = 5  # 40 ms / 4 ms / 2
out = []
for tr in d:
    s = np.concatenate([[0], np.cumsum(tr * tr)])
    lo = np.maximum(0, np.arange(len(tr)) - h); hi = np.minimum(len(tr), np.arange(len(tr)) + h + 1)
    rms = np.sqrt((s[hi] - s[lo]) / (hi - lo))
    out.append(tr / np.maximum(rms, rms.max() * 1e-3))
out = np.array(out)
print(json.dumps({'g': out.ravel().tolist(), 'clip': float(np.abs(out).max())}))`, { d: Array.from(d), nx: nTraces, nt: nSamples }) as { g: number[]; clip: number };
    for (let i = 0; i < d.length; i++) expect(Math.abs(d[i] * g.scale![i] * g.factor - ref.g[i] / ref.clip)).toBeLessThan(2e-5);
  });
});
