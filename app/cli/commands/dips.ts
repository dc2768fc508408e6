/**
 * `dipweave dips IN.sgy --out DIPS.sgy [options]`: the local slope field of every gather, written beside the
 * input: same traces, trace headers and sample count (SEG-Y, 4-byte IEEE floats, the unit stated in the textual
 * header), or a float32 .npy array (rows = output traces in file order, columns = samples) when the name ends in
 * .npy. --confidence writes the confidence map in [0, 1] the same way. --on-grid writes one trace per grid
 * position instead (what `dipweave fill --dips` reads; positions without a recording are flagged).
 * Nothing is written over the input; outputs go through temporary files.
 */
import { basename, resolve } from 'node:path';
import { parseCommandArgs, type CommandSpec } from '../args';
import type { CliCommand, CliContext } from '../context';
import { gatherOnGrid, passThroughGeometry, refineGeometry } from '../../../core/fill/gather-grid';
import { InputFileError, isInputFileError, throwIfCancelled } from '../../../core/problems';
import { GATHER_KEY_NAMES, gatherGeometry, indexGathers, openSegy, parseGatherKey, readGather, type GatherGeometry } from '../../../core/segy';
import { dipFileHeaderBytes, encodeDipTraces } from '../../../core/slope/dip-file';
import { estimateSlopes, SLOPE_DEFAULTS } from '../../../core/slope/estimate';
import { NPY_HEADER_BYTES, npyFloat32Bytes, npyHeaderFloat32 } from '../../../core/slope/npy';
import { SLOPE_UNITS, SLOPE_UNIT_LABEL, slopeUnitFactor, type SlopeUnit } from '../../../core/slope/units';
import { writeFileAtomically, type OutputSink } from '../../host/atomic-output';
import { openFileByteSource } from '../../host/file-source';
import { resolveInputOrDemo } from '../../host/demo-files';

export const dipsSpec: CommandSpec = {
  name: 'dips',
  summary: 'Estimate the local slope (dip) field of every gather and write it as SEG-Y or .npy.',
  positionals: [{ name: 'IN.sgy', help: 'SEG-Y file to read (never modified; default: the demo line)', optional: true }],
  options: [
    { name: 'out', kind: 'string', meta: 'DIPS.sgy|DIPS.npy', help: 'output file for the slopes (required)' },
    { name: 'units', kind: 'string', choices: SLOPE_UNITS, default: 'samples-per-trace', help: 'unit of the written slopes' },
    { name: 'confidence', kind: 'string', meta: 'CONF.sgy|CONF.npy', help: 'also write the confidence in [0, 1]' },
    { name: 'method', kind: 'string', choices: ['pwd', 'tensor'], default: 'pwd', help: 'plane-wave destruction, or the faster structure tensor' },
    { name: 'radius-t', kind: 'integer', meta: 'N', default: SLOPE_DEFAULTS.radiusTimeSamples, help: 'smoothing radius along time, samples' },
    { name: 'radius-x', kind: 'integer', meta: 'N', default: SLOPE_DEFAULTS.radiusTraces, help: 'smoothing radius across traces' },
    { name: 'order', kind: 'integer', meta: '1|2', default: 1, help: 'destruction filter: 1 = 3-point, 2 = 5-point' },
    { name: 'key', kind: 'string', meta: 'NAME|BYTE', default: 'record', help: `trace header key that groups traces into gathers: ${Object.keys(GATHER_KEY_NAMES).join(', ')}, a field name, or a byte position` },
    { name: 'spacing', kind: 'number', meta: 'M', help: 'trace spacing in metres (needed for s-per-km where headers carry no geometry)' },
    { name: 'factor', kind: 'integer', meta: 'K', help: 'the gather is decimated by K: put K−1 grid positions between neighbouring traces' },
    { name: 'on-grid', kind: 'flag', help: 'one output trace per grid position (for `dipweave fill --dips`) instead of per input trace' },
    { name: 'lenient', kind: 'flag', help: 'read files whose headers contradict each other, with warnings instead of errors' },
  ],
};

function badArg(message: string, found?: string | number, hint?: string): InputFileError {
  return new InputFileError({ code: 'input.bad-argument', severity: 'error', message, found, hint });
}

type Kind = 'segy' | 'npy';
const kindOf = (path: string): Kind => (/\.npy$/i.test(path) ? 'npy' : 'segy');

interface Output {
  readonly kind: Kind;
  readonly path: string;
  readonly sink: OutputSink;
}

