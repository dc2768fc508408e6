// `npm run bench -- slopes`: speed, memory and accuracy of slope estimation (docs/slopes.md).
// Sizes are samples × traces. Inputs are built outside the timed part; every result is read (an error figure)
// so no work can be skipped. Each timing/memory case runs in its own child process (peak memory = growth of the
// process's maximum resident set while estimating, after the input exists). Wall times on a shared machine vary
// with other load: CPU time (user + system of the child) is printed beside them, with the load average.
import { spawnSync } from 'node:child_process';
import { cpus, loadavg } from 'node:os';
import { Rng } from '../../core/rng';
import { createRealFftPlan } from '../../core/fft/real-fft';
import { estimateSlopes } from '../../core/slope/estimate';
import type { SlopeOptions } from '../../core/slope/types';
import { addHyperbola, addPlaneWave, hyperbolaSlopeField, hyperbolaTime, type HyperbolaSpec } from '../../core/synth/events';

const median = (a: number[]) => a.slice().sort((x, y) => x - y)[a.length >> 1];
const rms = (a: number[]) => Math.sqrt(a.reduce((s, v) => s + v * v, 0) / a.length);

/** A shot-like gather: 12 hyperbolas of random times and velocities, amplitudes decaying with time. */
function shotLike(nS: number, nT: number): Float64Array {
  const u = new Float64Array(nT * nS);
  const rng = new Rng(1);
  for (let e = 0; e < 12; e++) {
    const t0 = 40 + rng.uniform() * (nS - 80);
    addHyperbola(u, nT, nS, { t0Samples: t0, velocityTracesPerSample: (0.4 + rng.uniform() * 0.6) * (nT / 120), apexTrace: -5, fpCyclesPerSample: 0.06, amplitude: rng.normal() * Math.exp(-t0 / nS) });
  }
  return u;
}

function child(nS: number, nT: number, method: 'pwd' | 'tensor'): void {
  const u = shotLike(nS, nT);
  const live = new Uint8Array(nT).fill(1);
  estimateSlopes(u.subarray(0, 40 * nS), 40, nS, live.subarray(0, 40), { method }); // warm the JIT on a small copy
  (globalThis as { gc?: () => void }).gc?.();
  const rss0 = process.resourceUsage().maxRSS;
  const times: number[] = [], cpu: number[] = [];
  let check = 0;
  for (let r = 0; r < 5; r++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const f = estimateSlopes(u, nT, nS, live, { method });
    times.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
    check += f.slopePairs[(nT >> 1) * nS + (nS >> 1)] + f.info.timeLevels;
  }
  const rss1 = process.resourceUsage().maxRSS;
  console.log(JSON.stringify({ wall: median(times), wallMin: Math.min(...times), cpu: median(cpu), peakMiB: (rss1 - rss0) / 1024, check }));
}

