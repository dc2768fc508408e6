// Benchmark of the coordinate-network fill (issue 5). Run by `npm run bench` (scripts/bench.mjs), prints markdown.
// Scene 1 (network convergence, A and B): four hyperbolic events (core/synth/events.ts) with their exact slopes
// (methods.md §6.6), a 16-trace gap, window only: 32 traces × 600 samples.
// Scene 2 (realistic, B and C): the demo scenario (core/synth/demo-scenario.ts, invented marine line), shot 1, whose 16 obstructed
// channels are the gap; the full synthetic shot is the truth. Window only: the gap plus 8 live traces each side,
// first 600 samples. Slopes are estimated as the fill pipeline does (core/fill/fill-slopes.ts). SNR on the missing
// traces only (core/quality/snr.ts). Set NET_BENCH_QUICK=1 for a short smoke run.
import { availableParallelism, cpus, loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { solveGapsNetThreads } from '../../app/host/net-pool';
import { clipWildSlopes, slopeEstimator, slopesForFill } from '../../core/fill/fill-slopes';
import { solveLeastSquares } from '../../core/fill/lsq';
import { NET_DEFAULTS, resolveNetOptions, solveGapsNet, type NetSolverOptions } from '../../core/nn/solver';
import { trainNetWindow } from '../../core/nn/train';
import { blendNetWindows, planNetWindows, type NetWindowFill } from '../../core/nn/window';
import { snrDb } from '../../core/quality/snr';
import { DEMO_SCENARIO } from '../../core/synth/demo-scenario';
import { addHyperbola, hyperbolaSlopeField, type HyperbolaSpec } from '../../core/synth/events';
import { obstructedChannels } from '../../core/synth/marine-geometry';
import { synthesizeMarineLine } from '../../core/synth/marine-shot';

const quick = process.env.NET_BENCH_QUICK === '1';
// NET_BENCH_ONLY=AB (for example) runs only those sections.
const only = process.env.NET_BENCH_ONLY ?? 'ABC';
const line = synthesizeMarineLine(DEMO_SCENARIO);
const gapChannels = obstructedChannels(DEMO_SCENARIO, 0);
const margin = 8;
const x0 = gapChannels[0] - 1 - margin;
const nT = gapChannels.length + 2 * margin;
const nS = 600;

function crop(nSamples: number, sampleStart: number) {
  const truth = new Float64Array(nT * nSamples);
  for (let x = 0; x < nT; x++) for (let t = 0; t < nSamples; t++) truth[x * nSamples + t] = line.data[(x0 + x) * line.nSamples + sampleStart + t];
  const unknownTraces = new Uint8Array(nT);
  for (let x = margin; x < margin + gapChannels.length; x++) unknownTraces[x] = 1;
  const data = Float64Array.from(truth);
  for (let x = 0; x < nT; x++) if (unknownTraces[x]) data.fill(0, x * nSamples, (x + 1) * nSamples);
  const slopePairs = slopesForFill(data, nT, nSamples, unknownTraces, slopeEstimator(), 1);
  clipWildSlopes(slopePairs, data, unknownTraces, nT, nSamples);
  const scored = Array.from({ length: gapChannels.length }, (_, i) => margin + i);
  return { truth, input: { data, nTraces: nT, nSamples, unknownTraces, slopePairs }, scored };
}

/** Hyperbolas seen at offsets 40–71 traces (apex at −40), exact slope field, gap in the middle 16 traces. */
function analyticScene() {
  const events: HyperbolaSpec[] = [[90, 0.07], [210, 0.06], [340, 0.05], [480, 0.05]].map(([t0, fp]) => ({ t0Samples: t0, velocityTracesPerSample: 0.8, apexTrace: -40, fpCyclesPerSample: fp }));
  const truth = new Float64Array(nT * nS);
  for (const e of events) addHyperbola(truth, nT, nS, e);
  const slopePairs = hyperbolaSlopeField(new Float64Array((nT - 1) * nS), Array.from({ length: nT - 1 }, (_, p) => p + 0.5), nS, events);
  const unknownTraces = new Uint8Array(nT);
  for (let x = margin; x < margin + 16; x++) unknownTraces[x] = 1;
  const data = Float64Array.from(truth);
  for (let x = margin; x < margin + 16; x++) data.fill(0, x * nS, (x + 1) * nS);
  return { truth, input: { data, nTraces: nT, nSamples: nS, unknownTraces, slopePairs }, scored: Array.from({ length: 16 }, (_, i) => margin + i) };
}

const fmt = (v: number, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : String(v));
const out: string[] = [];
out.push(`Network fill benchmark. CPU: ${availableParallelism()} × ${cpus()[0]?.model ?? '?'}; Node ${process.version}; load average at start ${loadavg().map((v) => v.toFixed(1)).join(', ')} (other work on the machine slows every figure). Scene 2: demo shot 1, channels ${gapChannels[0]}–${gapChannels[gapChannels.length - 1]} missing (16 traces), window ${nT} traces × ${nS} samples. Defaults: width ${NET_DEFAULTS.width}, depth ${NET_DEFAULTS.depth}, ${NET_DEFAULTS.nFreq} frequencies, λ ${NET_DEFAULTS.lambda}, learning rate ${NET_DEFAULTS.learningRate}, batches ${NET_DEFAULTS.batchData}+${NET_DEFAULTS.batchColloc}, time windows ${NET_DEFAULTS.windowSamples} samples.`);
out.push('');

const scene = analyticScene();
const demo = crop(nS, 0);
for (const [name, sc] of [['Scene 1 (hyperbolas, exact slopes)', scene], ['Scene 2 (demo, estimated slopes)', demo]] as const) {
  const t = performance.now();
  const l = solveLeastSquares(sc.input);
  out.push(`${name}: least squares SNR ${fmt(snrDb(sc.truth, l.data, sc.scored, nS))} dB in ${fmt((performance.now() - t) / 1000, 2)} s.`);
}
out.push('');

// A. SNR against training time on one core: every window trained in turn with snapshots; the SNR at step k blends
// all windows' snapshots at k, the time is the sum of the windows' times to k (snapshot evaluation excluded).
const maxSteps = quick ? 200 : 900;
const every = quick ? 100 : 150;
if (only.includes('A')) {
  const o = resolveNetOptions({ steps: maxSteps });
  const jobs = planNetWindows(scene.input.data, nT, nS, scene.input.unknownTraces, scene.input.slopePairs, o);
  const snaps = new Map<number, NetWindowFill[]>();
  const times = new Map<number, number>();
  for (const job of jobs) {
    let snapSeconds = 0;
    const t0 = performance.now();
    await trainNetWindow(job, { ...o, timeBudgetSeconds: Infinity }, {
      snapshotEvery: every,
      onSnapshot: (step, fill) => {
        const ts = performance.now();
        const list = snaps.get(step) ?? [];
        list.push({ index: job.index, fill: Float64Array.from(fill), steps: step, seconds: 0, terms: {} });
        snaps.set(step, list);
        times.set(step, (times.get(step) ?? 0) + (ts - t0) / 1000 - snapSeconds);
        snapSeconds += (performance.now() - ts) / 1000;
      },
    });
  }
  out.push(`### A. Scene 1: SNR against training steps, one core (${jobs.length} windows trained in turn, a ${maxSteps}-step schedule)`);
  out.push('');
  out.push('| steps per window | wall seconds (1 core) | SNR on missing traces (dB) |');
  out.push('|---|---|---|');
  for (const [step, fills] of [...snaps].sort((a, b) => a[0] - b[0])) {
    const blended = Float64Array.from(scene.input.data);
    blendNetWindows(blended, nS, jobs, fills, o.overlapSamples);
    out.push(`| ${step} | ${fmt(times.get(step) ?? NaN)} | ${fmt(snrDb(scene.truth, blended, scene.scored, nS))} |`);
  }
  out.push('');
}

// B. Wall time of complete runs on 1 and 2 worker threads (same result, bit for bit).
if (only.includes('B')) {
  out.push('### B. Complete fills on worker threads');
  out.push('');
  out.push('CPU seconds are those of the whole process (all threads, process.cpuUsage); on an otherwise idle machine the');
  out.push('wall time would be about CPU seconds ÷ threads. They are given because other jobs shared this machine.');
  out.push('');
  out.push('| scene | steps | threads | wall seconds | CPU seconds | SNR (dB) |');
  out.push('|---|---|---|---|---|---|');
  const runs: [string, typeof scene, number, number][] = quick
    ? [['1', scene, 100, 2]]
    : [['1', scene, 600, 1], ['1', scene, 600, 2], ['2', demo, 600, 2]];
  for (const [name, sc, steps, threads] of runs) {
    const t = performance.now();
    const c = process.cpuUsage();
    const r = await solveGapsNetThreads(sc.input, { steps }, threads);
    const cpu = process.cpuUsage(c);
    out.push(`| ${name} | ${steps} | ${threads} | ${fmt((performance.now() - t) / 1000)} | ${fmt((cpu.user + cpu.system) / 1e6)} | ${fmt(snrDb(sc.truth, r.data, sc.scored, nS))} |`);
  }
  out.push('');
}

// C. Study on one time window (160 samples around the strongest reflections): one setting changed at a time.
if (only.includes('C')) {
  const small = crop(160, 200);
  const base: NetSolverOptions = { steps: quick ? 100 : 400, windowSamples: 160 };
  const rows: [string, NetSolverOptions][] = [
    ['defaults', {}],
    ['width 16', { width: 16, nFreq: 12 }],
    ['width 64', { width: 64, nFreq: 48 }],
    ['depth 1', { depth: 1 }],
    ['depth 3', { depth: 3 }],
    ['steps ×2', { steps: (base.steps ?? 400) * 2 }],
    ['λ = 0 (data only)', { lambda: 0 }],
    ['λ = 1', { lambda: 1 }],
    ['λ = 10', { lambda: 10 }],
    ['isotropic features', { features: 'isotropic' }],
    ['start from least squares', { start: 'lsq' }],
  ];
  const lsq = snrDb(small.truth, solveLeastSquares(small.input).data, small.scored, 160);
  out.push(`### C. Scene 2, one window (${nT} traces × 160 samples from sample 200), ${base.steps} steps unless stated; least squares: ${fmt(lsq)} dB`);
  out.push('');
  out.push('| setting | wall seconds (1 thread) | CPU seconds | SNR (dB) |');
  out.push('|---|---|---|---|');
  for (const [name, o] of quick ? rows.slice(0, 3) : rows) {
    const t = performance.now();
    const c = process.cpuUsage();
    const r = await solveGapsNet(small.input, { ...base, ...o });
    const cpu = process.cpuUsage(c);
    out.push(`| ${name} | ${fmt((performance.now() - t) / 1000)} | ${fmt((cpu.user + cpu.system) / 1e6)} | ${fmt(snrDb(small.truth, r.data, small.scored, 160))} |`);
  }
  out.push('');
}
process.stdout.write(out.join('\n') + '\n');
