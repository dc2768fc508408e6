/**
 * The demo files: the synthetic line (core/synth/marine-shot.ts) written as SEG-Y rev 1, big-endian,
 * 4-byte IBM floats (format 1), EBCDIC textual header, with full trace geometry. Three variants:
 * - full:      every channel of every shot (the truth, for scoring fills);
 * - gap:       the groups near the obstruction are absent from the file, and two dead traces
 *              (trace ID code 2, zero samples) in one shot;
 * - decimated: every second channel (1, 3, 5, …) kept.
 * Field positions come from core/segy/fields.ts (the standard's byte positions); SegyWriter in
 * core/segy/writer.ts re-writes an existing file with filled traces, so new files are laid out here.
 * Deterministic: the same bytes on every run and machine (no dates from the clock, seeded noise).
 */
import { BINARY_HEADER, TEXT_HEADER_BYTES, TRACE_HEADER, TRACE_HEADER_BYTES, writeFieldAt, type BinaryFieldName, type TraceFieldName } from '../segy/fields';
import { encodeSamplesUnchecked } from '../segy/formats';
import { encodeText } from '../segy/text';
import { BugError } from '../problems';
import { DEMO_SCENARIO, type DemoScenario } from './demo-scenario';
import { obstructedChannels } from './marine-geometry';
import { synthesizeMarineLine, type MarineLine } from './marine-shot';

export type DemoVariant = 'full' | 'gap' | 'decimated';

export interface DemoFileSpec {
  readonly fileName: string;
  readonly variant: DemoVariant;
  /** One line for samples/README.md and the textual header. */
  readonly description: string;
}

export const DEMO_FILES: readonly DemoFileSpec[] = [
  { fileName: 'grv07-full.sgy', variant: 'full', description: 'complete line, every channel (the truth for scoring fills)' },
  { fileName: 'grv07-gap.sgy', variant: 'gap', description: 'groups near the jetty absent (16 per shot), 2 dead traces in record 3103' },
  { fileName: 'grv07-decimated.sgy', variant: 'decimated', description: 'every second channel kept (25 m group spacing)' },
];

/** The file the app and the CLI open when the user names none: the line with the gap under the jetty. */
export const DEMO_DEFAULT_FILE = 'grv07-gap.sgy';

export interface DemoTrace {
  /** Index into the full line (shot · nChannels + channel − 1). */
  lineTrace: number;
  dead: boolean;
}

/** Which traces of the line a variant keeps, in file order (shot by shot, channel 1 first). */
export function demoTraces(sc: DemoScenario, variant: DemoVariant): DemoTrace[] {
  const out: DemoTrace[] = [];
  for (let shot = 0; shot < sc.nShots; shot++) {
    const absent = variant === 'gap' ? new Set(obstructedChannels(sc, shot)) : new Set<number>();
    for (let c = 1; c <= sc.nChannels; c++) {
      if (variant === 'decimated' && c % 2 === 0) continue;
      if (absent.has(c)) continue;
      const dead = variant === 'gap' && shot === sc.deadShotIndex && sc.deadChannels.includes(c);
      out.push({ lineTrace: shot * sc.nChannels + c - 1, dead });
    }
  }
  return out;
}

const COORD_SCALAR = -100; // centimetres
const ELEV_SCALAR = -100;
/** Binary 3257 impulse polarity: 2 = a pressure increase is a positive number (SEG-Y rev 1; from memory). */
const POLARITY_PRESSURE_POSITIVE = 2;

