// `npm run bench -- fill`: speed, memory and accuracy figures of the fill (docs/fill.md).
// Inputs are built outside the timed parts; every timed result is read (SNR) so no work can be skipped.
// Sizes are samples × traces. Wall times on a shared 2-core machine vary with other load: CPU times (user+system
// of this process) are printed beside them.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fillGather, type FillSettings } from '../../core/fill/pipeline';
import { planFill } from '../../core/fill/plan';
import { gatherOnGrid, planFromGeometry, refineGeometry } from '../../core/fill/gather-grid';
import { gatherGeometry, indexGathers, memoryByteSource, openSegy, parseGatherKey, readGather } from '../../core/segy';
import { snrDb } from '../../core/quality/snr';
import { addHyperbola, addPlaneWave, hyperbolaSlopeField, type HyperbolaSpec } from '../../core/synth/events';
import { buildFillFixture } from '../cli/fill-fixture';

const ROOT = new URL('../../', import.meta.url).pathname;
const out: string[] = [];
const say = (s = '') => out.push(s);

function hyperbolas(nTraces: number, nSamples: number): { u: Float64Array; events: HyperbolaSpec[] } {
  const events: HyperbolaSpec[] = [0.2, 0.45, 0.7].map((f) => ({ t0Samples: f * nSamples, velocityTracesPerSample: 0.5 * (nTraces / 61), apexTrace: 0, fpCyclesPerSample: 0.08 }));
  const u = new Float64Array(nTraces * nSamples);
  for (const e of events) addHyperbola(u, nTraces, nSamples, e);
  return { u, events };
}

function holes(nTraces: number, kind: string): number[] {
  if (kind === 'gap16') {
    const a = Math.floor((nTraces - 16) / 2);
    return Array.from({ length: 16 }, (_, i) => a + i);
  }
  const k = Number(kind.slice(1));
  const h: number[] = [];
  for (let x = 0; x < nTraces - 1; x++) if (x % k) h.push(x); // the last trace stays recorded
  return h;
}

async function fillCase(u: Float64Array, nTraces: number, nSamples: number, hidden: number[], settings: Partial<FillSettings>, slopePairs?: Float64Array) {
  const data = Float32Array.from(u);
  for (const h of hidden) data.fill(0, h * nSamples, (h + 1) * nSamples);
  const present = Array.from({ length: nTraces }, (_, x) => (hidden.includes(x) ? 0 : 1));
  const plan = planFill({ nTraces, present });
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const r = await fillGather({ data, nTraces, nSamples, plan, slopePairs }, settings);
  const ms = performance.now() - t0;
  const c = process.cpuUsage(c0);
  return { r, ms, cpuMs: (c.user + c.system) / 1000, snr: snrDb(u, r.filled, hidden, nSamples) };
}

function linearSnr(u: Float64Array, nTraces: number, nSamples: number, hidden: number[]): number {
  const est = Float64Array.from(u);
  const live = (x: number) => !hidden.includes(x);
  for (const x of hidden) {
    let l = x - 1, r = x + 1;
    while (l >= 0 && !live(l)) l--;
    while (r < nTraces && !live(r)) r++;
    for (let t = 0; t < nSamples; t++) {
      const a = l >= 0 ? u[l * nSamples + t] : u[r * nSamples + t];
      const b = r < nTraces ? u[r * nSamples + t] : a;
      const w = l >= 0 && r < nTraces ? (x - l) / (r - l) : 0;
      est[x * nSamples + t] = (1 - w) * a + w * b;
    }
  }
  return snrDb(u, est, hidden, nSamples);
}

say(`Machine: ${cpus().length} × ${cpus()[0]?.model ?? '?'}; load average at start ${loadavg().map((v) => v.toFixed(1)).join(' ')}; Node ${process.version}.`);
say();

