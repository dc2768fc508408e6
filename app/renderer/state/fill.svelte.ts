/**
 * The fill step: the plan (what gets filled and why), solver settings, a running job's progress and loss
 * history, and the result with its hold-out score. Rune state in a plain class, testable in node.
 */
import { countToFill, markBad, planFill, unknownMask, type FillPlan } from '../../../core/fill/plan';
import type { SolverProgress } from '../../../core/fill/solver';
import type { FillResult, FillSettings } from '../workers/protocol';

export const DEFAULT_FILL_SETTINGS: FillSettings = {
  solver: 'lsq', maxIterations: 300, tolerance: 1e-4, steps: 600, seed: 1, holdout: true, secondPass: false,
};

export interface LossPoint {
  /** Steps since the fill started, across stages. */
  step: number;
  stage: string;
  terms: Record<string, number>;
}

export interface FillRunState {
  stage: string;
  fraction: number;
  secondsLeft: number;
  elapsedSeconds: number;
}

export class FillState {
  plan = $state.raw<FillPlan | null>(null);
  settings = $state<FillSettings>({ ...DEFAULT_FILL_SETTINGS });
  running = $state.raw<FillRunState | null>(null);
  loss = $state.raw<LossPoint[]>([]);
  result = $state.raw<FillResult | null>(null);
  #present: Uint8Array = new Uint8Array(0);
  #dead: Uint8Array = new Uint8Array(0);
  #startedMs = 0;
  #stage = '';
  #xOffset = 0;
  #lastRawStep = 0;

  /** New gather: plan from which positions are recorded and dead, plus traces marked bad earlier. */
  setGather(present: Uint8Array, dead: Uint8Array, bad: readonly number[] = [], factor = 1): void {
    this.#present = present;
    this.#dead = dead;
    this.plan = planFill({ nTraces: present.length, present, dead, bad: bad.filter((b) => b >= 0 && b < present.length && present[b]), ...(factor > 1 ? { factor } : {}) });
    this.result = null;
    this.loss = [];
    this.running = null;
  }

  /** Positions the user marked bad (live traces to replace). */
  get badTraces(): number[] {
    if (!this.plan) return [];
    return this.plan.runs.filter((r) => r.reason === 'bad').flatMap((r) => Array.from({ length: r.count }, (_, i) => r.firstTrace + i));
  }

  /** Toggles a recorded trace between kept and "replace it". Absent positions are always filled. */
  toggleBad(trace: number): boolean {
    if (!this.plan || trace < 0 || trace >= this.plan.nTraces || !this.#present[trace]) return false;
    const isBad = this.badTraces.includes(trace);
    this.plan = markBad(this.plan, trace, !isBad, this.#present, this.#dead);
    this.result = null;
    return true;
  }

  get toFill(): number {
    return this.plan ? countToFill(this.plan) : 0;
  }

  get unknown(): Uint8Array {
    return this.plan ? unknownMask(this.plan) : new Uint8Array(0);
  }

  begin(nowMs: number): void {
    this.#startedMs = nowMs;
    this.loss = [];
    this.result = null;
    this.#stage = '';
    this.#xOffset = 0;
    this.#lastRawStep = 0;
    this.running = { stage: 'slopes', fraction: 0, secondsLeft: Number.NaN, elapsedSeconds: 0 };
  }

  /**
   * A progress report from the worker. Time left is extrapolated from the overall fraction (the solver's own
   * estimate covers only its stage).
   */
  progress(stage: string, fraction: number, solver: SolverProgress | undefined, nowMs: number): void {
    const elapsed = (nowMs - this.#startedMs) / 1000;
    const f = Math.min(1, Math.max(0, fraction));
    const left = f > 0.02 ? (elapsed * (1 - f)) / f : Number.NaN;
    this.running = { stage, fraction: f, secondsLeft: left, elapsedSeconds: elapsed };
    if (solver && Object.keys(solver.terms).length) {
      // Stages (fill, hold-out, second pass) each count their steps from 0: continue the x axis across them.
      if (stage !== this.#stage || solver.step < this.#lastRawStep) {
        this.#xOffset = this.loss.length ? this.loss[this.loss.length - 1].step : 0;
        this.#stage = stage;
      }
      this.#lastRawStep = solver.step;
      // Keep every point of short runs; thin long ones so the chart stays light (at most ~2000 points).
      const next = this.loss.length >= 2000 ? this.loss.filter((_, i) => i % 2 === 0) : this.loss.slice();
      next.push({ step: this.#xOffset + solver.step, stage, terms: { ...solver.terms } });
      this.loss = next;
    }
  }

  finish(result: FillResult | null): void {
    this.running = null;
    this.result = result;
  }
}

/**
 * What the hold-out score means, in words a processor can act on. Bands are our own reading of the
 * published range (methods.md §5: synthetic reports are typically 10–30 dB; above 40 dB only with exact
 * slopes on clean synthetics); they are guidance, not a standard.
 */
export function describeHoldout(snrDb: number | null): { band: 'none' | 'poor' | 'fair' | 'good' | 'excellent'; text: string } {
  if (snrDb === null || !Number.isFinite(snrDb)) {
    if (snrDb === Number.POSITIVE_INFINITY) return { band: 'excellent', text: 'The hidden traces were reproduced exactly.' };
    return { band: 'none', text: 'No hold-out score: there were not enough recorded traces to hide some and fill them back.' };
  }
  const errPct = 100 * Math.pow(10, -snrDb / 20);
  const err = `the fill of hidden recorded traces missed them by about ${errPct < 1 ? errPct.toFixed(1) : errPct.toFixed(0)}% of their RMS amplitude`;
  if (snrDb < 6) return { band: 'poor', text: `Poor: ${err}. Check the dip field inside the gap before using these traces.` };
  if (snrDb < 12) return { band: 'fair', text: `Fair: ${err}. Events are in place but amplitudes and details are uncertain.` };
  if (snrDb < 20) return { band: 'good', text: `Good: ${err}.` };
  return { band: 'excellent', text: `Very good: ${err}.` };
}
