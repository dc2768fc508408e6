/**
 * `dipweave fill IN.sgy --out OUT.sgy [options]`: fills every gather of a file (or one shard of its gathers)
 * and writes all traces of each gather on its regular grid in position order: recorded traces and headers
 * unchanged, filled traces flagged (core/segy/writer.ts), plus a JSON report with the hold-out score of every
 * gather. Gathers run in parallel on worker_threads (app/host/fill-pool.ts); the output order does not depend on
 * the number of jobs. Nothing is written over the input; Ctrl-C leaves no output file behind.
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { parseCommandArgs, type CommandSpec } from '../args';
import type { CliCommand, CliContext } from '../context';
import { gatherOnGrid, passThroughGeometry, planFromGeometry, refineGeometry } from '../../../core/fill/gather-grid';
import type { FillGatherResult, FillSettings } from '../../../core/fill/pipeline';
import { FILL_DEFAULTS } from '../../../core/fill/pipeline';
import { unknownMask, type FillPlan } from '../../../core/fill/plan';
import type { SolverName } from '../../../core/fill/solver';
import { InputFileError, isInputFileError, throwIfCancelled, type FileProblem } from '../../../core/problems';
import { badTracesForGather, editsForGather, parseRecipe, type Recipe } from '../../../core/recipe/recipe';
import { GATHER_KEY_NAMES, gatherGeometry, indexGathers, openSegy, parseGatherKey, readGather, type GatherGeometry, type GatherIndex, type LoadedGather, type SegyFile } from '../../../core/segy';
import { tracesToPairs } from '../../../core/slope/index';
import { resolveNetOptions, type NetSolverOptions } from '../../../core/nn/solver';
import { writeFileAtomically } from '../../host/atomic-output';
import { FillPool } from '../../host/fill-pool';
import { openFileByteSource, type FileByteSource } from '../../host/file-source';
import { writeFilledSegy } from '../../host/segy-output';
import { resolveInputOrDemo } from '../../host/demo-files';

export const CAUTION =
  'Filled traces are estimates made from the recorded traces and the local slopes, not recordings. Each gather\'s hold-out score (holdoutSnrDb: recorded traces hidden, filled the same way, and compared) is the measure of how far to trust its fill. No safety-critical decision should rest on filled data alone; follow local regulations and licensed practice.';

export const fillSpec: CommandSpec = {
  name: 'fill',
  summary: 'Fill missing, dead and decimated traces of every gather and write a new SEG-Y file with a report.',
  positionals: [{ name: 'IN.sgy', help: 'SEG-Y file to fill (never modified; default: the demo line)', optional: true }],
  options: [
    { name: 'out', kind: 'string', meta: 'OUT.sgy', help: 'output SEG-Y file (required; written through a temporary file)' },
    { name: 'factor', kind: 'integer', meta: 'K', help: 'insert K−1 traces between neighbouring traces (regular decimation by K); default: found from the geometry' },
    { name: 'solver', kind: 'string', choices: ['lsq', 'net'], help: 'lsq: least squares on the plane-wave destructor; net: coordinate network (slower)' },
    { name: 'key', kind: 'string', meta: 'NAME|BYTE', help: `trace header key that groups traces into gathers: ${Object.keys(GATHER_KEY_NAMES).join(', ')}, a field name, or BYTE[:2|:4] (default record)` },
    { name: 'spacing', kind: 'number', meta: 'M', help: 'grid spacing in metres (finer than the trace spacing to fill decimation; needed where headers carry no geometry)' },
    { name: 'dips', kind: 'string', meta: 'DIPS.sgy', help: 'slopes to use instead of estimating them: a SEG-Y file with one trace per grid position of each gather, in samples per trace' },
    { name: 'report', kind: 'string', meta: 'REPORT.json', help: 'write the per-gather report here (default OUT.sgy with .report.json)' },
    { name: 'jobs', kind: 'integer', meta: 'N', help: 'worker threads (default: all cores)' },
    { name: 'recipe', kind: 'string', meta: 'FILE', help: 'settings and dip edits saved by Dipweave; options given here override it' },
    { name: 'shard', kind: 'string', meta: 'I/N', help: 'fill only the I-th of N equal runs of gathers (1-based), e.g. from a cluster job array; merge with `dipweave stitch`' },
    { name: 'order', kind: 'integer', choices: ['1', '2'], meta: '1|2', help: 'destructor order for the least-squares fill (default: the hold-out check chooses 1 or 2)' },
    { name: 'free-amplitude', kind: 'flag', help: 'do not lift filled traces that come out below 80 % of their recorded neighbours\' level (may gain SNR, loses amplitude)' },
    { name: 'second-pass', kind: 'flag', help: 're-estimate slopes on the filled gather and fill again; kept only where the hold-out score improves' },
    { name: 'width', kind: 'integer', meta: 'N', help: 'network: units per hidden layer' },
    { name: 'depth', kind: 'integer', meta: 'N', help: 'network: hidden layers' },
    { name: 'steps', kind: 'integer', meta: 'N', help: 'network: training steps per window' },
    { name: 'lambda', kind: 'string', meta: 'X|auto', help: 'network: weight of the plane-wave term' },
    { name: 'seed', kind: 'integer', meta: 'N', help: 'network: random seed' },
    { name: 'time-budget', kind: 'number', meta: 'S', help: 'network: seconds allowed per training run (the fill and its hold-out check each get it)' },
    { name: 'lenient', kind: 'flag', help: 'read files whose headers contradict each other, with warnings instead of errors' },
  ],
};

function badArg(message: string, found?: string | number, hint?: string): InputFileError {
  return new InputFileError({ code: 'input.bad-argument', severity: 'error', message, found, hint });
}

/** "2/8" → the 1-based shard index and count. */
export function parseShard(text: string): { index: number; count: number } {
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || count < 1 || index < 1 || index > count)
    throw badArg('option --shard needs I/N with 1 ≤ I ≤ N.', text, 'For a job array of N tasks, task I (1-based) passes --shard I/N.');
  return { index, count };
}