// 1. Speed on one core (this thread): estimated slopes, least squares, default settings.
say('### Slopes + fill on one core (least squares, estimated slopes)');
say();
say('| gather (samples × traces) | holes | slopes + fill, wall ms (CPU ms) | with hold-out check, wall ms (CPU ms) | SNR on filled traces (dB) | iterations |');
say('|---|---|---|---|---|---|');
for (const [nS, nT] of [[600, 120], [1000, 240]] as const) {
  const { u } = hyperbolas(nT, nS);
  for (const kind of ['gap16', 'x2']) {
    const hidden = holes(nT, kind);
    await fillCase(u, nT, nS, hidden, { holdout: false }); // warm-up (JIT)
    const a = await fillCase(u, nT, nS, hidden, { holdout: false });
    const b = await fillCase(u, nT, nS, hidden, {});
    say(`| ${nS} × ${nT} | ${kind === 'gap16' ? 'centred 16-trace gap' : 'decimated ×2'} | ${a.ms.toFixed(0)} (${a.cpuMs.toFixed(0)}) | ${b.ms.toFixed(0)} (${b.cpuMs.toFixed(0)}) | ${a.snr.toFixed(1)} | ${a.r.iterations} |`);
  }
}
say();
say(`Peak memory of this process so far (max RSS): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MiB.`);
say();

// 2. Accuracy against analytic truth (core/synth/events.ts), methods.md §6.5 ranges with exact slopes.
say('### SNR on the filled traces, analytic events (61 traces × 400 samples, Ricker 0.08–0.1 cycles/sample)');
say();
say('| events | holes | exact slopes (dB) | estimated slopes (dB) | hold-out with estimated slopes (dB) | linear interpolation (dB) |');
say('|---|---|---|---|---|---|');
{
  const nT = 61, nS = 400;
  const hyp = hyperbolas(nT, nS);
  const hypSlopes = hyperbolaSlopeField(new Float64Array((nT - 1) * nS), Array.from({ length: nT - 1 }, (_, p) => p + 0.5), nS, hyp.events);
  const pw = new Float64Array(nT * nS);
  addPlaneWave(pw, nT, nS, { t0Samples: 80, slopeSamplesPerTrace: 1.5, fpCyclesPerSample: 0.1 });
  addPlaneWave(pw, nT, nS, { t0Samples: 250, slopeSamplesPerTrace: 0.5, fpCyclesPerSample: 0.1, amplitude: 0.6 });
  const cases: [string, Float64Array, Float64Array | null][] = [
    ['hyperbolas (steepest slope 1.5)', hyp.u, hypSlopes],
    ['two plane waves σ = 1.5 and 0.5 (crossing)', pw, null],
  ];
  for (const [name, u, exact] of cases) {
    for (const kind of ['x2', 'x3', 'x4', 'gap16']) {
      const hidden = holes(nT, kind);
      const ex = exact ? (await fillCase(u, nT, nS, hidden, { holdout: false }, exact)).snr.toFixed(1) : 'n/a (two slopes at crossings)';
      const est = await fillCase(u, nT, nS, hidden, {});
      say(`| ${name} | ${kind === 'gap16' ? 'centred 16-trace gap' : `decimated ×${kind.slice(1)}`} | ${ex} | ${est.snr.toFixed(1)} | ${est.r.holdoutSnrDb.toFixed(1)} (${est.r.holdoutKind}) | ${linearSnr(u, nT, nS, hidden).toFixed(1)} |`);
    }
  }
}
say();

