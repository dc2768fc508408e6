/**
 * Windowing for the network fill: each run of missing traces is trained on its own region (the run plus a margin
 * of live traces each side), cut into overlapping time windows for long traces; the window fills are blended
 * back with tapers that sum to one. Only the run's own traces are written; live traces are never touched.
 * Layout: trace-major (core/grid/gather.ts); slopes on the pair grid (core/pwd/operator.ts).
 * Jobs are plain data (typed arrays and numbers), so they cross postMessage to any worker type.
 */

/** One training job: a rectangle of the gather around one run of missing traces. */
export interface NetWindowJob {
  index: number;
  /** First gather trace and sample of the rectangle. */
  traceStart: number;
  sampleStart: number;
  nTraces: number;
  nSamples: number;
  /** Rectangle data, trace-major, known traces only meaningful. */
  data: Float64Array;
  /** 1 = live trace in the rectangle. */
  known: Uint8Array;
  /** Pair-grid slopes inside the rectangle, (nTraces−1)·nSamples. */
  slopePairs: Float64Array;
  /** Traces to fill, rectangle coordinates [fillStart, fillEnd). */
  fillStart: number;
  fillEnd: number;
  seed: number;
  /** Optional prior fill of traces [fillStart, fillEnd) (e.g. least squares), same layout as NetWindowFill.fill. */
  prior?: Float64Array;
}

export interface NetWindowFill {
  index: number;
  /** (fillEnd − fillStart)·nSamples, trace-major. */
  fill: Float64Array;
  steps: number;
  seconds: number;
  terms: Record<string, number>;
}

/** Runs of consecutive unknown traces: [start, end) pairs. */
export function missingRuns(unknownTraces: Uint8Array): [number, number][] {
  const runs: [number, number][] = [];
  let x = 0;
  while (x < unknownTraces.length) {
    if (!unknownTraces[x]) {
      x++;
      continue;
    }
    const s = x;
    while (x < unknownTraces.length && unknownTraces[x]) x++;
    runs.push([s, x]);
  }
  return runs;
}

/** Start samples of time windows of length w covering n samples with at least `overlap` in common. */
export function timeWindowStarts(nSamples: number, windowSamples: number, overlapSamples: number): number[] {
  if (nSamples <= windowSamples) return [0];
  const hop = windowSamples - overlapSamples;
  const count = Math.ceil((nSamples - windowSamples) / hop) + 1;
  const starts: number[] = [];
  for (let k = 0; k < count; k++) starts.push(Math.round((k * (nSamples - windowSamples)) / (count - 1)));
  return starts;
}

export interface WindowPlanOptions {
  marginTraces: number;
  windowSamples: number;
  overlapSamples: number;
  seed: number;
}

/** Cuts the gather into training jobs. Allocates the job copies. */
export function planNetWindows(
  data: Float64Array, nTraces: number, nSamples: number, unknownTraces: Uint8Array, slopePairs: Float64Array, o: WindowPlanOptions,
  prior: Float64Array | null = null,
): NetWindowJob[] {
  const jobs: NetWindowJob[] = [];
  const wS = Math.min(nSamples, o.windowSamples);
  const starts = timeWindowStarts(nSamples, wS, Math.min(o.overlapSamples, wS - 1));
  for (const [g0, g1] of missingRuns(unknownTraces)) {
    const x0 = Math.max(0, g0 - o.marginTraces);
    const x1 = Math.min(nTraces, g1 + o.marginTraces);
    const nT = x1 - x0;
    for (const s0 of starts) {
      const jd = new Float64Array(nT * wS);
      const known = new Uint8Array(nT);
      const sp = new Float64Array(Math.max(0, nT - 1) * wS);
      for (let x = 0; x < nT; x++) {
        known[x] = unknownTraces[x0 + x] ? 0 : 1;
        if (known[x]) jd.set(data.subarray((x0 + x) * nSamples + s0, (x0 + x) * nSamples + s0 + wS), x * wS);
        if (x < nT - 1) sp.set(slopePairs.subarray((x0 + x) * nSamples + s0, (x0 + x) * nSamples + s0 + wS), x * wS);
      }
      let pj: Float64Array | undefined;
      if (prior) {
        pj = new Float64Array((g1 - g0) * wS);
        for (let x = g0; x < g1; x++) pj.set(prior.subarray(x * nSamples + s0, x * nSamples + s0 + wS), (x - g0) * wS);
      }
      const index = jobs.length;
      jobs.push({
        index, traceStart: x0, sampleStart: s0, nTraces: nT, nSamples: wS, data: jd, known, slopePairs: sp,
        fillStart: g0 - x0, fillEnd: g1 - x0,
        // Each job has its own seed, so results do not depend on how jobs are spread over workers.
        prior: pj,
        seed: (Math.imul(o.seed ^ 0x9e3779b9, 2654435761) + Math.imul(index + 1, 0x85ebca6b)) >>> 0,
      });
    }
  }
  return jobs;
}

/** Raised-cosine ramp weight of sample t in a window [s0, s0+n) of a trace of nSamples (no ramp at trace ends). */
function rampWeight(t: number, s0: number, n: number, ramp: number, nSamples: number): number {
  let w = 1;
  if (s0 > 0 && t - s0 < ramp) w *= 0.5 - 0.5 * Math.cos((Math.PI * (t - s0 + 0.5)) / ramp);
  const end = s0 + n;
  if (end < nSamples && end - t <= ramp) w *= 0.5 - 0.5 * Math.cos((Math.PI * (end - t - 0.5)) / ramp);
  return w;
}

/**
 * Blends window fills into out (the whole gather, known traces already copied in). Weights are normalised to sum
 * to one at every sample of a filled trace. @returns out
 */
export function blendNetWindows(out: Float64Array, nSamples: number, jobs: readonly NetWindowJob[], fills: readonly NetWindowFill[], overlapSamples: number): Float64Array {
  const byIndex = new Map(fills.map((f) => [f.index, f]));
  const wsum = new Map<number, Float64Array>();
  const acc = new Map<number, Float64Array>();
  for (const job of jobs) {
    const f = byIndex.get(job.index);
    if (!f) continue;
    const ramp = Math.max(1, Math.min(overlapSamples, job.nSamples - 1));
    for (let x = job.fillStart; x < job.fillEnd; x++) {
      const gx = job.traceStart + x;
      let a = acc.get(gx);
      let w = wsum.get(gx);
      if (!a || !w) {
        a = new Float64Array(nSamples);
        w = new Float64Array(nSamples);
        acc.set(gx, a);
        wsum.set(gx, w);
      }
      const base = (x - job.fillStart) * job.nSamples;
      for (let t = 0; t < job.nSamples; t++) {
        const gt = job.sampleStart + t;
        const wt = rampWeight(gt, job.sampleStart, job.nSamples, ramp, nSamples);
        a[gt] += wt * f.fill[base + t];
        w[gt] += wt;
      }
    }
  }
  for (const [gx, a] of acc) {
    const w = wsum.get(gx)!;
    for (let t = 0; t < nSamples; t++) out[gx * nSamples + t] = w[t] > 0 ? a[t] / w[t] : 0;
  }
  return out;
}