async function run(argv: readonly string[], ctx: CliContext): Promise<number> {
  const args = parseCommandArgs(dipsSpec, argv);
  const o = args.options;
  const input = resolveInputOrDemo(args.positionals[0], ctx.cwd, ctx.stderr, 'dips');
  if ((typeof o.out !== 'string' || o.out === '') && !input.isDemo) throw badArg('`dipweave dips` needs --out DIPS.sgy (or DIPS.npy).', undefined, 'The input file is never written over.');
  const inPath = input.path;
  const outPath = resolve(ctx.cwd, typeof o.out === 'string' && o.out !== '' ? o.out : 'grv07-gap.dips.sgy');
  const confPath = typeof o.confidence === 'string' ? resolve(ctx.cwd, o.confidence) : undefined;
  if (confPath && confPath === outPath) throw badArg('--confidence must name a different file than --out.', o.confidence as string);
  const unit = o.units as SlopeUnit;
  const keyText = String(o.key);
  const key = parseGatherKey(keyText);
  const spacingM = o.spacing as number | undefined;
  if (spacingM !== undefined && !(spacingM > 0)) throw badArg('option --spacing needs a positive number of metres.', spacingM);
  const factor = o.factor as number | undefined;
  if (factor !== undefined && !(factor >= 1 && factor <= 64)) throw badArg('option --factor needs a whole number from 1 to 64.', factor);
  const order = o.order as number;
  if (order !== 1 && order !== 2) throw badArg('option --order must be 1 or 2.', order);
  const onGrid = o['on-grid'] === true;
  const slopeOptions = { method: o.method as 'pwd' | 'tensor', radiusTimeSamples: o['radius-t'] as number, radiusTraces: o['radius-x'] as number, order: order as 1 | 2 };

  const source = await openFileByteSource(inPath);
  try {
    const file = await openSegy(source, { strict: !o.lenient });
    for (const w of file.warnings) ctx.stderr(`dipweave dips: warning: ${w.message} [${w.code}]\n`);
    const index = await indexGathers(file, key, { cancel: ctx.cancel });
    const nS = file.nSamples;
    const dtS = file.sampleIntervalUs / 1e6;
    ctx.stderr(`dipweave dips: ${file.name}: ${index.gathers.length} gathers by ${key.label}, ${nS} samples at ${file.sampleIntervalUs} µs; method ${slopeOptions.method}, radii ${slopeOptions.radiusTimeSamples} samples × ${slopeOptions.radiusTraces} traces; unit ${SLOPE_UNIT_LABEL[unit]}.\n`);

    // Geometry of every gather first: the output's trace count must be known for the headers.
    const geometries: GatherGeometry[] = [];
    let total = 0;
    for (let i = 0; i < index.gathers.length; i++) {
      throwIfCancelled(ctx.cancel);
      const g = await readGather(file, index, i, { cancel: ctx.cancel });
      let geo: GatherGeometry;
      try {
        geo = gatherGeometry(g.headers, g.data, nS, { spacingM });
        if (factor !== undefined && factor > 1) geo = refineGeometry(geo, factor);
      } catch (e) {
        if (!isInputFileError(e) || unit === 's-per-km') throw e;
        ctx.stderr(`dipweave dips: gather ${g.keyValue}: ${e.message}; using trace order.\n`);
        geo = passThroughGeometry(g.nTraces);
      }
      if (unit === 's-per-km' && !(geo.spacingM > 0))
        throw new InputFileError({ code: 'geometry.no-spacing', severity: 'error', file: file.name, message: `gather ${g.keyValue} has no trace spacing, which s/km needs.`, hint: 'Give --spacing M, or write samples-per-trace or ms-per-trace.' });
      geometries.push(geo);
      total += onGrid ? geo.gridCount : g.nTraces;
    }

    const lines = (what: string, valueUnit: string) => [
      `DIPWEAVE 0.1.0 ${what} OF ${basename(inPath)}`.slice(0, 76),
      `SAMPLES: ${valueUnit}`,
      'SIGN: POSITIVE = EVENTS LATER AT HIGHER TRACE POSITION (DT/DX)',
      `METHOD: ${slopeOptions.method === 'pwd' ? 'PLANE-WAVE DESTRUCTION' : 'STRUCTURE TENSOR'}, RADII ${slopeOptions.radiusTimeSamples} SAMPLES X ${slopeOptions.radiusTraces} TRACES`,
      `TRACES: ${onGrid ? 'ONE PER GRID POSITION (FLAG 233-234 = 1: NO RECORDING THERE)' : 'ONE PER INPUT TRACE, INPUT TRACE HEADERS KEPT'}`,
      'SLOPES ARE ESTIMATES FROM THE DATA; SEE THE CONFIDENCE FILE.',
    ];
    const factorUnit = (geo: GatherGeometry) => slopeUnitFactor(unit, { sampleIntervalS: dtS, traceSpacingM: geo.spacingM });

    const openOutputs = async (body: (outs: Output[]) => Promise<void>) => {
      const specs: { path: string; what: string; valueUnit: string }[] = [{ path: outPath, what: 'SLOPE FIELD', valueUnit: `SLOPE IN ${SLOPE_UNIT_LABEL[unit].toUpperCase()}` }];
      if (confPath) specs.push({ path: confPath, what: 'SLOPE CONFIDENCE', valueUnit: 'CONFIDENCE 0 (NONE) TO 1 (FULL)' });
      const outs: Output[] = [];
      const nest = async (k: number): Promise<void> => {
        if (k === specs.length) return body(outs);
        const s = specs[k];
        await writeFileAtomically(s.path, [inPath], async (sink) => {
          const kind = kindOf(s.path);
          await sink.write(kind === 'npy' ? npyHeaderFloat32([total, nS]) : dipFileHeaderBytes(file, lines(s.what, s.valueUnit), total));
          outs[k] = { kind, path: s.path, sink };
          await nest(k + 1);
        }, ctx.cancel);
      };
      await nest(0);
    };

    let lowConf = 0, samples = 0;
    await openOutputs(async (outs) => {
      for (let i = 0; i < index.gathers.length; i++) {
        throwIfCancelled(ctx.cancel);
        const g = await readGather(file, index, i, { cancel: ctx.cancel });
        const geo = geometries[i];
        const nG = geo.gridCount;
        const live = new Uint8Array(nG);
        for (let k = 0; k < nG; k++) live[k] = geo.traceOfGrid[k] >= 0 ? 1 : 0;
        for (const k of geo.deadGrid) live[k] = 0;
        const headerOf: number[] = [], flagged: number[] = [], rows: number[] = [];
        if (onGrid) {
          for (let k = 0; k < nG; k++) {
            let t = geo.traceOfGrid[k];
            flagged.push(t < 0 ? 1 : 0);
            // header of the nearest recorded position (left first)
            for (let d = 1; t < 0 && d < nG; d++) {
              if (k - d >= 0 && geo.traceOfGrid[k - d] >= 0) t = geo.traceOfGrid[k - d];
              else if (k + d < nG && geo.traceOfGrid[k + d] >= 0) t = geo.traceOfGrid[k + d];
            }
            headerOf.push(Math.max(0, t));
            rows.push(k);
          }
        } else {
          for (let t = 0; t < g.nTraces; t++) { headerOf.push(t); flagged.push(0); rows.push(geo.gridIndexOfTrace[t]); }
        }
        let slope: Float64Array, conf: Float64Array;
        if (nG >= 2 && live.reduce((a, b) => a + b, 0) >= 2) {
          try {
            const f = estimateSlopes(gatherOnGrid(g.data, geo, nS), nG, nS, live, slopeOptions, ctx.cancel);
            slope = f.slopeTraces;
            conf = f.confidence;
          } catch (e) {
            if (!isInputFileError(e)) throw e;
            ctx.stderr(`dipweave dips: gather ${g.keyValue}: ${e.message}; slopes written as 0 with confidence 0.\n`);
            slope = new Float64Array(nG * nS);
            conf = new Float64Array(nG * nS);
          }
        } else {
          ctx.stderr(`dipweave dips: gather ${g.keyValue} has fewer than 2 live traces; slopes written as 0 with confidence 0.\n`);
          slope = new Float64Array(nG * nS);
          conf = new Float64Array(nG * nS);
        }
        const fu = factorUnit(geo);
        const sOut = new Float32Array(rows.length * nS), cOut = new Float32Array(rows.length * nS);
        rows.forEach((k, r) => {
          for (let s = 0; s < nS; s++) {
            sOut[r * nS + s] = slope[k * nS + s] * fu;
            const c = conf[k * nS + s];
            cOut[r * nS + s] = c;
            if (c < 0.5) lowConf++;
            samples++;
          }
        });
        const hIdx = Int32Array.from(headerOf), fl = Uint8Array.from(flagged);
        for (const [k, out] of outs.entries()) {
          const values = k === 0 ? sOut : cOut;
          await out.sink.write(out.kind === 'npy' ? npyFloat32Bytes(values) : encodeDipTraces(file, g.rawHeaders, hIdx, fl, values, nS));
        }
      }
      for (const out of outs) if (out.kind === 'npy' && out.sink.bytesWritten !== NPY_HEADER_BYTES + total * nS * 4) throw new Error('dips: .npy size does not match its header');
    });
    ctx.stdout(`${basename(outPath)}: ${total} traces × ${nS} samples of slope in ${SLOPE_UNIT_LABEL[unit]}${confPath ? `; ${basename(confPath)}: confidence` : ''}. ${samples ? ((100 * lowConf) / samples).toFixed(1) : '0'} % of samples have confidence below 0.5.\n`);
    return 0;
  } finally {
    await source.close();
  }
}

export const dipsCommand: CliCommand = { spec: dipsSpec, run };