function textHeader(sc: DemoScenario, spec: DemoFileSpec, nTraces: number): Uint8Array {
  const dtMs = sc.sampleIntervalUs / 1000;
  const lastRecord = sc.firstFieldRecord + sc.nShots - 1;
  const dead = sc.deadChannels.join(', ');
  const lines = [
    'SYNTHETIC DATA, NOT A RECORDING. DIPWEAVE DEMO FROM SCRIPTS/MAKE-SAMPLES.TS',
    `SURVEY: ${sc.surveyName.toUpperCase()}   LINE: ${sc.lineName}`,
    `VESSEL: ${sc.vesselName.toUpperCase()}   CONTRACTOR: ${sc.contractorName.toUpperCase()}`,
    'ALL NAMES, PLACES AND COORDINATES ARE INVENTED FOR THE DEMO.',
    `FILE: ${spec.fileName.toUpperCase()}`,
    spec.description.toUpperCase(),
    `TRACES: ${nTraces}; RECORDS ${sc.firstFieldRecord}-${lastRecord}, ONE SHOT EACH; CHANNEL 1 = NEAREST GROUP`,
    `SOURCE DEPTH ${sc.sourceDepthM.toFixed(1)} M, RICKER ${sc.peakFrequencyHz} HZ. STREAMER: ${sc.nChannels} GROUPS, ${sc.groupIntervalM} M, ${sc.streamerDepthM.toFixed(1)} M DEEP`,
    `NEAR OFFSET ${sc.nearOffsetM} M; SHOT INTERVAL ${sc.shotIntervalM} M; LINE AZIMUTH ${sc.azimuthDeg} DEG`,
    `SAMPLE INTERVAL ${dtMs} MS, ${sc.nSamples} SAMPLES; FORMAT 1 (IBM FLOAT), BIG-ENDIAN`,
    'COORDINATES: METRES ON AN INVENTED GRID, SCALAR -100 (BYTES 71-72)',
    'ELEVATIONS AND DEPTHS: SCALAR -100 (BYTES 69-70); GROUP ELEV = -TOW DEPTH',
    `CDP BIN ${sc.groupIntervalM / 2} M (BYTES 21-24; CDP X/Y 181-188); SHOT POINT = SOURCE STATION`,
    'OFFSET (BYTES 37-40) IN WHOLE METRES; EXACT POSITIONS IN THE COORDINATES',
    `OBSTRUCTION: ${sc.obstructionName.toUpperCase()}. GROUPS WITHIN ${sc.obstructionHalfWidthM} M OF ITS PILES REMOVED (GAP)`,
    `DEAD (GAP FILE): RECORD ${sc.firstFieldRecord + sc.deadShotIndex} CHANNELS ${dead}: TRACE ID 2, ZERO SAMPLES`,
    'POLARITY: PRESSURE INCREASE = POSITIVE NUMBER (BINARY 3257-3258 = 2)',
  ];
  const out = new Uint8Array(TEXT_HEADER_BYTES);
  for (let i = 0; i < 40; i++) {
    let body = lines[i] ?? '';
    if (body.length > 76) throw new BugError(`demo textual header card ${i + 1} is ${body.length} characters long (76 fit)`);
    if (i === 38) body = 'SEG Y REV1';
    if (i === 39) body = 'END TEXTUAL HEADER';
    const card = `C${String(i + 1).padStart(2, ' ')} ${body}`.padEnd(80, ' ').slice(0, 80);
    encodeText(card, 'ebcdic', out, i * 80);
  }
  return out;
}

function setBinary(view: DataView, name: BinaryFieldName, value: number): void {
  const f = BINARY_HEADER[name];
  writeFieldAt(view, 3200 + f.byte - 3201, f.kind, value, false);
}

function setTrace(view: DataView, at: number, name: TraceFieldName, value: number): void {
  const f = TRACE_HEADER[name];
  writeFieldAt(view, at + f.byte - 1, f.kind, value, false);
}

