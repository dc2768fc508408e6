// Builds small SEG-Y files for the fill CLI tests byte by byte (DataView, not core/segy/writer.ts), from the
// analytic hyperbolas of core/synth/events.ts. Invented data: the "Harrowmere test line" scenario.
import { addHyperbola, type HyperbolaSpec } from '../../core/synth/events';
import { encodeText } from '../../core/segy/text';

export interface FixtureGather {
  record: number;
  nPositions: number;
  /** Grid positions with no trace in the file. */
  absent?: number[];
  /** Grid positions whose trace is flagged dead (trace ID 2) and holds junk. */
  dead?: number[];
  /** Apex of the hyperbolas, trace index (default record − 4). */
  apexTrace?: number;
}

export const N_SAMPLES = 200;
export const SPACING_M = 10;

/** The analytic events of one gather. */
export function fixtureEvents(g: FixtureGather): HyperbolaSpec[] {
  return [
    { t0Samples: 50, velocityTracesPerSample: 0.4, apexTrace: g.apexTrace ?? -4 + g.record, fpCyclesPerSample: 0.07 },
    { t0Samples: 110, velocityTracesPerSample: 0.5, apexTrace: g.apexTrace ?? -4 + g.record, fpCyclesPerSample: 0.07, amplitude: -0.7 },
  ];
}

/** Truth of one gather on its full grid (trace-major, Float32 as stored). */
export function gatherTruth(g: FixtureGather): Float32Array {
  const u = new Float64Array(g.nPositions * N_SAMPLES);
  for (const e of fixtureEvents(g)) addHyperbola(u, g.nPositions, N_SAMPLES, e);
  return Float32Array.from(u);
}

/** A rev 1, big-endian, 4-byte IEEE file; receiver X every 10 m, source fixed per gather. */
export function buildFillFixture(gathers: FixtureGather[], valuesOf: (g: FixtureGather) => Float32Array = gatherTruth): Uint8Array {
  const traces: { g: FixtureGather; pos: number }[] = [];
  for (const g of gathers) for (let pos = 0; pos < g.nPositions; pos++) if (!g.absent?.includes(pos)) traces.push({ g, pos });
  const traceBytes = 240 + 4 * N_SAMPLES;
  const out = new Uint8Array(3600 + traces.length * traceBytes);
  const v = new DataView(out.buffer);
  const cards = ['DIPWEAVE FILL TEST FILE (INVENTED DATA)', 'LINE: HARROWMERE TEST LINE 7', 'FORMAT 5 BIG-ENDIAN'];
  for (let i = 0; i < 40; i++) {
    const body = i === 38 ? 'SEG Y REV1' : i === 39 ? 'END TEXTUAL HEADER' : cards[i] ?? '';
    encodeText(`C${String(i + 1).padStart(2, ' ')} ${body}`.padEnd(80, ' '), 'ebcdic', out, i * 80);
  }
  v.setInt16(3216, 2000);
  v.setUint16(3220, N_SAMPLES);
  v.setInt16(3224, 5);
  v.setInt16(3254, 1);
  out[3500] = 1;
  v.setInt16(3502, 1);
  const truths = new Map(gathers.map((g) => [g.record, valuesOf(g)]));
  traces.forEach(({ g, pos }, i) => {
    const p = 3600 + i * traceBytes;
    v.setInt32(p, i + 1);
    v.setInt32(p + 4, i + 1);
    v.setInt32(p + 8, g.record);
    v.setInt32(p + 12, pos + 1);
    v.setInt16(p + 28, g.dead?.includes(pos) ? 2 : 1);
    v.setInt32(p + 36, 100 + pos * SPACING_M);
    v.setInt16(p + 70, -100);
    v.setInt32(p + 72, 100000 * g.record);
    v.setInt32(p + 80, 100000 * g.record + 10000 + pos * SPACING_M * 100);
    v.setInt16(p + 88, 1);
    v.setUint16(p + 114, N_SAMPLES);
    v.setInt16(p + 116, 2000);
    const t = truths.get(g.record)!;
    for (let s = 0; s < N_SAMPLES; s++) v.setFloat32(p + 240 + 4 * s, g.dead?.includes(pos) ? ((s * 7919) % 13) - 6 : t[pos * N_SAMPLES + s]);
  });
  return out;
}
