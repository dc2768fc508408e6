import { mkdtempSync, readFileSync, rmSync, existsSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliContext } from '../../app/cli/context';
import { runCli } from '../../app/cli/runner';
import { memoryByteSource } from '../../core/segy/byte-source';
import { gatherGeometry, indexGathers, openSegy, parseGatherKey, readGather } from '../../core/segy';
import { gatherOnGrid } from '../../core/fill/gather-grid';
import { estimateSlopes } from '../../core/slope/estimate';

const ROOT = new URL('../../', import.meta.url).pathname;
const FIXTURES = join(ROOT, 'test/fixtures/segy');
const dir = mkdtempSync(join(tmpdir(), 'dipweave-dips-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[], cancelled = false) {
  let out = '', err = '';
  const ctx: CliContext = { cwd: dir, stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, cancel: { cancelled }, cores: 1 };
  const code = await runCli(args, ctx);
  return { code, out, err };
}

async function readSegy(path: string, key = 'record') {
  const bytes = new Uint8Array(readFileSync(path));
  const file = await openSegy(memoryByteSource(path, bytes));
  const index = await indexGathers(file, parseGatherKey(key));
  const gathers = [];
  for (let i = 0; i < index.gathers.length; i++) gathers.push(await readGather(file, index, i));
  return { file, gathers, bytes };
}

describe('dipweave dips', () => {
  it('writes slopes and confidence beside a two-gather file: same traces, headers and sample count, unit in the text header', async () => {
    const input = join(FIXTURES, 'two-gathers.sgy');
    const r = await run(['dips', input, '--out', 'd.sgy', '--confidence', 'c.sgy', '--units', 'ms-per-trace']);
    expect(r.code, r.err).toBe(0);
    const a = await readSegy(input), d = await readSegy(join(dir, 'd.sgy')), c = await readSegy(join(dir, 'c.sgy'));
    expect(d.file.traceCount).toBe(a.file.traceCount);
    expect(d.file.nSamples).toBe(a.file.nSamples);
    expect(d.file.formatCode).toBe(5);
    expect(d.file.textCards.join('\n')).toMatch(/SLOPE IN MS\/TRACE/);
    expect(c.file.textCards.join('\n')).toMatch(/CONFIDENCE 0 \(NONE\) TO 1 \(FULL\)/);
    for (let gi = 0; gi < a.gathers.length; gi++) {
      const ga = a.gathers[gi], gd = d.gathers[gi];
      expect(gd.keyValue).toBe(ga.keyValue);
      expect(gd.nTraces).toBe(ga.nTraces);
      for (let t = 0; t < ga.nTraces; t++) {
        // trace headers kept except the sample count field (same value) and bytes 1–8 untouched
        expect(gd.headers[t].fields.RECEIVER_X).toBe(ga.headers[t].fields.RECEIVER_X);
        expect(gd.headers[t].fields.OFFSET).toBe(ga.headers[t].fields.OFFSET);
      }
      for (const v of c.gathers[gi].data) expect(v >= 0 && v <= 1).toBe(true);
      for (const v of gd.data) expect(Number.isFinite(v)).toBe(true);
    }
    expect(r.out).toContain('confidence');
  });

  it('--on-grid writes one trace per grid position and flags positions without a recording', async () => {
    const input = join(FIXTURES, 'two-gathers.sgy');
    const r = await run(['dips', input, '--out', 'g.sgy', '--on-grid']);
    expect(r.code, r.err).toBe(0);
    const d = await readSegy(join(dir, 'g.sgy'));
    // two-gathers.sgy: gather 201 has 13 traces on a 16-position grid, 202 has 9 on 16 (see test/cli/inspect.test.ts)
    expect(d.gathers.map((g) => g.nTraces)).toEqual([16, 16]);
    const flagged = d.gathers[0].headers.filter((h) => h.fields.DIPWEAVE_FILLED_FLAG === 1).length;
    expect(flagged).toBe(3);
  });

  it('values are the core estimate at the input trace positions, converted to ms per trace (2 ms sampling)', async () => {
    const input = join(FIXTURES, 'two-gathers.sgy');
    expect((await run(['dips', input, '--out', 'v.sgy', '--units', 'ms-per-trace'])).code).toBe(0);
    const a = await readSegy(input), d = await readSegy(join(dir, 'v.sgy'));
    const g = a.gathers[0];
    const geo = gatherGeometry(g.headers, g.data, g.nSamples);
    const live = new Uint8Array(geo.gridCount);
    for (let k = 0; k < geo.gridCount; k++) live[k] = geo.traceOfGrid[k] >= 0 ? 1 : 0;
    for (const k of geo.deadGrid) live[k] = 0;
    const f = estimateSlopes(gatherOnGrid(g.data, geo, g.nSamples), geo.gridCount, g.nSamples, live);
    const dtMs = a.file.sampleIntervalUs / 1000;
    for (let t = 0; t < g.nTraces; t++) {
      const k = geo.gridIndexOfTrace[t];
      for (let s = 0; s < g.nSamples; s += 7) expect(d.gathers[0].data[t * g.nSamples + s]).toBeCloseTo(Math.fround(f.slopeTraces[k * g.nSamples + s] * dtMs), 4);
    }
  });

  it('an --on-grid dip file is accepted by dipweave fill --dips', async () => {
    const input = join(FIXTURES, 'two-gathers.sgy');
    expect((await run(['dips', input, '--out', 'grid.sgy', '--on-grid'])).code).toBe(0);
    const r = await run(['fill', input, '--out', 'filled.sgy', '--dips', 'grid.sgy', '--jobs', '1']);
    expect(r.code, r.err).toBe(0);
  });

  it('refuses to write over its input, needs --out, and needs a spacing for s/km', async () => {
    copyFileSync(join(FIXTURES, 'trace-order.sgy'), join(dir, 'in.sgy'));
    expect((await run(['dips', 'in.sgy', '--out', 'in.sgy'])).err).toContain('[input.would-overwrite]');
    expect((await run(['dips', 'in.sgy'])).code).toBe(2);
    const r = await run(['dips', 'in.sgy', '--out', 'k.sgy', '--key', '9:4', '--units', 's-per-km']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('[geometry.no-spacing]');
    expect(existsSync(join(dir, 'k.sgy'))).toBe(false);
    const ok = await run(['dips', 'in.sgy', '--out', 'k.sgy', '--key', '9:4', '--units', 's-per-km', '--spacing', '2.5']);
    expect(ok.code, ok.err).toBe(0);
  });

  it('bad input files give exit 2 with their code; cancel gives 130 and no file', async () => {
    for (const [f, code] of [['truncated.sgy', 'segy.truncated'], ['nowhere.sgy', 'input.file-not-found']]) {
      const r = await run(['dips', join(FIXTURES, f), '--out', 'x.sgy']);
      expect(r.code).toBe(2);
      expect(r.err).toContain(`[${code}]`);
    }
    expect((await run(['dips', join(FIXTURES, 'good.sgy'), '--out', 'x.sgy', '--radius-t', '0'])).err).toContain('[input.bad-argument]');
    const c = await run(['dips', join(FIXTURES, 'two-gathers.sgy'), '--out', 'z.sgy'], true);
    expect(c.code).toBe(130);
    expect(existsSync(join(dir, 'z.sgy'))).toBe(false);
  });
});
