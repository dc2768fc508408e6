import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliContext } from '../../app/cli/context';
import { runCli } from '../../app/cli/runner';
import { indexGathers, memoryByteSource, openSegy, parseGatherKey, readGather } from '../../core/segy';
import { snrDb } from '../../core/quality/snr';
import { buildFillFixture, gatherTruth, N_SAMPLES, type FixtureGather } from './fill-fixture';

const dir = mkdtempSync(join(tmpdir(), 'dipweave-fill-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[], cancel = { cancelled: false }) {
  let out = '';
  let err = '';
  const ctx: CliContext = { cwd: dir, stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, cancel, cores: 2 };
  const code = await runCli(args, ctx);
  return { code, out, err };
}

async function readAll(path: string) {
  const bytes = new Uint8Array(readFileSync(path));
  const file = await openSegy(memoryByteSource(path, bytes));
  const index = await indexGathers(file, parseGatherKey('record'));
  const gathers = [];
  for (let i = 0; i < index.gathers.length; i++) gathers.push(await readGather(file, index, i));
  return { bytes, file, gathers };
}

// Two gathers with different holes: an 8-trace gap in one; an absent trace and a dead-flagged trace in the other.
const G1: FixtureGather = { record: 1, nPositions: 40, absent: [15, 16, 17, 18, 19, 20, 21, 22] };
const G2: FixtureGather = { record: 2, nPositions: 40, absent: [7], dead: [30] };
writeFileSync(join(dir, 'two.sgy'), buildFillFixture([G1, G2]));
writeFileSync(join(dir, 'full.sgy'), buildFillFixture([{ record: 3, nPositions: 24 }]));

describe('dipweave fill', () => {
  it('fills a two-gather file gather by gather: absent and dead traces, originals unchanged, new traces flagged, report', async () => {
    const r = await run(['fill', 'two.sgy', '--out', 'two-filled.sgy', '--jobs', '2']);
    expect(r.err).toMatch(/\[2\/2\] gather 2: filled 2 trace\(s\), hold-out/);
    expect(r.code).toBe(0);
    const input = await readAll(join(dir, 'two.sgy'));
    const output = await readAll(join(dir, 'two-filled.sgy'));
    expect(output.gathers.map((g) => g.nTraces)).toEqual([40, 40]);
    for (const [gi, spec] of [[0, G1], [1, G2]] as const) {
      const og = output.gathers[gi];
      const ig = input.gathers[gi];
      const flagged = og.headers.map((h, i) => (h.fields.DIPWEAVE_FILLED_FLAG === 1 ? i : -1)).filter((i) => i >= 0);
      const expectFilled = [...(spec.absent ?? []), ...(spec.dead ?? [])].sort((a, b) => a - b);
      expect(flagged).toEqual(expectFilled);
      // Recorded traces: header bytes 9–240 and sample bytes identical (bytes 1–8 are renumbered).
      let k = 0;
      for (let pos = 0; pos < spec.nPositions; pos++) {
        if (spec.absent?.includes(pos)) continue;
        if (!spec.dead?.includes(pos)) {
          expect(og.rawHeaders.subarray(pos * 240 + 8, pos * 240 + 240)).toEqual(ig.rawHeaders.subarray(k * 240 + 8, k * 240 + 240));
          expect(og.rawSamples.subarray(pos * 4 * N_SAMPLES, (pos + 1) * 4 * N_SAMPLES)).toEqual(ig.rawSamples.subarray(k * 4 * N_SAMPLES, (k + 1) * 4 * N_SAMPLES));
        }
        k++;
      }
      expect(og.headers.every((h) => h.traceIdCode === 1)).toBe(true);
      // Filled traces are good estimates of the analytic truth (estimated slopes).
      expect(snrDb(gatherTruth(spec), og.data, expectFilled, N_SAMPLES)).toBeGreaterThan(15);
    }
    const report = JSON.parse(readFileSync(join(dir, 'two-filled.report.json'), 'utf8'));
    expect(report.caution).toMatch(/estimates/);
    expect(report.gathers).toHaveLength(2);
    expect(report.gathers[0]).toMatchObject({ keyValue: 1, missingCount: 8, solver: 'lsq', holdoutKind: 'block' });
    expect(report.gathers[1]).toMatchObject({ keyValue: 2, missingCount: 2, solver: 'lsq' });
    for (const g of report.gathers) {
      expect(typeof g.holdoutSnrDb).toBe('number');
      expect(g.iterations).toBeLessThanOrEqual(g.details.iterationsChosenByHoldout);
      expect(g.seconds).toBeGreaterThan(0);
      expect(g.gapRmsRatio).toBeGreaterThan(0.5);
      expect(g.gapRmsRatio).toBeLessThan(1.5);
    }
    expect(new TextDecoder().decode(output.bytes.subarray(0, 3200))).not.toBe(''); // textual note written by the writer (tested there)
  });

  it('writes the same bytes whatever the number of jobs', async () => {
    // two-filled.sgy was written with 2 jobs by the first test.
    expect((await run(['fill', 'two.sgy', '--out', 'one-job.sgy', '--jobs', '1'])).code).toBe(0);
    expect(readFileSync(join(dir, 'one-job.sgy')).equals(readFileSync(join(dir, 'two-filled.sgy')))).toBe(true);
  });

  it('passes a gather with nothing missing through with samples unchanged', async () => {
    const r = await run(['fill', 'full.sgy', '--out', 'full-out.sgy', '--jobs', '1']);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/nothing to fill/);
    const a = await readAll(join(dir, 'full.sgy'));
    const b = await readAll(join(dir, 'full-out.sgy'));
    expect(b.gathers[0].rawSamples).toEqual(a.gathers[0].rawSamples);
    expect(b.gathers[0].headers.some((h) => h.fields.DIPWEAVE_FILLED_FLAG === 1)).toBe(false);
  });

  it('refuses bad input with exit code 2 and a coded message', async () => {
    writeFileSync(join(dir, 'junk.sgy'), new Uint8Array(1000));
    writeFileSync(join(dir, 'broken-recipe.json'), '{"format":"dipweave-recipe","version":1,"fill":{"solver":"magic"}}');
    const cases: [string[], RegExp][] = [
      [['fill', 'junk.sgy', '--out', 'x.sgy'], /\[segy\.file-too-small\]/],
      [['fill', 'two.sgy'], /\[input\.bad-argument\]/],
      [['fill', 'two.sgy', '--out', 'x.sgy', '--shard', '3/2'], /\[input\.bad-argument\]/],
      [['fill', 'two.sgy', '--out', 'two.sgy'], /\[input\.would-overwrite\]/],
      [['fill', 'two.sgy', '--out', 'x.sgy', '--recipe', 'broken-recipe.json'], /\[input\.bad-recipe\]/],
      [['fill', 'missing.sgy', '--out', 'x.sgy'], /\[input\.file-not-found\]/],
    ];
    for (const [args, code] of cases) {
      const r = await run(args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err).toMatch(code);
    }
    expect(existsSync(join(dir, 'x.sgy'))).toBe(false);
  });

  it('leaves no output file behind when cancelled', async () => {
    const cancel = { cancelled: false };
    setTimeout(() => { cancel.cancelled = true; }, 150);
    const r = await run(['fill', 'two.sgy', '--out', 'cancelled.sgy', '--jobs', '1', '--second-pass'], cancel);
    expect(r.code).toBe(130);
    expect(readdirSync(dir).filter((f) => f.startsWith('cancelled') || f.includes('.partial'))).toEqual([]);
  });
});