// 3. The demo line (samples/, invented scenario): fills scored against the complete line grv07-full.sgy.
say('### Demo line GRV-07 (samples/), scored against grv07-full.sgy');
say();
{
  const open = async (name: string) => {
    const path = join(ROOT, 'samples', name);
    const file = await openSegy(memoryByteSource(name, new Uint8Array(readFileSync(path))));
    const index = await indexGathers(file, parseGatherKey('record'));
    return { file, index };
  };
  if (!existsSync(join(ROOT, 'samples/grv07-full.sgy'))) say('Skipped: samples/ is missing.');
  else {
    const full = await open('grv07-full.sgy');
    say('| file | record | filled traces | SNR on filled traces (dB) | hold-out (dB) | linear interpolation (dB) | slopes, order, iterations | wall s |');
    say('|---|---|---|---|---|---|---|---|');
    for (const [name, factor] of [['grv07-gap.sgy', undefined], ['grv07-decimated.sgy', 2]] as const) {
      const src = await open(name);
      for (let i = 0; i < src.index.gathers.length; i++) {
        const g = await readGather(src.file, src.index, i);
        const truthG = await readGather(full.file, full.index, i);
        let geo = gatherGeometry(g.headers, g.data, g.nSamples);
        if (factor) geo = refineGeometry(geo, factor);
        const plan = planFromGeometry(geo, [], factor);
        const nS = g.nSamples;
        const t0 = performance.now();
        const r = await fillGather({ data: gatherOnGrid(g.data, geo, nS), nTraces: geo.gridCount, nSamples: nS, plan });
        const s = (performance.now() - t0) / 1000;
        const truth = truthG.data.subarray(0, geo.gridCount * nS); // channel k of the truth = grid position k
        const filled = plan.runs.flatMap((run) => Array.from({ length: run.count }, (_, j) => run.firstTrace + j));
        const present = Array.from({ length: geo.gridCount }, (_, k) => (filled.includes(k) ? 0 : 1));
        const lin = Float64Array.from(r.filled);
        for (const x of filled) {
          let l = x - 1, rr = x + 1;
          while (l >= 0 && !present[l]) l--;
          while (rr < geo.gridCount && !present[rr]) rr++;
          for (let t = 0; t < nS; t++) {
            const a = l >= 0 ? r.filled[l * nS + t] : r.filled[rr * nS + t];
            const b = rr < geo.gridCount ? r.filled[rr * nS + t] : a;
            lin[x * nS + t] = l >= 0 && rr < geo.gridCount ? a + ((b - a) * (x - l)) / (rr - l) : a;
          }
        }
        say(`| ${name} | ${g.keyValue} | ${filled.length} | ${snrDb(truth, r.filled, filled, nS).toFixed(1)} | ${r.holdoutSnrDb.toFixed(1)} (${r.holdoutKind}) | ${snrDb(truth, lin, filled, nS).toFixed(1)} | ${r.details.slopeChoice}, ${r.details.order}, ${r.iterations} | ${s.toFixed(1)} |`);
      }
    }
  }
}
say();

// 4. A 200-gather file through the bundled CLI with 1 and 2 worker threads.
say('### A 200-gather file through `dipweave fill` (24 traces × 150 samples per gather, 3-trace gap each)');
say();
const main = join(ROOT, 'dist-node/main.mjs');
if (!existsSync(main)) {
  say('Skipped: dist-node/main.mjs is missing (run `npm run build:node`).');
} else {
  const dir = mkdtempSync(join(tmpdir(), 'dipweave-bench-'));
  try {
    const gathers = Array.from({ length: 200 }, (_, i) => ({ record: i + 1, apexTrace: (i % 7) - 3, nPositions: 24, absent: [9 + (i % 4), 10 + (i % 4), 11 + (i % 4)] }));
    writeFileSync(join(dir, 'in.sgy'), buildFillFixture(gathers));
    say('| jobs | wall s | gathers per second | CPU s (user + system) | peak memory (max RSS, MiB) |');
    say('|---|---|---|---|---|');
    const haveTime = existsSync('/usr/bin/time');
    for (const jobs of [1, 2]) {
      const args = [main.replace(/main\.mjs$/, '../bin/dipweave.mjs'), 'fill', join(dir, 'in.sgy'), '--out', join(dir, `out${jobs}.sgy`), '--jobs', String(jobs)];
      const t0 = performance.now();
      const r = haveTime
        ? spawnSync('/usr/bin/time', ['-f', 'TIME %e %U %S %M', process.execPath, ...args], { encoding: 'utf8' })
        : spawnSync(process.execPath, args, { encoding: 'utf8' });
      const s = (performance.now() - t0) / 1000;
      if (r.status !== 0) {
        say(`| ${jobs} | failed (exit ${r.status}) | | | |`);
        continue;
      }
      const m = /TIME ([\d.]+) ([\d.]+) ([\d.]+) (\d+)/.exec(r.stderr ?? '');
      const cpu = m ? (Number(m[2]) + Number(m[3])).toFixed(1) : 'n/a';
      const rss = m ? (Number(m[4]) / 1024).toFixed(0) : 'n/a';
      say(`| ${jobs} | ${s.toFixed(1)} | ${(200 / s).toFixed(1)} | ${cpu} | ${rss} |`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
say();
say(`Load average at end: ${loadavg().map((v) => v.toFixed(1)).join(' ')}.`);
process.stdout.write(out.join('\n') + '\n');
