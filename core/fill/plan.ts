/**
 * The fill plan: which positions of a gather's regular grid get filled, and why. Plain JSON-serialisable
 * data, so the UI can show it on the section and let the user edit it (mark or unmark traces).
 *
 * Positions are grid indices 0..nTraces−1 (trace-major layout, core/grid/gather.ts). A run is a maximal
 * stretch of consecutive positions with one reason:
 *   'decimation' – the k−1 positions between two recorded traces of a regularly decimated gather;
 *   'gap'        – a wider run of absent positions (e.g. an obstruction);
 *   'missing'    – an isolated absent position that fits neither pattern;
 *   'dead'       – a recorded trace flagged dead (trace identification code 2) or holding only zeros;
 *   'bad'        – a trace the user marked to be replaced.
 */
export type FillReason = 'decimation' | 'gap' | 'missing' | 'dead' | 'bad';

export interface FillRun {
  firstTrace: number;
  count: number;
  reason: FillReason;
}

export interface FillPlan {
  /** Positions on the regular grid (recorded and to be filled). */
  nTraces: number;
  /** Regular decimation factor k (k−1 new positions between recorded ones); 1 when not decimated. */
  factor: number;
  /** Sorted, non-overlapping. */
  runs: FillRun[];
}

export interface PlanInput {
  nTraces: number;
  /** 1 where a recorded trace sits at the grid position, 0 where the position is absent. */
  present: ArrayLike<number>;
  /** 1 where the recorded trace is dead. */
  dead?: ArrayLike<number>;
  /** Positions the user marked bad. */
  bad?: readonly number[];
  /** Decimation factor when known; detected from the absent positions when omitted. */
  factor?: number;
}

/**
 * Detects regular decimation: the stretches of absent positions between two recorded traces mostly (≥ 75 %,
 * at least two) share one length k−1 ≥ 1. Other stretches are then gaps or isolated missing traces. Returns 1
 * when no such pattern holds.
 */
export function detectDecimationFactor(present: ArrayLike<number>): number {
  const lengths: number[] = [];
  let last = -1;
  for (let i = 0; i < present.length; i++) {
    if (!present[i]) continue;
    if (last >= 0) lengths.push(i - last - 1);
    last = i;
  }
  if (lengths.length < 2) return 1;
  const counts = new Map<number, number>();
  for (const l of lengths) counts.set(l, (counts.get(l) ?? 0) + 1);
  let mode = 0;
  let best = 0;
  for (const [l, c] of counts) if (c > best || (c === best && l < mode)) [mode, best] = [l, c];
  return mode >= 1 && best >= 2 && best >= 0.75 * lengths.length ? mode + 1 : 1;
}

/** Builds the plan from which positions are recorded, dead or marked bad. */
export function planFill(input: PlanInput): FillPlan {
  const { nTraces, present } = input;
  if (present.length !== nTraces) throw new RangeError(`planFill: present has ${present.length} entries, expected ${nTraces}`);
  const factor = input.factor ?? detectDecimationFactor(present);
  const reason: (FillReason | null)[] = new Array(nTraces).fill(null);
  const badSet = new Set(input.bad ?? []);
  for (const b of badSet) if (!Number.isInteger(b) || b < 0 || b >= nTraces) throw new RangeError(`planFill: bad trace ${b} is outside 0..${nTraces - 1}`);
  // Absent stretches first: classify each by its length and whether recorded traces bound it.
  let i = 0;
  while (i < nTraces) {
    if (present[i]) {
      i++;
      continue;
    }
    let j = i;
    while (j < nTraces && !present[j]) j++;
    const len = j - i;
    const bounded = i > 0 && j < nTraces;
    const r: FillReason = factor > 1 && bounded && len === factor - 1 ? 'decimation' : len >= 2 ? 'gap' : 'missing';
    for (let q = i; q < j; q++) reason[q] = r;
    i = j;
  }
  for (let q = 0; q < nTraces; q++) {
    if (present[q] && input.dead?.[q]) reason[q] = 'dead';
    if (badSet.has(q)) reason[q] = 'bad';
  }
  return { nTraces, factor, runs: runsFromReasons(reason) };
}

function runsFromReasons(reason: (FillReason | null)[]): FillRun[] {
  const runs: FillRun[] = [];
  for (let q = 0; q < reason.length; q++) {
    const r = reason[q];
    if (r === null) continue;
    const prev = runs[runs.length - 1];
    if (prev && prev.reason === r && prev.firstTrace + prev.count === q) prev.count++;
    else runs.push({ firstTrace: q, count: 1, reason: r });
  }
  return runs;
}

/** 1 for positions the plan fills, 0 for recorded traces held exactly. */
export function unknownMask(plan: FillPlan): Uint8Array {
  const m = new Uint8Array(plan.nTraces);
  for (const r of plan.runs) m.fill(1, r.firstTrace, r.firstTrace + r.count);
  return m;
}

/** Number of positions the plan fills. */
export function countToFill(plan: FillPlan): number {
  return plan.runs.reduce((s, r) => s + r.count, 0);
}

/** Returns a new plan with `trace` marked bad (or unmarked: the position goes back to its recorded state). */
export function markBad(plan: FillPlan, trace: number, isBad: boolean, present: ArrayLike<number>, dead?: ArrayLike<number>): FillPlan {
  const bad = new Set(plan.runs.filter((r) => r.reason === 'bad').flatMap((r) => Array.from({ length: r.count }, (_, i) => r.firstTrace + i)));
  if (isBad) bad.add(trace);
  else bad.delete(trace);
  return planFill({ nTraces: plan.nTraces, present, dead, bad: [...bad].sort((a, b) => a - b), factor: plan.factor });
}

/** Maximal stretches of consecutive positions to fill, whatever their reasons: [first, last] inclusive. */
export function unknownBlocks(unknown: ArrayLike<number>): [number, number][] {
  const blocks: [number, number][] = [];
  let i = 0;
  while (i < unknown.length) {
    if (!unknown[i]) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < unknown.length && unknown[j + 1]) j++;
    blocks.push([i, j]);
    i = j + 1;
  }
  return blocks;
}

/** Checks a plan read from JSON (UI edits, recipes); returns a message for the first fault or null. */
export function planFault(plan: unknown): string | null {
  if (typeof plan !== 'object' || plan === null) return 'the plan is not an object';
  const p = plan as Partial<FillPlan>;
  if (!Number.isInteger(p.nTraces) || (p.nTraces as number) < 1) return `nTraces must be a positive whole number (found ${String(p.nTraces)})`;
  if (!Number.isInteger(p.factor) || (p.factor as number) < 1) return `factor must be a whole number ≥ 1 (found ${String(p.factor)})`;
  if (!Array.isArray(p.runs)) return 'runs must be a list';
  let end = 0;
  for (const r of p.runs as FillRun[]) {
    if (!Number.isInteger(r?.firstTrace) || !Number.isInteger(r?.count) || r.count < 1) return `run ${JSON.stringify(r)} needs whole-number firstTrace and count ≥ 1`;
    if (r.firstTrace < end || r.firstTrace + r.count > (p.nTraces as number)) return `run at ${r.firstTrace} overlaps another run or leaves the grid`;
    if (!['decimation', 'gap', 'missing', 'dead', 'bad'].includes(r.reason)) return `run at ${r.firstTrace} has an unknown reason "${String(r.reason)}"`;
    end = r.firstTrace + r.count;
  }
  return null;
}
