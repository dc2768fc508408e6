/**
 * The contract every trace-filling solver meets (least squares in core/fill/, the coordinate network in
 * core/nn/). A solver fills the samples of the unknown traces of one regular-grid gather so that the local
 * plane-wave equation u_x + σ u_t = 0 holds; the known traces are returned unchanged.
 *
 * Layout: trace-major (core/grid/gather.ts). Slopes on the pair grid (core/pwd/operator.ts):
 * slopePairs[p * nSamples + t] is the slope between grid traces p and p+1, in samples per trace.
 */
import type { CancelToken } from '../problems';

export interface SolverProgress {
  /** Solver-specific step (CG iteration, training step). */
  step: number;
  totalSteps: number;
  /** Named loss or residual terms for live plots, e.g. { residual } or { data, pde }. */
  terms: Record<string, number>;
  elapsedSeconds: number;
  /** Estimate of the time left, or NaN when unknown. */
  secondsLeft: number;
}

export interface GapSolverInput {
  /** Regular-grid gather, unknown traces may hold anything (they are overwritten). */
  readonly data: Float64Array;
  readonly nTraces: number;
  readonly nSamples: number;
  /** 1 for traces to fill, 0 for known traces (held exactly). Length nTraces. */
  readonly unknownTraces: Uint8Array;
  /** Slopes on the pair grid, length (nTraces−1)·nSamples, samples per trace. */
  readonly slopePairs: Float64Array;
  readonly cancel?: CancelToken;
  readonly onProgress?: (p: SolverProgress) => void;
}

export interface GapSolverResult {
  /** The whole gather: known traces copied unchanged, unknown traces filled. */
  readonly data: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
  readonly seconds: number;
  /** Solver-specific figures for the report (e.g. final residual, loss terms). */
  readonly details: Record<string, number | string>;
}

export type SolverName = 'lsq' | 'net';

/**
 * A solver function: the least-squares solver (core/fill/lsq.ts) and the network (core/nn/) both have this
 * shape. `settings` is the solver's own plain-data settings object (JSON, as saved in recipes).
 */
export type GapSolverFn = (input: GapSolverInput, settings: Record<string, unknown>) => GapSolverResult | Promise<GapSolverResult>;
