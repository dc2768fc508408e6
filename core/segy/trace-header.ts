/**
 * Trace headers by name, with the standard's scalars applied and units in the names.
 * Scalar rule (SEG-Y rev 1, bytes 69–70 for 41–68 and 71–72 for 73–88 and 181–188; methods.md §6.8):
 * positive multiplies, negative divides, 0 is read as 1. The offset (37–40) is not scaled (rev 1).
 * Lengths are converted to metres from the binary header's measurement system (3255: 1 m, 2 ft).
 */
import { TRACE_HEADER, TRACE_HEADER_BYTES, readFieldAt, type TraceFieldName } from './fields';

export type CoordinateUnit = 'length' | 'arc-seconds' | 'degrees' | 'dms' | 'unspecified';

export interface TraceHeader {
  /** Every standard field by name, as stored (signed/unsigned per the standard, no scalar). */
  readonly fields: Readonly<Record<TraceFieldName, number>>;
  readonly traceIdCode: number;
  /** Source–receiver offset in metres (unscaled field × feet conversion). */
  readonly offsetM: number;
  readonly receiverElevationM: number;
  readonly sourceSurfaceElevationM: number;
  readonly sourceDepthM: number;
  readonly receiverDatumElevationM: number;
  readonly sourceDatumElevationM: number;
  readonly sourceWaterDepthM: number;
  readonly receiverWaterDepthM: number;
  /** Coordinates with the coordinate scalar applied, in `coordinateUnit` (metres when that is 'length'). */
  readonly sourceX: number;
  readonly sourceY: number;
  readonly receiverX: number;
  readonly receiverY: number;
  readonly ensembleX: number;
  readonly ensembleY: number;
  readonly coordinateUnit: CoordinateUnit;
  readonly samplesInTrace: number;
  readonly sampleIntervalUs: number;
}

/** Apply a SEG-Y scalar: positive multiplies, negative divides, 0 means 1. */
export function applyScalar(value: number, scalar: number): number {
  if (scalar === 0 || scalar === 1 || scalar === -1) return value;
  return scalar > 0 ? value * scalar : value / -scalar;
}

const FIELD_ENTRIES = Object.entries(TRACE_HEADER) as [TraceFieldName, (typeof TRACE_HEADER)[TraceFieldName]][];

/** Raw fields of the trace header at `offsetBytes` of `bytes` (0-based). */
export function readTraceFields(bytes: Uint8Array, offsetBytes: number, little: boolean): Record<TraceFieldName, number> {
  const view = new DataView(bytes.buffer, bytes.byteOffset + offsetBytes, TRACE_HEADER_BYTES);
  const out = {} as Record<TraceFieldName, number>;
  for (const [name, spec] of FIELD_ENTRIES) out[name] = readFieldAt(view, spec.byte - 1, spec.kind, little);
  return out;
}

/**
 * Parse one 240-byte trace header. `lengthUnit` is the file's (binary 3255); feet are converted to metres
 * with 0.3048 m/ft (exact by international definition).
 */
export function parseTraceHeader(bytes: Uint8Array, offsetBytes: number, little: boolean, lengthUnit: 'm' | 'ft' | 'unspecified'): TraceHeader {
  const fields = readTraceFields(bytes, offsetBytes, little);
  const toM = lengthUnit === 'ft' ? 0.3048 : 1;
  const es = fields.ELEVATION_SCALAR;
  const cs = fields.COORDINATE_SCALAR;
  const cu = fields.COORDINATE_UNITS;
  const coordinateUnit: CoordinateUnit = cu === 1 ? 'length' : cu === 2 ? 'arc-seconds' : cu === 3 ? 'degrees' : cu === 4 ? 'dms' : 'unspecified';
  // Unspecified units are treated as lengths (common practice, no source): most files leave 89–90 at 0.
  const coordToM = coordinateUnit === 'length' || coordinateUnit === 'unspecified' ? toM : 1;
  const elev = (v: number) => applyScalar(v, es) * toM;
  const coord = (v: number) => applyScalar(v, cs) * coordToM;
  return {
    fields,
    traceIdCode: fields.TRACE_ID_CODE,
    offsetM: fields.OFFSET * toM,
    receiverElevationM: elev(fields.RECEIVER_ELEVATION),
    sourceSurfaceElevationM: elev(fields.SOURCE_SURFACE_ELEVATION),
    sourceDepthM: elev(fields.SOURCE_DEPTH),
    receiverDatumElevationM: elev(fields.RECEIVER_DATUM_ELEVATION),
    sourceDatumElevationM: elev(fields.SOURCE_DATUM_ELEVATION),
    sourceWaterDepthM: elev(fields.SOURCE_WATER_DEPTH),
    receiverWaterDepthM: elev(fields.RECEIVER_WATER_DEPTH),
    sourceX: coord(fields.SOURCE_X),
    sourceY: coord(fields.SOURCE_Y),
    receiverX: coord(fields.RECEIVER_X),
    receiverY: coord(fields.RECEIVER_Y),
    ensembleX: coord(fields.ENSEMBLE_X),
    ensembleY: coord(fields.ENSEMBLE_Y),
    coordinateUnit: coordinateUnit === 'unspecified' ? 'length' : coordinateUnit,
    samplesInTrace: fields.SAMPLES_IN_TRACE,
    sampleIntervalUs: fields.SAMPLE_INTERVAL_US,
  };
}