/** Gathers [first, end) of shard i of n: contiguous runs of nearly equal size, in file order. */
export function shardRange(nGathers: number, index: number, count: number): [number, number] {
  return [Math.floor(((index - 1) * nGathers) / count), Math.floor((index * nGathers) / count)];
}

export interface GatherReport {
  keyValue: number;
  traces: number;
  gridCount: number;
  spacingM: number | null;
  missingCount: number;
  runs: FillPlan['runs'];
  factor: number;
  solver: SolverName | null;
  iterations: number;
  converged: boolean;
  seconds: number;
  holdoutSnrDb: number | null;
  holdoutKind: string;
  holdoutTraces: number[];
  gapRmsRatio: number | null;
  fillRmsRatio: number | null;
  secondPass: string;
  details: Record<string, number | string | null>;
  warnings: FileProblem[];
  problem?: FileProblem;
}

/** Totals over gather reports (also used when shards are stitched together). */
export function summarise(reports: readonly GatherReport[]) {
  const scores = reports.map((r) => r.holdoutSnrDb).filter((v): v is number => v !== null).sort((a, b) => a - b);
  return {
    gathers: reports.length,
    filledTraces: reports.reduce((s, r) => s + (r.problem ? 0 : r.missingCount), 0),
    gathersNotFilled: reports.filter((r) => r.problem).length,
    worstHoldoutSnrDb: scores.length ? scores[0] : null,
    medianHoldoutSnrDb: scores.length ? scores[Math.floor(scores.length / 2)] : null,
  };
}

/** Where `dipweave fill` writes the report when --report is not given. */
export function defaultReportPath(outPath: string): string {
  return outPath.replace(/\.(sgy|segy)$/i, '') + '.report.json';
}

const finiteOrNull = (v: number): number | null => (Number.isFinite(v) ? v : null);

/** Fill settings: defaults, then the recipe, then command-line options. */
export function settingsFrom(recipe: Recipe | undefined, o: Record<string, string | number | boolean | undefined>): Partial<FillSettings> {
  const r = recipe?.fill ?? {};
  const net: Record<string, unknown> = { ...(r.net ?? {}) };
  for (const [opt, field] of [['width', 'width'], ['depth', 'depth'], ['steps', 'steps'], ['seed', 'seed'], ['time-budget', 'timeBudgetSeconds']] as const)
    if (o[opt] !== undefined) net[field] = o[opt];
  if (o.lambda !== undefined) {
    const l = String(o.lambda);
    const v = l === 'auto' ? 'auto' : Number(l);
    if (v !== 'auto' && !(Number.isFinite(v) && v >= 0)) throw badArg('option --lambda needs a number ≥ 0 or auto.', l);
    net.lambda = v;
  }
  const lsq = { ...FILL_DEFAULTS.lsq, ...(r.lsq ?? {}) };
  let orders = [...FILL_DEFAULTS.orders];
  if (r.lsq?.order !== undefined) orders = [r.lsq.order];
  if (o.order !== undefined) {
    lsq.order = Number(o.order) as 1 | 2;
    orders = [lsq.order];
  }
  return {
    orders,
    solver: (o.solver as SolverName | undefined) ?? r.solver ?? 'lsq',
    lsq,
    net,
    holdout: r.holdout ?? true,
    secondPass: o['second-pass'] === true ? true : (r.secondPass ?? false),
    keepAmplitude: o['free-amplitude'] === true ? false : (r.keepAmplitude ?? true),
    slope: { ...(recipe?.slopes ?? {}) },
  };
}

