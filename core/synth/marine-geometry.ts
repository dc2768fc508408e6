/**
 * Geometry of a towed-streamer 2-D line: source and group positions along the line, grid coordinates,
 * offsets, midpoints (CDP bins of half a group interval), receiver stations and water depths.
 * The vessel sails towards increasing along-line position; channel 1 is the group nearest the source.
 * Straight streamer, no feathering (a 2-D line as processed; common practice, no source).
 */
import type { DemoScenario } from './demo-scenario';

export interface MarineTraceGeometry {
  /** 0-based shot index and 1-based channel. */
  shotIndex: number;
  channel: number;
  sourceAlongM: number;
  receiverAlongM: number;
  /** Source-receiver distance at the surface, m (positive). */
  offsetM: number;
  midpointAlongM: number;
  sourceEastingM: number;
  sourceNorthingM: number;
  groupEastingM: number;
  groupNorthingM: number;
  midpointEastingM: number;
  midpointNorthingM: number;
  cdp: number;
  receiverStation: number;
  waterDepthAtSourceM: number;
  waterDepthAtGroupM: number;
}

export function sourceAlongM(sc: DemoScenario, shotIndex: number): number {
  return sc.firstSourceAlongLineM + shotIndex * sc.shotIntervalM;
}

export function receiverAlongM(sc: DemoScenario, shotIndex: number, channel: number): number {
  return sourceAlongM(sc, shotIndex) - sc.nearOffsetM - (channel - 1) * sc.groupIntervalM;
}

export function seabedDepthM(sc: DemoScenario, alongM: number): number {
  return sc.seabedDepthM + sc.seabedSlope * alongM;
}

/** Grid coordinates of an along-line position. */
export function lineToGrid(sc: DemoScenario, alongM: number): { eastingM: number; northingM: number } {
  const az = (sc.azimuthDeg * Math.PI) / 180;
  return { eastingM: sc.originEastingM + alongM * Math.sin(az), northingM: sc.originNorthingM + alongM * Math.cos(az) };
}

export function traceGeometry(sc: DemoScenario, shotIndex: number, channel: number): MarineTraceGeometry {
  const s = sourceAlongM(sc, shotIndex);
  const r = receiverAlongM(sc, shotIndex, channel);
  const m = 0.5 * (s + r);
  const sg = lineToGrid(sc, s);
  const rg = lineToGrid(sc, r);
  const mg = lineToGrid(sc, m);
  const binM = sc.groupIntervalM / 2;
  return {
    shotIndex,
    channel,
    sourceAlongM: s,
    receiverAlongM: r,
    offsetM: s - r,
    midpointAlongM: m,
    sourceEastingM: sg.eastingM,
    sourceNorthingM: sg.northingM,
    groupEastingM: rg.eastingM,
    groupNorthingM: rg.northingM,
    midpointEastingM: mg.eastingM,
    midpointNorthingM: mg.northingM,
    cdp: sc.cdpAtAlongLine0 + Math.round(m / binM),
    receiverStation: sc.stationAtAlongLine0 + Math.round(r / sc.groupIntervalM),
    waterDepthAtSourceM: seabedDepthM(sc, s),
    waterDepthAtGroupM: seabedDepthM(sc, r),
  };
}

/** Channels (1-based) of one shot whose groups lie within the obstruction zone. */
export function obstructedChannels(sc: DemoScenario, shotIndex: number): number[] {
  const out: number[] = [];
  for (let c = 1; c <= sc.nChannels; c++) {
    if (Math.abs(receiverAlongM(sc, shotIndex, c) - sc.obstructionAlongLineM) < sc.obstructionHalfWidthM) out.push(c);
  }
  return out;
}
