import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliContext } from '../../app/cli/context';
import { runCli } from '../../app/cli/runner';
import { indexGathers, memoryByteSource, openSegy, parseGatherKey, readGather } from '../../core/segy';
import { snrDb } from '../../core/quality/snr';
import { hyperbolaSlopeField } from '../../core/synth/events';
import { makeRecipe } from '../../core/recipe/recipe';
import { buildFillFixture, fixtureEvents, gatherTruth, N_SAMPLES, type FixtureGather } from './fill-fixture';

const dir = mkdtempSync(join(tmpdir(), 'dipweave-fill-recipe-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]) {
  let err = '';
  const ctx: CliContext = { cwd: dir, stdout: () => undefined, stderr: (t) => { err += t; }, cancel: { cancelled: false }, cores: 2 };
  return { code: await runCli(args, ctx), err };
}

const G1: FixtureGather = { record: 1, nPositions: 32, absent: [12, 13, 14, 15, 16, 17] };
const G2: FixtureGather = { record: 2, nPositions: 32, absent: [7] };
writeFileSync(join(dir, 'in.sgy'), buildFillFixture([G1, G2]));
// The dip file: one trace per grid position of each gather, the exact slope of the events (samples per trace).
const exactSlopes = (g: FixtureGather) =>
  Float32Array.from(hyperbolaSlopeField(new Float64Array(g.nPositions * N_SAMPLES), Array.from({ length: g.nPositions }, (_, x) => x), N_SAMPLES, fixtureEvents(g)));
writeFileSync(join(dir, 'dips.sgy'), buildFillFixture([{ ...G1, absent: [] }, { ...G2, absent: [] }], exactSlopes));

async function gatherOf(path: string, i: number) {
  const file = await openSegy(memoryByteSource(path, new Uint8Array(readFileSync(path))));
  return readGather(file, await indexGathers(file, parseGatherKey('record')), i);
}

describe('dipweave fill with a dip file and a recipe', () => {
  it('uses the slopes of a dip file instead of estimating them', async () => {
    const r = await run(['fill', 'in.sgy', '--out', 'with-dips.sgy', '--dips', 'dips.sgy', '--jobs', '1']);
    expect(r.code).toBe(0);
    const g = await gatherOf(join(dir, 'with-dips.sgy'), 0);
    // Exact slopes on a 6-trace gap: methods.md §3.3 reports 54–64 dB for 4–8-trace gaps in hyperbolas.
    expect(snrDb(gatherTruth(G1), g.data, G1.absent!, N_SAMPLES)).toBeGreaterThan(40);
    const report = JSON.parse(readFileSync(join(dir, 'with-dips.report.json'), 'utf8'));
    expect(report.settings.dips).toBe(join(dir, 'dips.sgy'));
    expect(report.gathers[0].details.slopeChoice).toBe('given');
  });

  it('refuses a dip file that does not match the gathers (input.bad-dips)', async () => {
    writeFileSync(join(dir, 'short-dips.sgy'), buildFillFixture([{ ...G1, absent: [], nPositions: 20 }], (g) => new Float32Array(g.nPositions * N_SAMPLES)));
    const r = await run(['fill', 'in.sgy', '--out', 'bad-dips.sgy', '--dips', 'short-dips.sgy', '--jobs', '1']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/\[input\.bad-dips\]/);
  });

  it('reads settings and bad traces from a recipe; command-line options override it', async () => {
    writeFileSync(join(dir, 'recipe.json'), JSON.stringify(makeRecipe({ fill: { lsq: { order: 1 } }, gathers: { '2': { badTraces: [3] } } })));
    const r = await run(['fill', 'in.sgy', '--out', 'with-recipe.sgy', '--recipe', 'recipe.json', '--order', '2', '--jobs', '1']);
    expect(r.code).toBe(0);
    const report = JSON.parse(readFileSync(join(dir, 'with-recipe.report.json'), 'utf8'));
    expect(report.settings.lsq.order).toBe(2);
    expect(report.gathers[1].missingCount).toBe(2);
    expect(report.gathers[1].runs).toEqual([{ firstTrace: 3, count: 1, reason: 'bad' }, { firstTrace: 7, count: 1, reason: 'missing' }]);
    const g = await gatherOf(join(dir, 'with-recipe.sgy'), 1);
    expect(g.headers.map((h, i) => (h.fields.DIPWEAVE_FILLED_FLAG === 1 ? i : -1)).filter((i) => i >= 0)).toEqual([3, 7]);
  });
});
