/**
 * `dipweave inspect FILE [--key NAME|BYTE] [--spacing M] [--byte-order big|little] [--lenient] [--json]`: what a SEG-Y file holds and, for each
 * gather, its geometry (spacing, grid, missing and dead positions). Reads every trace once.
 */
import type { CommandSpec } from '../args';
import { parseCommandArgs } from '../args';
import type { CliCommand, CliContext } from '../context';
import { InputFileError, isInputFileError, type FileProblem } from '../../../core/problems';
import { GATHER_KEY_NAMES, gatherGeometry, indexGathers, openSegy, parseGatherKey, readGather } from '../../../core/segy';
import { openFileByteSource } from '../../host/file-source';
import { resolveInputOrDemo } from '../../host/demo-files';

export const inspectSpec: CommandSpec = {
  name: 'inspect',
  summary: 'Summarise a SEG-Y file and the geometry of each gather (spacing, missing and dead traces).',
  positionals: [{ name: 'FILE', help: 'SEG-Y file to read (never modified; default: the demo line)', optional: true }],
  options: [
    { name: 'key', kind: 'string', meta: 'NAME|BYTE', default: 'record', help: `trace header key that groups traces into gathers: ${Object.keys(GATHER_KEY_NAMES).join(', ')}, a field name, or a byte position BYTE[:2|:4]` },
    { name: 'spacing', kind: 'number', meta: 'M', help: 'trace spacing in metres (needed where headers carry no geometry; overrides the estimate otherwise)' },
    { name: 'byte-order', kind: 'string', choices: ['big', 'little'], help: 'read in this byte order instead of the one found in or guessed from the header' },
    { name: 'lenient', kind: 'flag', help: 'read files whose headers contradict each other, with warnings instead of errors' },
    { name: 'json', kind: 'flag', help: 'print the summary as JSON' },
  ],
};

export interface InspectGather {
  keyValue: number;
  traceCount: number;
  gridCount: number;
  spacingM: number | null;
  positionSource: string;
  missing: number[];
  dead: number[];
  maxJitter: number;
  warnings: FileProblem[];
  /** Set when this gather's geometry could not be worked out (the file itself was read). */
  problem?: FileProblem;
}

/** "1-3, 7, 9-10" from sorted integers. */
export function formatRanges(values: readonly number[]): string {
  const parts: string[] = [];
  for (let i = 0; i < values.length; ) {
    let j = i;
    while (j + 1 < values.length && values[j + 1] === values[j] + 1) j++;
    parts.push(i === j ? `${values[i]}` : `${values[i]}-${values[j]}`);
    i = j + 1;
  }
  return parts.join(', ') || '-';
}

async function run(argv: readonly string[], ctx: CliContext): Promise<number> {
  const args = parseCommandArgs(inspectSpec, argv);
  const path = resolveInputOrDemo(args.positionals[0], ctx.cwd, ctx.stderr, 'inspect').path;
  const key = parseGatherKey(String(args.options.key));
  const spacingM = args.options.spacing as number | undefined;
  if (spacingM !== undefined && !(spacingM > 0))
    throw new InputFileError({ code: 'input.bad-argument', severity: 'error', message: 'option --spacing needs a positive number of metres.', found: spacingM });
  const source = await openFileByteSource(path);
  try {
    const byteOrder = args.options['byte-order'] as 'big' | 'little' | undefined;
    const file = await openSegy(source, { strict: !args.options.lenient, byteOrder });
    const index = await indexGathers(file, key, { cancel: ctx.cancel });
    const gathers: InspectGather[] = [];
    for (let i = 0; i < index.gathers.length; i++) {
      const g = await readGather(file, index, i, { cancel: ctx.cancel });
      try {
        const geo = gatherGeometry(g.headers, g.data, g.nSamples, { spacingM });
        gathers.push({
          keyValue: g.keyValue, traceCount: g.nTraces, gridCount: geo.gridCount,
          spacingM: Number.isFinite(geo.spacingM) ? geo.spacingM : null, positionSource: geo.positionSource,
          missing: Array.from(geo.missingGrid), dead: Array.from(geo.deadGrid), maxJitter: geo.maxJitter, warnings: [...geo.warnings],
        });
      } catch (e) {
        if (!isInputFileError(e)) throw e;
        gathers.push({
          keyValue: g.keyValue, traceCount: g.nTraces, gridCount: 0, spacingM: null, positionSource: 'unknown',
          missing: [], dead: [], maxJitter: Number.NaN, warnings: [], problem: e.problem,
        });
      }
    }
    const summary = {
      file: path,
      sizeBytes: file.sizeBytes,
      traceCount: file.traceCount,
      samplesPerTrace: file.nSamples,
      sampleIntervalUs: Number.isFinite(file.sampleIntervalUs) ? file.sampleIntervalUs : null,
      formatCode: file.formatCode,
      format: file.format.label,
      byteOrder: file.byteOrder,
      byteOrderSource: file.byteOrderSource,
      revision: file.revision,
      textEncoding: file.textEncoding,
      extendedTextHeaders: file.extendedTextHeaders.length,
      key: { label: key.label, byte: key.byte, sizeBytes: key.sizeBytes },
      warnings: file.warnings,
      gathers,
    };
    if (args.options.json) {
      ctx.stdout(JSON.stringify(summary, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2) + '\n');
      return 0;
    }
    const dt = summary.sampleIntervalUs;
    const lines = [
      `${file.name}: ${file.traceCount} traces × ${file.nSamples} samples at ${dt === null ? 'unknown' : `${dt} µs`} (${dt === null ? '?' : ((file.nSamples - 1) * dt / 1000).toFixed(1)} ms)`,
      `  format ${file.formatCode} (${file.format.label}), ${file.byteOrder}-endian (${file.byteOrderSource}), revision ${file.revision}, ${file.textEncoding.toUpperCase()} text, ${file.extendedTextHeaders.length} extended textual header(s)`,
      `  ${gathers.length} gather(s) by ${key.label} (trace byte ${key.byte}, ${key.sizeBytes} bytes)`,
    ];
    for (const w of file.warnings) lines.push(`  warning: ${w.message} [${w.code}]`);
    lines.push('', `  ${'key'.padStart(10)} ${'traces'.padStart(6)} ${'grid'.padStart(5)} ${'spacing m'.padStart(10)}  ${'from'.padEnd(11)} missing / dead grid positions`);
    for (const g of gathers) {
      if (g.problem) {
        lines.push(`  ${String(g.keyValue).padStart(10)} ${String(g.traceCount).padStart(6)}   geometry not worked out: ${g.problem.message} ${g.problem.found ?? ''} [${g.problem.code}]`);
        continue;
      }
      lines.push(`  ${String(g.keyValue).padStart(10)} ${String(g.traceCount).padStart(6)} ${String(g.gridCount).padStart(5)} ${(g.spacingM === null ? '?' : String(Number(g.spacingM.toPrecision(6)))).padStart(10)}  ${g.positionSource.padEnd(11)} missing ${formatRanges(g.missing)}; dead ${formatRanges(g.dead)}`);
      for (const w of g.warnings) lines.push(`  ${''.padStart(10)}   note: ${w.message} [${w.code}]`);
    }
    ctx.stdout(lines.join('\n') + '\n');
    return 0;
  } finally {
    await source.close();
  }
}

export const inspectCommand: CliCommand = { spec: inspectSpec, run };