function methodText(s: Partial<FillSettings>, givenDips: boolean): string {
  const solver = s.solver === 'net'
    ? 'coordinate network trained on the local plane-wave equation'
    : `least squares on the plane-wave destructor (order ${s.lsq?.order ?? 2}, conjugate gradients)`;
  return `Dipweave 0.1.0 fill: ${solver}; slopes ${givenDips ? 'from a given dip file' : 'by plane-wave destruction'}. Hold-out score per gather in the JSON report.`;
}

interface Prepared {
  gather: LoadedGather;
  geometry: GatherGeometry;
  plan: FillPlan | null;
  report: GatherReport;
}

function emptyReport(g: LoadedGather, geo: GatherGeometry | null): GatherReport {
  return {
    keyValue: g.keyValue, traces: g.nTraces, gridCount: geo?.gridCount ?? g.nTraces, spacingM: geo && Number.isFinite(geo.spacingM) ? geo.spacingM : null,
    missingCount: 0, runs: [], factor: 1, solver: null, iterations: 0, converged: true, seconds: 0, holdoutSnrDb: null,
    holdoutKind: 'none', holdoutTraces: [], gapRmsRatio: null, fillRmsRatio: null, secondPass: 'off', details: {}, warnings: [...(geo?.warnings ?? [])],
  };
}

/** Dip file lookup: the slope traces of one gather on its grid, converted to the pair grid. */
class DipSource {
  private constructor(private readonly file: SegyFile, private readonly index: GatherIndex, private readonly src: FileByteSource) {}

  static async open(path: string, keyText: string, lenient: boolean, cancel: CliContext['cancel']): Promise<DipSource> {
    const src = await openFileByteSource(path);
    try {
      const file = await openSegy(src, { strict: !lenient });
      const index = await indexGathers(file, parseGatherKey(keyText), { cancel });
      return new DipSource(file, index, src);
    } catch (e) {
      await src.close();
      throw e;
    }
  }

  async slopesFor(keyValue: number, gridCount: number, nSamples: number): Promise<Float64Array> {
    const i = this.index.gathers.findIndex((g) => g.keyValue === keyValue);
    const problem = (message: string, found: string, expected: string) =>
      new InputFileError({ code: 'input.bad-dips', severity: 'error', file: this.file.name, message, found, expected, hint: 'The dip file must hold one trace per grid position of each gather, with the input\'s samples per trace, in samples per trace.' });
    if (i < 0) throw problem(`the dip file has no gather with key value ${keyValue}.`, `${this.index.gathers.length} gathers`, `a gather keyed ${keyValue}`);
    const g = await readGather(this.file, this.index, i);
    if (g.nSamples !== nSamples || g.nTraces !== gridCount)
      throw problem(`the dip gather ${keyValue} does not match the gather's grid.`, `${g.nTraces} traces × ${g.nSamples} samples`, `${gridCount} traces × ${nSamples} samples`);
    return tracesToPairs(Float64Array.from(g.data), gridCount, nSamples);
  }

  close(): Promise<void> {
    return this.src.close();
  }
}

