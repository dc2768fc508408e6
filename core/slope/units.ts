/**
 * The one place where slope units are converted. Inside Dipweave a slope σ is in samples per trace
 * (σ = dt/dx on the sample and trace grid, positive where events arrive later at higher trace index).
 * People read ms per trace (σ · Δt[ms]) or s/km (σ · Δt[s] / Δx[km]) (methods.md preamble).
 */

export type SlopeUnit = 'samples-per-trace' | 'ms-per-trace' | 's-per-km';

export const SLOPE_UNITS: readonly SlopeUnit[] = ['samples-per-trace', 'ms-per-trace', 's-per-km'];

export const SLOPE_UNIT_LABEL: Record<SlopeUnit, string> = {
  'samples-per-trace': 'samples/trace',
  'ms-per-trace': 'ms/trace',
  's-per-km': 's/km',
};

export interface SlopeUnitContext {
  /** Time sampling interval in seconds. */
  readonly sampleIntervalS: number;
  /** Distance between neighbouring grid traces in metres; needed only for s/km. */
  readonly traceSpacingM?: number;
}

/** Factor f with value[unit] = f · σ[samples per trace]. Throws RangeError if the context lacks what the unit needs. */
export function slopeUnitFactor(unit: SlopeUnit, ctx: SlopeUnitContext): number {
  if (!(ctx.sampleIntervalS > 0)) throw new RangeError(`slope units: sample interval must be > 0 s. Value: ${ctx.sampleIntervalS}`);
  switch (unit) {
    case 'samples-per-trace':
      return 1;
    case 'ms-per-trace':
      return ctx.sampleIntervalS * 1000;
    case 's-per-km': {
      const dx = ctx.traceSpacingM;
      if (dx === undefined || !(dx > 0)) throw new RangeError(`slope units: s/km needs a trace spacing > 0 m. Value: ${dx}`);
      return ctx.sampleIntervalS / (dx / 1000);
    }
  }
}

export function slopeToUnit(sigmaSamplesPerTrace: number, unit: SlopeUnit, ctx: SlopeUnitContext): number {
  return sigmaSamplesPerTrace * slopeUnitFactor(unit, ctx);
}

export function slopeFromUnit(value: number, unit: SlopeUnit, ctx: SlopeUnitContext): number {
  return value / slopeUnitFactor(unit, ctx);
}

/** out[i] = f · σ[i]. out may be the input. @returns out */
export function convertSlopeArray<T extends Float64Array | Float32Array>(out: T, sigma: ArrayLike<number>, unit: SlopeUnit, ctx: SlopeUnitContext): T {
  const f = slopeUnitFactor(unit, ctx);
  for (let i = 0; i < sigma.length; i++) out[i] = sigma[i] * f;
  return out;
}

/** Apparent velocity in m/s of a slope (Δx/Δt per trace); Infinity for σ = 0. */
export function apparentVelocityMPerS(sigmaSamplesPerTrace: number, ctx: Required<SlopeUnitContext>): number {
  return ctx.traceSpacingM / (Math.abs(sigmaSamplesPerTrace) * ctx.sampleIntervalS);
}
