/**
 * SEG-Y header fields by name at the standard's 1-based byte positions.
 * Sources: SEG-Y rev 1 (SEG Technical Standards Committee, 2002) and SEG-Y_r2.0 (2017), via
 * /work/shared/docs/methods.md §6.8. Positions 1–88 and 3213–3230, 3255, 3297, 3501–3506 are corroborated
 * there; the remaining positions are from memory of the standards' tables (marked "from memory" in
 * the reference test that checks them against segyio's own constants).
 *
 * Binary-header positions are file positions (3201–3600); trace-header positions are 1–240 within a trace.
 */

export type FieldKind = 'i8' | 'u8' | 'i16' | 'u16' | 'i32' | 'u32' | 'u64' | 'f64';

export interface FieldSpec {
  /** 1-based byte position as printed in the standard. */
  readonly byte: number;
  readonly kind: FieldKind;
  /** First revision that defines it (0 or 1 or 2). */
  readonly since: 0 | 1 | 2;
}

export const FIELD_SIZE: Readonly<Record<FieldKind, number>> = { i8: 1, u8: 1, i16: 2, u16: 2, i32: 4, u32: 4, u64: 8, f64: 8 };

const f = (byte: number, kind: FieldKind, since: 0 | 1 | 2 = 0): FieldSpec => ({ byte, kind, since });

/** Binary file header (bytes 3201–3600). */
export const BINARY_HEADER = {
  JOB_ID: f(3201, 'i32'),
  LINE_NUMBER: f(3205, 'i32'),
  REEL_NUMBER: f(3209, 'i32'),
  DATA_TRACES_PER_ENSEMBLE: f(3213, 'i16'),
  AUX_TRACES_PER_ENSEMBLE: f(3215, 'i16'),
  SAMPLE_INTERVAL_US: f(3217, 'i16'),
  ORIGINAL_SAMPLE_INTERVAL_US: f(3219, 'i16'),
  SAMPLES_PER_TRACE: f(3221, 'u16'),
  ORIGINAL_SAMPLES_PER_TRACE: f(3223, 'u16'),
  SAMPLE_FORMAT_CODE: f(3225, 'i16'),
  ENSEMBLE_FOLD: f(3227, 'i16'),
  TRACE_SORTING_CODE: f(3229, 'i16'),
  VERTICAL_SUM_CODE: f(3231, 'i16'),
  SWEEP_START_HZ: f(3233, 'i16'),
  SWEEP_END_HZ: f(3235, 'i16'),
  SWEEP_LENGTH_MS: f(3237, 'i16'),
  SWEEP_TYPE_CODE: f(3239, 'i16'),
  SWEEP_CHANNEL: f(3241, 'i16'),
  SWEEP_TAPER_START_MS: f(3243, 'i16'),
  SWEEP_TAPER_END_MS: f(3245, 'i16'),
  TAPER_TYPE: f(3247, 'i16'),
  CORRELATED_TRACES: f(3249, 'i16'),
  BINARY_GAIN_RECOVERED: f(3251, 'i16'),
  AMPLITUDE_RECOVERY_METHOD: f(3253, 'i16'),
  MEASUREMENT_SYSTEM: f(3255, 'i16'),
  IMPULSE_POLARITY: f(3257, 'i16'),
  VIBRATORY_POLARITY_CODE: f(3259, 'i16'),
  EXT_DATA_TRACES_PER_ENSEMBLE: f(3261, 'i32', 2),
  EXT_AUX_TRACES_PER_ENSEMBLE: f(3265, 'i32', 2),
  EXT_SAMPLES_PER_TRACE: f(3269, 'i32', 2),
  EXT_SAMPLE_INTERVAL: f(3273, 'f64', 2),
  EXT_ORIGINAL_SAMPLE_INTERVAL: f(3281, 'f64', 2),
  EXT_ORIGINAL_SAMPLES_PER_TRACE: f(3289, 'i32', 2),
  EXT_ENSEMBLE_FOLD: f(3293, 'i32', 2),
  BYTE_ORDER_CONSTANT: f(3297, 'u32', 2),
  REVISION_MAJOR: f(3501, 'u8', 1),
  REVISION_MINOR: f(3502, 'u8', 1),
  FIXED_LENGTH_TRACE_FLAG: f(3503, 'i16', 1),
  EXTENDED_TEXT_HEADER_COUNT: f(3505, 'i16', 1),
  MAX_ADDITIONAL_TRACE_HEADERS: f(3507, 'i32', 2),
  TIME_BASIS_CODE: f(3511, 'i16', 2),
  NUMBER_OF_TRACES: f(3513, 'u64', 2),
  FIRST_TRACE_OFFSET_BYTES: f(3521, 'u64', 2),
  TRAILER_STANZA_COUNT: f(3529, 'i32', 2),
} as const satisfies Record<string, FieldSpec>;

