/**
 * Trace headers by name, with the standard's scalars applied and units in the names.
 * Scalar rule (SEG-Y rev 1, bytes 69–70 for 41–68 and 71–72 for 73–88 and 181–188; methods.md §6.8):
 * positive multiplies, negative divides, 0 is read as 1. The offset (37–40) is not scaled (rev 1).
 * Lengths are converted to metres from the binary header's measurement system (3255: 1 m, 2 ft).
 */
import type { TraceFieldName } from './fields';

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

function i16(b: Uint8Array, p: number, le: boolean): number {
  const v = le ? b[p] | (b[p + 1] << 8) : (b[p] << 8) | b[p + 1];
  return v & 0x8000 ? v - 0x10000 : v;
}
function u16(b: Uint8Array, p: number, le: boolean): number {
  return le ? b[p] | (b[p + 1] << 8) : (b[p] << 8) | b[p + 1];
}
function i32(b: Uint8Array, p: number, le: boolean): number {
  return le ? b[p] | (b[p + 1] << 8) | (b[p + 2] << 16) | (b[p + 3] << 24) : (b[p] << 24) | (b[p + 1] << 16) | (b[p + 2] << 8) | b[p + 3];
}

/**
 * Raw fields of the trace header at `offsetBytes` of `bytes` (0-based). Hot path (once per trace read):
 * one object literal, so every header shares one shape. Offsets are TRACE_HEADER's byte − 1 (the unit
 * test "readTraceFields agrees with the field table" checks each against fields.ts).
 */
