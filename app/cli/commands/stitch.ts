/**
 * `dipweave stitch IN.sgy --out OUT.sgy PART.sgy…`: joins the outputs of `dipweave fill --shard I/N` runs
 * (e.g. one per task of a cluster job array) into one file and one report, as if the whole file had been filled
 * in one run. Parts are put in shard order from their reports (each part's report must sit beside it, where
 * `dipweave fill` writes it by default), so the order on the command line does not matter. Every shard 1..N
 * must be present exactly once. The headers and the processing note come from IN.sgy; trace headers and
 * samples come from the parts unchanged except the trace sequence numbers (renumbered over the output).
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { parseCommandArgs, type CommandSpec } from '../args';
import type { CliCommand, CliContext } from '../context';
import { passThroughGeometry } from '../../../core/fill/gather-grid';
import { InputFileError, throwIfCancelled } from '../../../core/problems';
import { openSegy, readTraces, type SegyFile } from '../../../core/segy';
import { assertNotAnInput, writeFileAtomically } from '../../host/atomic-output';
import { openFileByteSource } from '../../host/file-source';
import { writeFilledSegy } from '../../host/segy-output';
import { defaultReportPath, summarise, type GatherReport } from './fill';

export const stitchSpec: CommandSpec = {
  name: 'stitch',
  summary: 'Join the outputs and reports of `dipweave fill --shard I/N` runs into one file and one report.',
  positionals: [
    { name: 'IN.sgy', help: 'the file the shards were filled from (its headers and note are used)' },
    { name: 'PART.sgy…', help: 'every shard output, in any order (each with its .report.json beside it)' },
  ],
  options: [
    { name: 'out', kind: 'string', meta: 'OUT.sgy', help: 'joined SEG-Y file (required)' },
    { name: 'report', kind: 'string', meta: 'REPORT.json', help: 'joined report (default OUT.sgy with .report.json)' },
    { name: 'lenient', kind: 'flag', help: 'read files whose headers contradict each other, with warnings instead of errors' },
  ],
};

interface PartReport {
  format: string;
  method: string;
  input: string;
  gatherKey: string;
  shard: { index: number; count: number; firstGather: number; endGather: number; totalGathers: number };
  gathers: GatherReport[];
  [k: string]: unknown;
}

function bad(file: string, message: string, found?: string | number, expected?: string, hint?: string): InputFileError {
  return new InputFileError({ code: 'input.bad-argument', severity: 'error', file, message, found, expected, hint });
}

async function readPartReport(partPath: string): Promise<PartReport> {
  const rp = defaultReportPath(partPath);
  let text: string;
  try {
    text = await readFile(rp, 'utf8');
  } catch {
    throw new InputFileError({ code: 'input.file-not-found', severity: 'error', file: rp, message: 'the shard\'s report is missing.', hint: 'Each part needs the report `dipweave fill` writes beside it (OUT.report.json); do not pass --report to the shard runs.' });
  }
  let r: PartReport;
  try {
    r = JSON.parse(text) as PartReport;
  } catch {
    throw bad(rp, 'the shard report is not valid JSON.');
  }
  if (r?.format !== 'dipweave-fill-report' || typeof r.shard?.index !== 'number' || !Array.isArray(r.gathers) || typeof r.method !== 'string')
    throw bad(rp, 'this is not a report written by `dipweave fill`.', String(r?.format), 'dipweave-fill-report');
  return r;
}

const CHUNK_TRACES = 512;

async function run(argv: readonly string[], ctx: CliContext): Promise<number> {
  // Any number of parts: widen the positional list to what was given.
  const nPos = argv.filter((a) => !a.startsWith('--')).length;
  const spec: CommandSpec = { ...stitchSpec, positionals: [stitchSpec.positionals[0], stitchSpec.positionals[1], ...Array.from({ length: Math.max(0, nPos - 2) }, () => ({ ...stitchSpec.positionals[1], optional: true }))] };
  const args = parseCommandArgs(spec, argv);
  if (typeof args.options.out !== 'string') throw bad('(command line)', '`dipweave stitch` needs --out OUT.sgy.');
  const inPath = resolve(ctx.cwd, args.positionals[0]);
  const partPaths = args.positionals.slice(1).map((p) => resolve(ctx.cwd, p));
  const outPath = resolve(ctx.cwd, args.options.out);
  const reportPath = resolve(ctx.cwd, typeof args.options.report === 'string' ? args.options.report : defaultReportPath(outPath));
  const strict = args.options.lenient !== true;

  await assertNotAnInput(outPath, [inPath, ...partPaths]);
  await assertNotAnInput(reportPath, [inPath, ...partPaths, ...partPaths.map(defaultReportPath)]);
  const parts = await Promise.all(partPaths.map(async (path) => ({ path, report: await readPartReport(path) })));
  parts.sort((a, b) => a.report.shard.index - b.report.shard.index);
  const count = parts[0].report.shard.count;
  const indices = parts.map((p) => p.report.shard.index);
  const expected = Array.from({ length: count }, (_, i) => i + 1);
  if (parts.some((p) => p.report.shard.count !== count) || indices.join(',') !== expected.join(','))
    throw bad(parts[0].path, 'the parts do not make up every shard exactly once.', `shards ${parts.map((p) => `${p.report.shard.index}/${p.report.shard.count}`).join(', ')}`, `1/${count} … ${count}/${count}`, 'Pass every shard output of one run.');
  for (const p of parts) {
    if (p.report.method !== parts[0].report.method || p.report.gatherKey !== parts[0].report.gatherKey)
      throw bad(p.path, 'this shard was filled with other settings than shard 1.', p.report.method, parts[0].report.method);
  }

  const inSource = await openFileByteSource(inPath);
  try {
    const inFile = await openSegy(inSource, { strict });
    const total = parts[0].report.shard.totalGathers;
    let traces = 0;
    const opened: { path: string; file: SegyFile; close: () => Promise<void> }[] = [];
    try {
      for (const p of parts) {
        const src = await openFileByteSource(p.path);
        opened.push({ path: p.path, file: await openSegy(src, { strict }), close: () => src.close() });
      }
      for (const { path, file } of opened) {
        if (file.nSamples !== inFile.nSamples || file.formatCode !== inFile.formatCode || file.sampleIntervalUs !== inFile.sampleIntervalUs)
          throw bad(path, 'this part does not match the input file.', `${file.nSamples} samples, format ${file.formatCode}, ${file.sampleIntervalUs} µs`, `${inFile.nSamples} samples, format ${inFile.formatCode}, ${inFile.sampleIntervalUs} µs`);
      }
      await writeFilledSegy(outPath, inPath, inFile, { method: parts[0].report.method }, async (sink) => {
        for (const { file } of opened) {
          for (let first = 0; first < file.traceCount; first += CHUNK_TRACES) {
            throwIfCancelled(ctx.cancel);
            const n = Math.min(CHUNK_TRACES, file.traceCount - first);
            const g = await readTraces(file, 0, Int32Array.from({ length: n }, (_, i) => first + i), { cancel: ctx.cancel });
            const filled = Uint8Array.from(g.headers, (h) => (h.fields.DIPWEAVE_FILLED_FLAG === 1 ? 1 : 0));
            await sink.writeGather({ gather: g, geometry: passThroughGeometry(n), gridData: g.data, filled });
            traces += n;
          }
        }
      }, ctx.cancel);
    } finally {
      for (const o of opened) await o.close();
    }
    const gathers = parts.flatMap((p) => p.report.gathers);
    if (gathers.length !== total)
      ctx.stderr(`dipweave stitch: warning: the reports list ${gathers.length} gathers, the shard runs counted ${total}.\n`);
    const report = {
      ...parts[0].report,
      input: inPath,
      output: outPath,
      shard: { index: 1, count: 1, firstGather: 0, endGather: total, totalGathers: total },
      stitchedFrom: parts.map((p) => p.path),
      seconds: parts.reduce((s, p) => s + (Number(p.report.seconds) || 0), 0),
      summary: summarise(gathers),
      gathers,
    };
    await writeFileAtomically(reportPath, [inPath, outPath, ...partPaths], async (s) => {
      await s.write(new TextEncoder().encode(JSON.stringify(report, null, 2) + '\n'));
    }, ctx.cancel);
    ctx.stderr(`dipweave stitch: joined ${parts.length} shard(s), ${traces} traces, into ${outPath} and ${reportPath}.\n`);
    return 0;
  } finally {
    await inSource.close();
  }
}

export const stitchCommand: CliCommand = { spec: stitchSpec, run };