export type BinaryFieldName = keyof typeof BINARY_HEADER;

/** Trace header (bytes 1–240 of each trace). */
export const TRACE_HEADER = {
  TRACE_SEQUENCE_IN_LINE: f(1, 'i32'),
  TRACE_SEQUENCE_IN_FILE: f(5, 'i32'),
  FIELD_RECORD: f(9, 'i32'),
  TRACE_IN_FIELD_RECORD: f(13, 'i32'),
  SOURCE_POINT: f(17, 'i32'),
  ENSEMBLE: f(21, 'i32'),
  TRACE_IN_ENSEMBLE: f(25, 'i32'),
  TRACE_ID_CODE: f(29, 'i16'),
  VERTICALLY_SUMMED_TRACES: f(31, 'i16'),
  HORIZONTALLY_STACKED_TRACES: f(33, 'i16'),
  DATA_USE: f(35, 'i16'),
  OFFSET: f(37, 'i32'),
  RECEIVER_ELEVATION: f(41, 'i32'),
  SOURCE_SURFACE_ELEVATION: f(45, 'i32'),
  SOURCE_DEPTH: f(49, 'i32'),
  RECEIVER_DATUM_ELEVATION: f(53, 'i32'),
  SOURCE_DATUM_ELEVATION: f(57, 'i32'),
  SOURCE_WATER_DEPTH: f(61, 'i32'),
  RECEIVER_WATER_DEPTH: f(65, 'i32'),
  ELEVATION_SCALAR: f(69, 'i16'),
  COORDINATE_SCALAR: f(71, 'i16'),
  SOURCE_X: f(73, 'i32'),
  SOURCE_Y: f(77, 'i32'),
  RECEIVER_X: f(81, 'i32'),
  RECEIVER_Y: f(85, 'i32'),
  COORDINATE_UNITS: f(89, 'i16'),
  WEATHERING_VELOCITY: f(91, 'i16'),
  SUBWEATHERING_VELOCITY: f(93, 'i16'),
  SOURCE_UPHOLE_TIME_MS: f(95, 'i16'),
  RECEIVER_UPHOLE_TIME_MS: f(97, 'i16'),
  SOURCE_STATIC_MS: f(99, 'i16'),
  RECEIVER_STATIC_MS: f(101, 'i16'),
  TOTAL_STATIC_MS: f(103, 'i16'),
  LAG_TIME_A_MS: f(105, 'i16'),
  LAG_TIME_B_MS: f(107, 'i16'),
  DELAY_RECORDING_TIME_MS: f(109, 'i16'),
  MUTE_START_MS: f(111, 'i16'),
  MUTE_END_MS: f(113, 'i16'),
  SAMPLES_IN_TRACE: f(115, 'u16'),
  SAMPLE_INTERVAL_US: f(117, 'i16'),
  GAIN_TYPE: f(119, 'i16'),
  INSTRUMENT_GAIN_CONSTANT_DB: f(121, 'i16'),
  INSTRUMENT_INITIAL_GAIN_DB: f(123, 'i16'),
  CORRELATED: f(125, 'i16'),
  SWEEP_START_HZ: f(127, 'i16'),
  SWEEP_END_HZ: f(129, 'i16'),
  SWEEP_LENGTH_MS: f(131, 'i16'),
  SWEEP_TYPE_CODE: f(133, 'i16'),
  SWEEP_TAPER_START_MS: f(135, 'i16'),
  SWEEP_TAPER_END_MS: f(137, 'i16'),
  TAPER_TYPE: f(139, 'i16'),
  ALIAS_FILTER_HZ: f(141, 'i16'),
  ALIAS_FILTER_SLOPE_DB_PER_OCTAVE: f(143, 'i16'),
  NOTCH_FILTER_HZ: f(145, 'i16'),
  NOTCH_FILTER_SLOPE_DB_PER_OCTAVE: f(147, 'i16'),
  LOW_CUT_HZ: f(149, 'i16'),
  HIGH_CUT_HZ: f(151, 'i16'),
  LOW_CUT_SLOPE_DB_PER_OCTAVE: f(153, 'i16'),
  HIGH_CUT_SLOPE_DB_PER_OCTAVE: f(155, 'i16'),
  YEAR: f(157, 'i16'),
  DAY_OF_YEAR: f(159, 'i16'),
  HOUR: f(161, 'i16'),
  MINUTE: f(163, 'i16'),
  SECOND: f(165, 'i16'),
  TIME_BASIS_CODE: f(167, 'i16'),
  TRACE_WEIGHTING_FACTOR: f(169, 'i16'),
  GROUP_NUMBER_ROLL_SWITCH_1: f(171, 'i16'),
  GROUP_NUMBER_FIRST_TRACE: f(173, 'i16'),
  GROUP_NUMBER_LAST_TRACE: f(175, 'i16'),
  GAP_SIZE: f(177, 'i16'),
  OVERTRAVEL: f(179, 'i16'),
  ENSEMBLE_X: f(181, 'i32', 1),
  ENSEMBLE_Y: f(185, 'i32', 1),
  INLINE: f(189, 'i32', 1),
  CROSSLINE: f(193, 'i32', 1),
  SHOTPOINT: f(197, 'i32', 1),
  SHOTPOINT_SCALAR: f(201, 'i16', 1),
  TRACE_VALUE_UNIT: f(203, 'i16', 1),
  TRANSDUCTION_MANTISSA: f(205, 'i32', 1),
  TRANSDUCTION_EXPONENT: f(209, 'i16', 1),
  TRANSDUCTION_UNIT: f(211, 'i16', 1),
  DEVICE_ID: f(213, 'i16', 1),
  TIME_SCALAR: f(215, 'i16', 1),
  SOURCE_TYPE: f(217, 'i16', 1),
  SOURCE_DIRECTION_VERTICAL: f(219, 'i16', 1),
  SOURCE_DIRECTION_CROSSLINE: f(221, 'i16', 1),
  SOURCE_DIRECTION_INLINE: f(223, 'i16', 1),
  SOURCE_MEASUREMENT_MANTISSA: f(225, 'i32', 1),
  SOURCE_MEASUREMENT_EXPONENT: f(229, 'i16', 1),
  SOURCE_MEASUREMENT_UNIT: f(231, 'i16', 1),
  /**
   * Dipweave's filled-trace flag: bytes 233–234, unassigned in rev 0 and 1. In rev 2, bytes 233–240 may
   * carry the optional header name "SEG00000"; a filled trace of such a file loses the first two
   * characters of that name (documented in docs/segy.md).
   */
  DIPWEAVE_FILLED_FLAG: f(233, 'i16'),
} as const satisfies Record<string, FieldSpec>;

