/**
 * The public contract of slope estimation: options in, a slope field with its confidence out.
 * Units: samples per trace (core/slope/units.ts converts for people). Layout: trace grid trace-major
 * (core/grid/gather.ts); pair grid pair-major, pair p between traces p and p+1 (core/slope/pair-grid.ts).
 */
import type { PwdOrder } from '../pwd/maxflat';
import type { DipEdit } from './edits';

export type SlopeMethod = 'pwd' | 'tensor';

export interface SlopeOptions {
  /** 'pwd' (plane-wave destruction, default) or 'tensor' (gradient structure tensor, faster, rougher). */
  readonly method?: SlopeMethod;
  /** Triangle smoothing radius along time, samples (≥ 1; default 6). */
  readonly radiusTimeSamples?: number;
  /** Triangle smoothing radius across traces (≥ 1; default 3). */
  readonly radiusTraces?: number;
  /** Destruction filter: 1 = 3-point (default), 2 = 5-point. */
  readonly order?: PwdOrder;
  /** Most Gauss-Newton steps per resolution level (default 4; each coarse-to-fine level adds its own; a level
   * stops after two once a step moves the slopes by less than 0.02 samples per trace rms). */
  readonly outerIterations?: number;
  /** Conjugate-gradient steps per smooth division (default 4; warm-started across Gauss-Newton steps). */
  readonly innerIterations?: number;
  /** Largest slope change per Gauss-Newton step, samples per trace (default 1). */
  readonly stepLimit?: number;
  /** Live traces every k-th grid position; 'auto' (default) reads it from the live mask. */
  readonly decimationFactor?: number | 'auto';
  /**
   * Steepest |slope| expected on the grid being estimated (the coarse grid when decimated), samples per trace.
   * Decides the number of coarse-to-fine time levels. 'auto' (default): measured by a structure tensor on a
   * time-decimated copy (8× where the trace is long enough).
   */
  readonly maxSlopeSamplesPerTrace?: number | 'auto';
  /** Balance amplitudes (AGC-like) before estimating (default true). */
  readonly balance?: boolean;
  /** Low-pass before estimating, cycles per sample (Nyquist 0.5); 'auto' (default): only for decimated data, below
   * the alias frequency 1/(2|σ_c,max|) of the steepest coarse slope; 'off': never. */
  readonly lowpassCyclesPerSample?: number | 'auto' | 'off';
  /**
   * Slopes in runs of missing traces: 'along-events' (default) carries them from the gap's edges along event
   * paths (gap.ts); 'prior' leaves what the regularised estimate gives there (it decays to the prior).
   */
  readonly gapSlopes?: 'along-events' | 'prior';
  /** Hand edits applied after the estimate, in order; they always win (core/slope/edits.ts). */
  readonly edits?: readonly DipEdit[];
  /** Also feed edits to the estimator as weighted observations so nearby slopes bend toward them (default false). */
  readonly propagateEdits?: boolean;
}

export interface SlopeInfo {
  readonly method: SlopeMethod;
  readonly decimationFactor: number;
  /** Number of coarse-to-fine time levels above full resolution (0 = none). */
  readonly timeLevels: number;
  /** Steepest slope used to plan the estimate, on the estimation grid (samples per coarse trace). */
  readonly maxSlopeSamplesPerTrace: number;
  /** Low-pass cutoff applied, cycles per sample, or 0.5 when none. */
  readonly lowpassCyclesPerSample: number;
  /** Σr²/Σu² of the balanced data at the start and end of the finest Gauss-Newton level (pwd only). */
  readonly residualStart: number;
  readonly residualEnd: number;
  readonly radiusTimeSamples: number;
  readonly radiusTraces: number;
  readonly order: PwdOrder;
}

export interface SlopeField {
  readonly nTraces: number;
  readonly nSamples: number;
  /** Final slopes (estimate + edits) at trace positions, samples per trace, nTraces*nSamples. */
  readonly slopeTraces: Float64Array;
  /** Final slopes on the pair grid, (nTraces−1)*nSamples: what the destruction operator and fill solvers take. */
  readonly slopePairs: Float64Array;
  /** The estimate before edits (pair grid): "restore to estimate" and re-applying edits start here. */
  readonly estimatePairs: Float64Array;
  /** Confidence in [0, 1] at trace positions. */
  readonly confidence: Float64Array;
  /** Confidence in [0, 1] on the pair grid. */
  readonly confidencePairs: Float64Array;
  /** 1 where the slope was carried into a gap from its edges (pair grid). */
  readonly inpaintedPairs: Uint8Array;
  /** Weight in [0, 1] of hand edits per pair sample (all 0 without edits). */
  readonly editWeightPairs: Float64Array;
  /** Traces treated as live (input mask minus all-zero traces). */
  readonly liveTraces: Uint8Array;
  readonly info: SlopeInfo;
}