async function run(argv: readonly string[], ctx: CliContext): Promise<number> {
  const args = parseCommandArgs(fillSpec, argv);
  const o = args.options;
  const input = resolveInputOrDemo(args.positionals[0], ctx.cwd, ctx.stderr, 'fill');
  if ((typeof o.out !== 'string' || o.out === '') && !input.isDemo) throw badArg('`dipweave fill` needs --out OUT.sgy.', undefined, 'The input file is never written over.');
  const inPath = input.path;
  const outPath = resolve(ctx.cwd, typeof o.out === 'string' && o.out !== '' ? o.out : 'grv07-gap.filled.sgy');
  const reportPath = resolve(ctx.cwd, typeof o.report === 'string' ? o.report : defaultReportPath(outPath));
  let recipe: Recipe | undefined;
  if (typeof o.recipe === 'string') {
    const rp = resolve(ctx.cwd, o.recipe);
    let text: string;
    try {
      text = await readFile(rp, 'utf8');
    } catch {
      throw new InputFileError({ code: 'input.file-not-found', severity: 'error', file: rp, message: 'the recipe file cannot be read.', hint: 'Check the path.' });
    }
    recipe = parseRecipe(text, rp);
  }
  const settings = settingsFrom(recipe, o);
  if (settings.solver === 'net') resolveNetOptions(settings.net as NetSolverOptions); // bad values: exit 2 before any work
  const keyText = String(o.key ?? recipe?.gatherKey ?? 'record');
  const key = parseGatherKey(keyText);
  const spacingM = (o.spacing as number | undefined) ?? recipe?.spacingM;
  if (spacingM !== undefined && !(spacingM > 0)) throw badArg('option --spacing needs a positive number of metres.', spacingM);
  const factor = (o.factor as number | undefined) ?? recipe?.factor;
  if (factor !== undefined && !(Number.isInteger(factor) && factor >= 1 && factor <= 64)) throw badArg('option --factor needs a whole number from 1 to 64.', factor);
  const jobs = (o.jobs as number | undefined) ?? ctx.cores;
  if (!(Number.isInteger(jobs) && jobs >= 1 && jobs <= 256)) throw badArg('option --jobs needs a whole number from 1 to 256.', jobs);
  const shard = typeof o.shard === 'string' ? parseShard(o.shard) : { index: 1, count: 1 };
  const lenient = o.lenient === true;
  const started = Date.now();

  const source = await openFileByteSource(inPath);
  let dips: DipSource | undefined;
  let pool: FillPool | undefined;
  try {
    const file = await openSegy(source, { strict: !lenient });
    const index = await indexGathers(file, key, { cancel: ctx.cancel });
    const [first, end] = shardRange(index.gathers.length, shard.index, shard.count);
    if (typeof o.dips === 'string') dips = await DipSource.open(resolve(ctx.cwd, o.dips), keyText, lenient, ctx.cancel);
    const selected = end - first;
    ctx.stderr(`dipweave fill: ${file.name}: ${index.gathers.length} gathers by ${key.label}; filling ${selected} (shard ${shard.index}/${shard.count}: gathers ${first + 1}–${end}) with ${settings.solver} on ${jobs} worker thread(s).\n`);
    pool = new FillPool(Math.max(1, Math.min(jobs, selected || 1)), ctx.cancel);
    const reports: GatherReport[] = [];
    const failures: GatherReport[] = [];

    const prepare = async (i: number): Promise<Prepared> => {
      const gather = await readGather(file, index, i, { cancel: ctx.cancel });
      let geometry: GatherGeometry;
      try {
        geometry = gatherGeometry(gather.headers, gather.data, gather.nSamples, { spacingM });
        if (factor !== undefined && factor > 1) geometry = refineGeometry(geometry, factor);
      } catch (e) {
        if (!isInputFileError(e)) throw e;
        const report = emptyReport(gather, null);
        report.problem = { ...e.problem, file: file.name };
        return { gather, geometry: passThroughGeometry(gather.nTraces), plan: null, report };
      }
      const plan = planFromGeometry(geometry, badTracesForGather(recipe, gather.keyValue), factor);
      return { gather, geometry, plan, report: emptyReport(gather, geometry) };
    };

    const fillOne = async (p: Prepared): Promise<{ p: Prepared; result: FillGatherResult | null }> => {
      if (!p.plan || p.plan.runs.length === 0 || p.geometry.gridCount < 2) return { p, result: null };
      const nS = p.gather.nSamples;
      const slopePairs = dips ? await dips.slopesFor(p.gather.keyValue, p.geometry.gridCount, nS) : undefined;
      const edits = editsForGather(recipe, p.gather.keyValue);
      const s: Partial<FillSettings> = edits.length ? { ...settings, slope: { ...settings.slope, edits } } : settings;
      try {
        let lastLine = Date.now();
        const result = await pool!.run({ data: gatherOnGrid(p.gather.data, p.geometry, nS), nTraces: p.geometry.gridCount, nSamples: nS, plan: p.plan, settings: s, slopePairs }, (stage, fraction) => {
          // Long gathers (the network solver) say where they are every few seconds.
          if (Date.now() - lastLine < 5000) return;
          lastLine = Date.now();
          ctx.stderr(`  … gather ${p.gather.keyValue}: ${stage} ${(100 * fraction).toFixed(0)} %\n`);
        });
        return { p, result };
      } catch (e) {
        if (!isInputFileError(e)) throw e;
        p.report.problem = e.problem;
        return { p, result: null };
      }
    };

    // Read ahead a bounded number of gathers; write strictly in file order.
    const window = Math.max(2, 2 * jobs);
    const inFlight = new Map<number, Promise<{ p: Prepared; result: FillGatherResult | null }>>();
    let nextSubmit = first;
    const submit = () => {
      while (nextSubmit < end && nextSubmit - done < window + first) {
        const i = nextSubmit++;
        const job = prepare(i).then(fillOne);
        job.catch(() => undefined); // observed when its turn comes
        inFlight.set(i, job);
      }
    };
    let done = 0;
    const method = methodText(settings, !!dips);
    await writeFilledSegy(outPath, inPath, file, { method }, async (sink) => {
      for (let i = first; i < end; i++) {
        submit();
        throwIfCancelled(ctx.cancel);
        const { p, result } = await inFlight.get(i)!;
        inFlight.delete(i);
        done++;
        const r = p.report;
        let filledMask: Uint8Array = new Uint8Array(p.geometry.gridCount);
        let gridData: Float32Array = gatherOnGrid(p.gather.data, p.geometry, p.gather.nSamples);
        if (p.plan) {
          r.runs = p.plan.runs;
          r.factor = p.plan.factor;
        }
        if (result && p.plan) {
          filledMask = unknownMask(p.plan);
          gridData = result.filled;
          Object.assign(r, {
            missingCount: result.missingCount, solver: result.solver, iterations: result.iterations, converged: result.converged,
            seconds: result.seconds, holdoutSnrDb: finiteOrNull(result.holdoutSnrDb), holdoutKind: result.holdoutKind,
            holdoutTraces: result.holdoutTraces, gapRmsRatio: finiteOrNull(result.gapRmsRatio), fillRmsRatio: finiteOrNull(result.fillRmsRatio),
            secondPass: result.secondPass,
            details: Object.fromEntries(Object.entries(result.details).map(([k, v]) => [k, typeof v === 'number' && !Number.isFinite(v) ? null : v])),
          });
        }
        await sink.writeGather({ gather: p.gather, geometry: p.geometry, gridData, filled: filledMask });
        reports.push(r);
        if (r.problem) failures.push(r);
        const what = r.problem ? `NOT FILLED: ${r.problem.message} [${r.problem.code}]`
          : r.missingCount === 0 ? 'nothing to fill'
          : `filled ${r.missingCount} trace(s), hold-out ${r.holdoutSnrDb === null ? 'n/a' : `${r.holdoutSnrDb.toFixed(1)} dB`}, ${r.iterations} iterations, ${r.seconds.toFixed(2)} s`;
        ctx.stderr(`[${done}/${selected}] gather ${r.keyValue}: ${what}\n`);
      }
    }, ctx.cancel);

    const report = {
      format: 'dipweave-fill-report',
      version: 1,
      caution: CAUTION,
      input: inPath,
      output: outPath,
      gatherKey: key.label,
      method,
      shard: { index: shard.index, count: shard.count, firstGather: first, endGather: end, totalGathers: index.gathers.length },
      settings: { ...settings, factor: factor ?? null, spacingM: spacingM ?? null, dips: typeof o.dips === 'string' ? resolve(ctx.cwd, o.dips) : null, recipe: typeof o.recipe === 'string' ? resolve(ctx.cwd, o.recipe) : null },
      jobs,
      seconds: (Date.now() - started) / 1000,
      summary: summarise(reports),
      gathers: reports,
    };
    await writeFileAtomically(reportPath, [inPath, outPath], async (sink) => {
      await sink.write(new TextEncoder().encode(JSON.stringify(report, null, 2) + '\n'));
    }, ctx.cancel);
    ctx.stderr(`dipweave fill: wrote ${outPath} and ${reportPath} in ${report.seconds.toFixed(1)} s. ${CAUTION.split('. ')[0]}.\n`);
    if (failures.length) {
      for (const f of failures) ctx.stderr(`dipweave fill: gather ${f.keyValue} was written unfilled: ${f.problem!.message} [${f.problem!.code}]\n`);
      return 2;
    }
    return 0;
  } finally {
    await pool?.close();
    await dips?.close();
    await source.close();
  }
}

export const fillCommand: CliCommand = { spec: fillSpec, run };