export function readTraceFields(b: Uint8Array, o: number, le: boolean): Record<TraceFieldName, number> {
  return {
    TRACE_SEQUENCE_IN_LINE: i32(b, o + 0, le),
    TRACE_SEQUENCE_IN_FILE: i32(b, o + 4, le),
    FIELD_RECORD: i32(b, o + 8, le),
    TRACE_IN_FIELD_RECORD: i32(b, o + 12, le),
    SOURCE_POINT: i32(b, o + 16, le),
    ENSEMBLE: i32(b, o + 20, le),
    TRACE_IN_ENSEMBLE: i32(b, o + 24, le),
    TRACE_ID_CODE: i16(b, o + 28, le),
    VERTICALLY_SUMMED_TRACES: i16(b, o + 30, le),
    HORIZONTALLY_STACKED_TRACES: i16(b, o + 32, le),
    DATA_USE: i16(b, o + 34, le),
    OFFSET: i32(b, o + 36, le),
    RECEIVER_ELEVATION: i32(b, o + 40, le),
    SOURCE_SURFACE_ELEVATION: i32(b, o + 44, le),
    SOURCE_DEPTH: i32(b, o + 48, le),
    RECEIVER_DATUM_ELEVATION: i32(b, o + 52, le),
    SOURCE_DATUM_ELEVATION: i32(b, o + 56, le),
    SOURCE_WATER_DEPTH: i32(b, o + 60, le),
    RECEIVER_WATER_DEPTH: i32(b, o + 64, le),
    ELEVATION_SCALAR: i16(b, o + 68, le),
    COORDINATE_SCALAR: i16(b, o + 70, le),
    SOURCE_X: i32(b, o + 72, le),
    SOURCE_Y: i32(b, o + 76, le),
    RECEIVER_X: i32(b, o + 80, le),
    RECEIVER_Y: i32(b, o + 84, le),
    COORDINATE_UNITS: i16(b, o + 88, le),
    WEATHERING_VELOCITY: i16(b, o + 90, le),
    SUBWEATHERING_VELOCITY: i16(b, o + 92, le),
    SOURCE_UPHOLE_TIME_MS: i16(b, o + 94, le),
    RECEIVER_UPHOLE_TIME_MS: i16(b, o + 96, le),
    SOURCE_STATIC_MS: i16(b, o + 98, le),
    RECEIVER_STATIC_MS: i16(b, o + 100, le),
    TOTAL_STATIC_MS: i16(b, o + 102, le),
    LAG_TIME_A_MS: i16(b, o + 104, le),
    LAG_TIME_B_MS: i16(b, o + 106, le),
    DELAY_RECORDING_TIME_MS: i16(b, o + 108, le),
    MUTE_START_MS: i16(b, o + 110, le),
    MUTE_END_MS: i16(b, o + 112, le),
    SAMPLES_IN_TRACE: u16(b, o + 114, le),
    SAMPLE_INTERVAL_US: i16(b, o + 116, le),
    GAIN_TYPE: i16(b, o + 118, le),
    INSTRUMENT_GAIN_CONSTANT_DB: i16(b, o + 120, le),
    INSTRUMENT_INITIAL_GAIN_DB: i16(b, o + 122, le),
    CORRELATED: i16(b, o + 124, le),
    SWEEP_START_HZ: i16(b, o + 126, le),
    SWEEP_END_HZ: i16(b, o + 128, le),
    SWEEP_LENGTH_MS: i16(b, o + 130, le),
    SWEEP_TYPE_CODE: i16(b, o + 132, le),
    SWEEP_TAPER_START_MS: i16(b, o + 134, le),
    SWEEP_TAPER_END_MS: i16(b, o + 136, le),
    TAPER_TYPE: i16(b, o + 138, le),
    ALIAS_FILTER_HZ: i16(b, o + 140, le),
    ALIAS_FILTER_SLOPE_DB_PER_OCTAVE: i16(b, o + 142, le),
    NOTCH_FILTER_HZ: i16(b, o + 144, le),
    NOTCH_FILTER_SLOPE_DB_PER_OCTAVE: i16(b, o + 146, le),
    LOW_CUT_HZ: i16(b, o + 148, le),
    HIGH_CUT_HZ: i16(b, o + 150, le),
    LOW_CUT_SLOPE_DB_PER_OCTAVE: i16(b, o + 152, le),
    HIGH_CUT_SLOPE_DB_PER_OCTAVE: i16(b, o + 154, le),
    YEAR: i16(b, o + 156, le),
    DAY_OF_YEAR: i16(b, o + 158, le),
    HOUR: i16(b, o + 160, le),
    MINUTE: i16(b, o + 162, le),
    SECOND: i16(b, o + 164, le),
    TIME_BASIS_CODE: i16(b, o + 166, le),
    TRACE_WEIGHTING_FACTOR: i16(b, o + 168, le),
    GROUP_NUMBER_ROLL_SWITCH_1: i16(b, o + 170, le),
    GROUP_NUMBER_FIRST_TRACE: i16(b, o + 172, le),
    GROUP_NUMBER_LAST_TRACE: i16(b, o + 174, le),
    GAP_SIZE: i16(b, o + 176, le),
    OVERTRAVEL: i16(b, o + 178, le),
    ENSEMBLE_X: i32(b, o + 180, le),
    ENSEMBLE_Y: i32(b, o + 184, le),
    INLINE: i32(b, o + 188, le),
    CROSSLINE: i32(b, o + 192, le),
    SHOTPOINT: i32(b, o + 196, le),
    SHOTPOINT_SCALAR: i16(b, o + 200, le),
    TRACE_VALUE_UNIT: i16(b, o + 202, le),
    TRANSDUCTION_MANTISSA: i32(b, o + 204, le),
    TRANSDUCTION_EXPONENT: i16(b, o + 208, le),
    TRANSDUCTION_UNIT: i16(b, o + 210, le),
    DEVICE_ID: i16(b, o + 212, le),
    TIME_SCALAR: i16(b, o + 214, le),
    SOURCE_TYPE: i16(b, o + 216, le),
    SOURCE_DIRECTION_VERTICAL: i16(b, o + 218, le),
    SOURCE_DIRECTION_CROSSLINE: i16(b, o + 220, le),
    SOURCE_DIRECTION_INLINE: i16(b, o + 222, le),
    SOURCE_MEASUREMENT_MANTISSA: i32(b, o + 224, le),
    SOURCE_MEASUREMENT_EXPONENT: i16(b, o + 228, le),
    SOURCE_MEASUREMENT_UNIT: i16(b, o + 230, le),
    DIPWEAVE_FILLED_FLAG: i16(b, o + 232, le),
  };
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