if (process.argv[2] === '--child') {
  child(Number(process.argv[3]), Number(process.argv[4]), process.argv[5] as 'pwd' | 'tensor');
} else {
  const out: string[] = [];
  const say = (s = '') => out.push(s);
  const [l1] = loadavg();
  // Calibration: a 1024-point fft.js real transform took 7–10 µs on a quiet machine of this kind
  // (/work/shared/docs/stack.md §1c); the ratio tells how much the current load slows everything down.
  const plan = createRealFftPlan(1024);
  const xin = new Float64Array(1024).map((_, i) => Math.sin(0.1 * i)), xout = new Float64Array(2048);
  for (let k = 0; k < 500; k++) plan.impl.realTransform(xout, xin);
  const c0 = process.cpuUsage();
  for (let k = 0; k < 4000; k++) plan.impl.realTransform(xout, xin);
  const cc = process.cpuUsage(c0);
  const fftUs = (cc.user + cc.system) / 4000;
  say(`Slope estimation with default settings, one core (${cpus().length} × ${cpus()[0]?.model ?? '?'}, load average ${l1.toFixed(1)} at start; Node ${process.version}). Median of 5 runs after a warm-up. Calibration: 1024-point fft.js real transform ${fftUs.toFixed(1)} µs CPU here (7–10 µs on a quiet machine, stack.md §1c).`);
  say('');
  say('| gather (samples × traces) | method | wall median | wall min | CPU median | peak extra memory |');
  say('|---|---|---|---|---|---|');
  for (const [nS, nT] of [[600, 120], [1000, 240]]) {
    for (const method of ['pwd', 'tensor'] as const) {
      const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', new URL(import.meta.url).pathname, '--child', String(nS), String(nT), method], { encoding: 'utf8' });
      if (r.status !== 0) throw new Error(r.stderr);
      const j = JSON.parse(r.stdout.trim().split('\n').pop() as string);
      say(`| ${nS} × ${nT} | ${method} | ${j.wall.toFixed(0)} ms | ${j.wallMin.toFixed(0)} ms | ${j.cpu.toFixed(0)} ms | ${j.peakMiB.toFixed(1)} MiB |`);
    }
  }

  // Accuracy: constant plane waves (40 random events, f_p = 0.08 cycles/sample), median |error| away from edges.
  say('');
  say('Accuracy on analytic gathers (samples per trace; Ricker wavelets, f_p = 0.08 cycles/sample unless stated):');
  say('');
  say('| case | pwd (default) | tensor | coarse-to-fine levels |');
  say('|---|---|---|---|');
  for (const s of [0.3, 1, 2, 3, 4, 6, 8]) {
    const nT = 40, nS = 300;
    const u = new Float64Array(nT * nS);
    const rng = new Rng(7);
    for (let e = 0; e < 40; e++) addPlaneWave(u, nT, nS, { t0Samples: rng.uniform() * (nS + s * nT) - s * nT, slopeSamplesPerTrace: s, fpCyclesPerSample: 0.08, amplitude: rng.normal() });
    const err = (o: SlopeOptions) => {
      const f = estimateSlopes(u, nT, nS, new Uint8Array(nT).fill(1), o);
      const e: number[] = [];
      for (let p = 5; p < nT - 6; p++) for (let t = 30; t < nS - 30; t++) e.push(Math.abs(f.slopePairs[p * nS + t] - s));
      return { m: median(e), levels: f.info.timeLevels };
    };
    const a = err({}), b = err({ method: 'tensor' });
    say(`| plane waves σ = ${s}: median error | ${a.m.toFixed(4)} | ${b.m.toFixed(4)} | ${a.levels} |`);
  }
  const events: HyperbolaSpec[] = [100, 200, 300].map((t0) => ({ t0Samples: t0, velocityTracesPerSample: 0.5, apexTrace: 0, fpCyclesPerSample: 0.08 }));
  const nT = 61, nS = 400;
  const full = new Float64Array(nT * nS);
  for (const e of events) addHyperbola(full, nT, nS, e);
  const exact = hyperbolaSlopeField(new Float64Array((nT - 1) * nS), Array.from({ length: nT - 1 }, (_, p) => p + 0.5), nS, events);
  const nearEvents = (est: Float64Array, p0: number, p1: number) => {
    const e: number[] = [];
    for (let p = p0; p <= p1; p++) for (const ev of events) {
      const tt = Math.round(hyperbolaTime(ev, p + 0.5));
      for (let t = tt - 3; t <= tt + 3; t++) if (t >= 0 && t < nS) e.push(est[p * nS + t] - exact[p * nS + t]);
    }
    return rms(e);
  };
  {
    const a = estimateSlopes(full, nT, nS, new Uint8Array(nT).fill(1));
    const b = estimateSlopes(full, nT, nS, new Uint8Array(nT).fill(1), { method: 'tensor' });
    say(`| hyperbolas (methods.md §6.6, 61 × 400): rms error within ±3 samples of events | ${nearEvents(a.slopePairs, 3, nT - 5).toFixed(4)} | ${nearEvents(b.slopePairs, 3, nT - 5).toFixed(4)} | ${a.info.timeLevels} |`);
  }

  // Decimation: estimate on the live traces with and without the low-pass below the alias frequency.
  say('');
  say('Regular decimation by k of the hyperbolas (fine-grid rms error near events, samples per trace):');
  say('');
  say('| f_p (cycles/sample) | k | auto low-pass (cut-off, cycles/sample) | no low-pass | steepest coarse slope measured | levels |');
  say('|---|---|---|---|---|---|');
  for (const fp of [0.08, 0.16]) {
    const evs = events.map((e) => ({ ...e, fpCyclesPerSample: fp }));
    const fullF = new Float64Array(nT * nS);
    for (const e of evs) addHyperbola(fullF, nT, nS, e);
    for (const k of [2, 3, 4]) {
      const live = new Uint8Array(nT);
      const u = new Float64Array(nT * nS);
      for (let x = 0; x < nT; x += k) { live[x] = 1; u.set(fullF.subarray(x * nS, (x + 1) * nS), x * nS); }
      const a = estimateSlopes(u, nT, nS, live);
      const b = estimateSlopes(u, nT, nS, live, { lowpassCyclesPerSample: 'off' });
      say(`| ${fp} | ${k} | ${nearEvents(a.slopePairs, 4, nT - 6).toFixed(4)} (${a.info.lowpassCyclesPerSample.toFixed(3)}) | ${nearEvents(b.slopePairs, 4, nT - 6).toFixed(4)} | ${a.info.maxSlopeSamplesPerTrace.toFixed(2)} | ${a.info.timeLevels} |`);
    }
  }

  // Gaps: event-path inpainting versus interpolation along time rows and versus no inpainting (shaping only).
  say('');
  say('Gap of G missing traces in the middle of the hyperbolas (rms error near events inside the gap, samples per trace):');
  say('');
  say('| G | along events (default) | along time rows | shaping only (prior fallback) | mean confidence inside |');
  say('|---|---|---|---|---|');
  for (const G of [4, 8, 16, 24]) {
    const a0 = 30 - G / 2, b0 = a0 + G - 1;
    const live = new Uint8Array(nT).fill(1);
    const u = full.slice();
    for (let x = a0; x <= b0; x++) { live[x] = 0; u.fill(0, x * nS, (x + 1) * nS); }
    const f = estimateSlopes(u, nT, nS, live);
    const rows = f.estimatePairs.slice();
    for (let p = a0 - 1; p <= b0; p++) {
      const w = (p + 0.5 - (a0 - 1.5)) / (b0 + 1.5 - (a0 - 1.5));
      for (let t = 0; t < nS; t++) rows[p * nS + t] = (1 - w) * f.estimatePairs[(a0 - 2) * nS + t] + w * f.estimatePairs[(b0 + 1) * nS + t];
    }
    const shaping = estimateSlopes(u, nT, nS, live, { gapSlopes: 'prior' });
    let cin = 0, nin = 0;
    for (let p = a0 - 1; p <= b0; p++) for (let t = 0; t < nS; t++) { cin += f.confidencePairs[p * nS + t]; nin++; }
    say(`| ${G} | ${nearEvents(f.slopePairs, a0 - 1, b0).toFixed(4)} | ${nearEvents(rows, a0 - 1, b0).toFixed(4)} | ${nearEvents(shaping.slopePairs, a0 - 1, b0).toFixed(4)} | ${(cin / nin).toFixed(2)} |`);
  }
  // Linear events of two very different slopes crossing a 16-trace gap: here the time rows at the gap's edges
  // belong to different events than the row inside, so interpolating along rows goes wrong.
  {
    const nT2 = 61, nS2 = 400, G = 16, a0 = 22, b0 = a0 + G - 1, xc = 29.5;
    const evs = [[100, 2.5], [150, 2.5], [190, 0.2], [230, 0.2], [270, -0.6], [310, 0.2]] as const;
    const u = new Float64Array(nT2 * nS2);
    for (const [tc, sl] of evs) addPlaneWave(u, nT2, nS2, { t0Samples: tc - sl * xc, slopeSamplesPerTrace: sl, fpCyclesPerSample: 0.06 });
    const live = new Uint8Array(nT2).fill(1);
    for (let x = a0; x <= b0; x++) { live[x] = 0; u.fill(0, x * nS2, (x + 1) * nS2); }
    const f = estimateSlopes(u, nT2, nS2, live);
    const shaping = estimateSlopes(u, nT2, nS2, live, { gapSlopes: 'prior' });
    const rows = f.estimatePairs.slice();
    for (let p = a0 - 1; p <= b0; p++) {
      const w = (p + 0.5 - (a0 - 1.5)) / (b0 + 1.5 - (a0 - 1.5));
      for (let t = 0; t < nS2; t++) rows[p * nS2 + t] = (1 - w) * f.estimatePairs[(a0 - 2) * nS2 + t] + w * f.estimatePairs[(b0 + 1) * nS2 + t];
    }
    const errAt = (est: Float64Array) => {
      const e: number[] = [];
      for (let p = a0 - 1; p <= b0; p++) for (const [tc, sl] of evs) {
        const tt = Math.round(tc + sl * (p + 0.5 - xc));
        for (let t = tt - 3; t <= tt + 3; t++) if (t >= 0 && t < nS2) e.push(est[p * nS2 + t] - sl);
      }
      return rms(e);
    };
    say(`| 16, linear events of slopes 2.5, 0.2 and −0.6 | ${errAt(f.slopePairs).toFixed(4)} | ${errAt(rows).toFixed(4)} | ${errAt(shaping.slopePairs).toFixed(4)} | – |`);
  }
  console.log(out.join('\n'));
}