/** Encodes one variant of the line. `line` must come from synthesizeMarineLine(sc). */
export function encodeDemoSegy(line: MarineLine, sc: DemoScenario, spec: DemoFileSpec): Uint8Array {
  const traces = demoTraces(sc, spec.variant);
  const nSamples = line.nSamples;
  const traceBytes = TRACE_HEADER_BYTES + 4 * nSamples;
  const bytes = new Uint8Array(3600 + traces.length * traceBytes);
  const view = new DataView(bytes.buffer);
  bytes.set(textHeader(sc, spec, traces.length), 0);

  const channelsKept = spec.variant === 'decimated' ? Math.ceil(sc.nChannels / 2) : sc.nChannels;
  const groupM = spec.variant === 'decimated' ? 2 * sc.groupIntervalM : sc.groupIntervalM;
  setBinary(view, 'JOB_ID', 7);
  setBinary(view, 'LINE_NUMBER', 7);
  setBinary(view, 'REEL_NUMBER', 1);
  setBinary(view, 'DATA_TRACES_PER_ENSEMBLE', channelsKept);
  setBinary(view, 'AUX_TRACES_PER_ENSEMBLE', 0);
  setBinary(view, 'SAMPLE_INTERVAL_US', sc.sampleIntervalUs);
  setBinary(view, 'ORIGINAL_SAMPLE_INTERVAL_US', sc.sampleIntervalUs);
  setBinary(view, 'SAMPLES_PER_TRACE', nSamples);
  setBinary(view, 'ORIGINAL_SAMPLES_PER_TRACE', nSamples);
  setBinary(view, 'SAMPLE_FORMAT_CODE', 1);
  // Nominal CDP fold of a towed-streamer line: channels · group interval / (2 · shot interval) (common practice).
  setBinary(view, 'ENSEMBLE_FOLD', Math.round((channelsKept * groupM) / (2 * sc.shotIntervalM)));
  setBinary(view, 'TRACE_SORTING_CODE', 1); // as recorded
  setBinary(view, 'MEASUREMENT_SYSTEM', 1); // metres
  setBinary(view, 'IMPULSE_POLARITY', POLARITY_PRESSURE_POSITIVE);
  setBinary(view, 'REVISION_MAJOR', 1);
  setBinary(view, 'REVISION_MINOR', 0);
  setBinary(view, 'FIXED_LENGTH_TRACE_FLAG', 1);
  setBinary(view, 'EXTENDED_TEXT_HEADER_COUNT', 0);

  const inEnsemble = new Map<number, number>();
  const stats = { clamped: 0 };
  const zeros = new Float32Array(nSamples);
  for (let i = 0; i < traces.length; i++) {
    const { lineTrace, dead } = traces[i];
    const g = line.geometry[lineTrace];
    const at = 3600 + i * traceBytes;
    const fold = (inEnsemble.get(g.cdp) ?? 0) + 1;
    inEnsemble.set(g.cdp, fold);
    const sourceStation = sc.stationAtAlongLine0 + Math.round(g.sourceAlongM / sc.groupIntervalM);
    const secondOfDay = sc.firstShotSecondOfDay + g.shotIndex * sc.shotTimeIntervalS;
    const cm = (m: number) => Math.round(m * 100);
    setTrace(view, at, 'TRACE_SEQUENCE_IN_LINE', i + 1);
    setTrace(view, at, 'TRACE_SEQUENCE_IN_FILE', i + 1);
    setTrace(view, at, 'FIELD_RECORD', sc.firstFieldRecord + g.shotIndex);
    setTrace(view, at, 'TRACE_IN_FIELD_RECORD', g.channel);
    setTrace(view, at, 'SOURCE_POINT', sourceStation);
    setTrace(view, at, 'ENSEMBLE', g.cdp);
    setTrace(view, at, 'TRACE_IN_ENSEMBLE', fold);
    setTrace(view, at, 'TRACE_ID_CODE', dead ? 2 : 1);
    setTrace(view, at, 'VERTICALLY_SUMMED_TRACES', 1);
    setTrace(view, at, 'HORIZONTALLY_STACKED_TRACES', 1);
    setTrace(view, at, 'DATA_USE', 1); // production
    setTrace(view, at, 'OFFSET', Math.round(g.offsetM));
    setTrace(view, at, 'RECEIVER_ELEVATION', cm(-sc.streamerDepthM));
    setTrace(view, at, 'SOURCE_SURFACE_ELEVATION', 0);
    setTrace(view, at, 'SOURCE_DEPTH', cm(sc.sourceDepthM));
    setTrace(view, at, 'SOURCE_WATER_DEPTH', cm(g.waterDepthAtSourceM));
    setTrace(view, at, 'RECEIVER_WATER_DEPTH', cm(g.waterDepthAtGroupM));
    setTrace(view, at, 'ELEVATION_SCALAR', ELEV_SCALAR);
    setTrace(view, at, 'COORDINATE_SCALAR', COORD_SCALAR);
    setTrace(view, at, 'SOURCE_X', cm(g.sourceEastingM));
    setTrace(view, at, 'SOURCE_Y', cm(g.sourceNorthingM));
    setTrace(view, at, 'RECEIVER_X', cm(g.groupEastingM));
    setTrace(view, at, 'RECEIVER_Y', cm(g.groupNorthingM));
    setTrace(view, at, 'COORDINATE_UNITS', 1); // length
    setTrace(view, at, 'SAMPLES_IN_TRACE', nSamples);
    setTrace(view, at, 'SAMPLE_INTERVAL_US', sc.sampleIntervalUs);
    setTrace(view, at, 'GAIN_TYPE', 1); // fixed
    setTrace(view, at, 'YEAR', sc.recordingYear);
    setTrace(view, at, 'DAY_OF_YEAR', sc.recordingDayOfYear);
    setTrace(view, at, 'HOUR', Math.floor(secondOfDay / 3600));
    setTrace(view, at, 'MINUTE', Math.floor((secondOfDay % 3600) / 60));
    setTrace(view, at, 'SECOND', secondOfDay % 60);
    setTrace(view, at, 'TIME_BASIS_CODE', 4); // UTC
    setTrace(view, at, 'ENSEMBLE_X', cm(g.midpointEastingM));
    setTrace(view, at, 'ENSEMBLE_Y', cm(g.midpointNorthingM));
    setTrace(view, at, 'SHOTPOINT', sourceStation);
    setTrace(view, at, 'SHOTPOINT_SCALAR', 1);
    const samples = dead ? zeros : line.data.subarray(lineTrace * nSamples, (lineTrace + 1) * nSamples);
    encodeSamplesUnchecked(bytes, at + TRACE_HEADER_BYTES, samples, 0, nSamples, 1, false, stats, 'nearest');
  }
  return bytes;
}

/** Synthesizes the line once and encodes every demo file. */
export function buildDemoFiles(sc: DemoScenario = DEMO_SCENARIO): { spec: DemoFileSpec; bytes: Uint8Array }[] {
  const line = synthesizeMarineLine(sc);
  return DEMO_FILES.map((spec) => ({ spec, bytes: encodeDemoSegy(line, sc, spec) }));
}
