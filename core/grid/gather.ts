/**
 * The one layout of gather data in Dipweave: trace-major, `data[trace * nSamples + sample]`.
 * Every kernel cites this file. Time runs down a trace (sample index), position across (trace index).
 */
export interface GatherGrid {
  readonly nTraces: number;
  readonly nSamples: number;
  readonly data: Float32Array;
}

/** Slopes and other per-sample fields use Float64Array with the same trace-major layout. */
export interface FieldGrid {
  readonly nTraces: number;
  readonly nSamples: number;
  readonly data: Float64Array;
}

export function gatherIndex(trace: number, sample: number, nSamples: number): number {
  return trace * nSamples + sample;
}

export function assertGridShape(name: string, length: number, nTraces: number, nSamples: number): void {
  if (!Number.isInteger(nTraces) || !Number.isInteger(nSamples) || nTraces < 0 || nSamples < 0)
    throw new RangeError(`${name}: nTraces and nSamples must be non-negative integers. Values: ${nTraces}, ${nSamples}`);
  if (length !== nTraces * nSamples)
    throw new RangeError(`${name}: length ${length} does not equal nTraces*nSamples = ${nTraces}*${nSamples}`);
}
