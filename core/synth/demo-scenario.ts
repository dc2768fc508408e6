/**
 * The demo scenario: an invented marine site-survey line. Every name here is made up for Dipweave's demo;
 * the numbers are ordinary for a high-resolution 2-D site survey (common practice, no source).
 *
 * Story: the survey vessel "Tallow Finch" of the (invented) contractor Quillmoor Marine Geodata shoots line
 * GRV-07 of the Greyvane Sound site survey for an (invented) harbour extension. The line passes the piles of
 * the Ostrey Jetty. Groups that pass within 100 m of the piles recorded pile noise and were removed in
 * field QC, so each shot has a 16-trace hole; as the jetty is fixed and the streamer moves with the
 * vessel, the hole sits at different channels in every shot.
 */

export interface ReflectorSpec {
  /** Two-way normal-incidence time below the scenario's reflector reference position, seconds. */
  t0Seconds: number;
  /** RMS velocity down to the reflector, m/s (hyperbolic moveout, common practice). */
  vRmsMps: number;
  /** Normal-incidence reflection coefficient (sign is the polarity). */
  reflectionCoefficient: number;
  /** Change of normal-incidence time along the line, seconds per metre (0 for a flat reflector). */
  dT0dxSecondsPerM: number;
}

export interface DiffractorSpec {
  /** Along-line position of the point scatterer, m. */
  alongLineM: number;
  depthM: number;
  /** Average velocity above it, m/s. */
  velocityMps: number;
  amplitude: number;
}

export interface DemoScenario {
  readonly surveyName: string;
  readonly lineName: string;
  readonly vesselName: string;
  readonly contractorName: string;
  readonly obstructionName: string;
  /** Easting/northing of along-line position 0, m (an invented projected grid). */
  readonly originEastingM: number;
  readonly originNorthingM: number;
  /** Line direction, degrees clockwise from grid north. */
  readonly azimuthDeg: number;
  readonly nShots: number;
  readonly firstSourceAlongLineM: number;
  readonly shotIntervalM: number;
  readonly nChannels: number;
  readonly groupIntervalM: number;
  /** Source to channel 1 (nearest group), m. */
  readonly nearOffsetM: number;
  readonly sourceDepthM: number;
  readonly streamerDepthM: number;
  readonly nSamples: number;
  readonly sampleIntervalUs: number;
  readonly waterVelocityMps: number;
  /** Seabed depth at along-line 0 and its gradient (m per m along the line). */
  readonly seabedDepthM: number;
  readonly seabedSlope: number;
  readonly seabedReflectionCoefficient: number;
  /** Sea-surface reflection coefficient for ghosts and multiples (about −1 for a calm sea). */
  readonly surfaceReflectionCoefficient: number;
  /** Along-line position where each reflector's t0Seconds applies, m. */
  readonly reflectorReferenceAlongM: number;
  readonly reflectors: readonly ReflectorSpec[];
  readonly diffractor: DiffractorSpec;
  readonly directWaveAmplitude: number;
  /** Ricker peak frequency of the source signature, Hz. */
  readonly peakFrequencyHz: number;
  /** RMS of the band-limited noise relative to the peak reflection amplitude of the seabed at channel 1. */
  readonly noiseRelative: number;
  readonly noiseSeed: number;
  /** Centre of the obstruction and the half-width of the zone whose groups were removed, m along the line. */
  readonly obstructionAlongLineM: number;
  readonly obstructionHalfWidthM: number;
  /** Shot index (0-based) and channels (1-based) that are dead (trace ID 2, zero samples) in the gap file. */
  readonly deadShotIndex: number;
  readonly deadChannels: readonly number[];
  /** Field record number of the first shot; later shots count up by one. */
  readonly firstFieldRecord: number;
  /** Numbering bases for CDPs (6.25 m bins) and receiver stations (12.5 m). */
  readonly cdpAtAlongLine0: number;
  readonly stationAtAlongLine0: number;
  /** Acquisition date (invented) for the trace headers: year, day of year, hour, minute, second of shot 1. */
  readonly recordingYear: number;
  readonly recordingDayOfYear: number;
  readonly firstShotSecondOfDay: number;
  readonly shotTimeIntervalS: number;
}

export const DEMO_SCENARIO: DemoScenario = {
  surveyName: 'Greyvane Sound site survey',
  lineName: 'GRV-07',
  vesselName: 'Tallow Finch',
  contractorName: 'Quillmoor Marine Geodata',
  obstructionName: 'Ostrey Jetty',
  originEastingM: 412_350,
  originNorthingM: 6_718_420,
  azimuthDeg: 63.5,
  nShots: 5,
  firstSourceAlongLineM: 2000,
  shotIntervalM: 50,
  nChannels: 144,
  groupIntervalM: 12.5,
  nearOffsetM: 50,
  sourceDepthM: 3,
  streamerDepthM: 5,
  nSamples: 750,
  sampleIntervalUs: 2000,
  waterVelocityMps: 1500,
  seabedDepthM: 38,
  seabedSlope: 0.004,
  seabedReflectionCoefficient: 0.32,
  surfaceReflectionCoefficient: -0.95,
  reflectorReferenceAlongM: 1600,
  reflectors: [
    { t0Seconds: 0.19, vRmsMps: 1580, reflectionCoefficient: 0.12, dT0dxSecondsPerM: 0 },
    { t0Seconds: 0.34, vRmsMps: 1660, reflectionCoefficient: -0.09, dT0dxSecondsPerM: 0.00004 },
    { t0Seconds: 0.52, vRmsMps: 1760, reflectionCoefficient: 0.14, dT0dxSecondsPerM: -0.00003 },
    { t0Seconds: 0.78, vRmsMps: 1880, reflectionCoefficient: 0.11, dT0dxSecondsPerM: 0 },
    { t0Seconds: 1.12, vRmsMps: 2020, reflectionCoefficient: 0.15, dT0dxSecondsPerM: 0.00002 },
  ],
  diffractor: { alongLineM: 1280, depthM: 260, velocityMps: 1640, amplitude: 0.015 },
  directWaveAmplitude: 0.5,
  peakFrequencyHz: 32,
  noiseRelative: 0.002,
  noiseSeed: 20260,
  obstructionAlongLineM: 1156.25,
  obstructionHalfWidthM: 100,
  deadShotIndex: 2,
  deadChannels: [23, 24],
  firstFieldRecord: 3101,
  cdpAtAlongLine0: 1000,
  stationAtAlongLine0: 1000,
  recordingYear: 2025,
  recordingDayOfYear: 143,
  firstShotSecondOfDay: 9 * 3600 + 41 * 60 + 7,
  shotTimeIntervalS: 20,
};