export type TraceFieldName = keyof typeof TRACE_HEADER;

/** Value written to DIPWEAVE_FILLED_FLAG on every trace Dipweave estimated (not recorded). */
export const FILLED_FLAG_VALUE = 1;

export const TEXT_HEADER_BYTES = 3200;
export const BINARY_HEADER_BYTES = 400;
export const TRACE_HEADER_BYTES = 240;
/** Rev 2 byte-order constant at 3297 (0x01020304 read in the file's byte order). */
export const BYTE_ORDER_MAGIC = 0x01020304;

/** Read one field at `offsetBytes` (0-based) of `view`. 8-byte ints come back as numbers (exact below 2^53). */
export function readFieldAt(view: DataView, offsetBytes: number, kind: FieldKind, little: boolean): number {
  switch (kind) {
    case 'i8': return view.getInt8(offsetBytes);
    case 'u8': return view.getUint8(offsetBytes);
    case 'i16': return view.getInt16(offsetBytes, little);
    case 'u16': return view.getUint16(offsetBytes, little);
    case 'i32': return view.getInt32(offsetBytes, little);
    case 'u32': return view.getUint32(offsetBytes, little);
    case 'u64': {
      const a = view.getUint32(offsetBytes, little);
      const b = view.getUint32(offsetBytes + 4, little);
      return little ? b * 4294967296 + a : a * 4294967296 + b;
    }
    case 'f64': return view.getFloat64(offsetBytes, little);
  }
}

/** Write one field; integers are rounded and must fit (the caller clamps). */
export function writeFieldAt(view: DataView, offsetBytes: number, kind: FieldKind, value: number, little: boolean): void {
  switch (kind) {
    case 'i8': view.setInt8(offsetBytes, value); return;
    case 'u8': view.setUint8(offsetBytes, value); return;
    case 'i16': view.setInt16(offsetBytes, value, little); return;
    case 'u16': view.setUint16(offsetBytes, value, little); return;
    case 'i32': view.setInt32(offsetBytes, value, little); return;
    case 'u32': view.setUint32(offsetBytes, value, little); return;
    case 'u64': {
      const hi = Math.floor(value / 4294967296);
      const lo = value - hi * 4294967296;
      view.setUint32(offsetBytes, little ? lo : hi, little);
      view.setUint32(offsetBytes + 4, little ? hi : lo, little);
      return;
    }
    case 'f64': view.setFloat64(offsetBytes, value, little); return;
  }
}

/** Range of an integer field kind, for clamping interpolated header values. */
export function fieldRange(kind: FieldKind): [number, number] {
  switch (kind) {
    case 'i8': return [-128, 127];
    case 'u8': return [0, 255];
    case 'i16': return [-32768, 32767];
    case 'u16': return [0, 65535];
    case 'i32': return [-2147483648, 2147483647];
    case 'u32': return [0, 4294967295];
    case 'u64': return [0, Number.MAX_SAFE_INTEGER];
    case 'f64': return [-Number.MAX_VALUE, Number.MAX_VALUE];
  }
}
