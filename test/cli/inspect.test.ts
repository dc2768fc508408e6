import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import type { CliContext } from '../../app/cli/context';
import { runCli } from '../../app/cli/runner';

const ROOT = new URL('../../', import.meta.url).pathname;
const FIXTURES = 'test/fixtures/segy';

async function run(args: string[]) {
  let out = '';
  let err = '';
  const ctx: CliContext = { cwd: ROOT, stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, cancel: { cancelled: false }, cores: 1 };
  const code = await runCli(args, ctx);
  return { code, out, err };
}

describe('dipweave inspect (in process)', () => {
  it('prints the JSON summary with per-gather geometry', async () => {
    const r = await run(['inspect', `${FIXTURES}/two-gathers.sgy`, '--json']);
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    expect(j).toMatchObject({ traceCount: 22, samplesPerTrace: 40, sampleIntervalUs: 2000, formatCode: 5, byteOrder: 'big', revision: 1, textEncoding: 'ebcdic' });
    expect(j.gathers.map((g: { keyValue: number; traceCount: number; spacingM: number; missing: number[]; dead: number[] }) => [g.keyValue, g.traceCount, g.spacingM, g.missing, g.dead]))
      .toEqual([[201, 13, 25, [5, 6, 7], [11]], [202, 9, 25, [1, 3, 5, 7, 9, 11, 13], [4]]]);
  });

  it('prints a readable table', async () => {
    const r = await run(['inspect', `${FIXTURES}/two-gathers.sgy`]);
    expect(r.code).toBe(0);
    expect(r.out).toContain('22 traces × 40 samples at 2000 µs');
    expect(r.out).toMatch(/201 +13 +16 +25 +receiver +missing 5-7; dead 11/);
  });

  it('takes a key by byte position and a spacing for files without geometry', async () => {
    const r = await run(['inspect', `${FIXTURES}/trace-order.sgy`, '--key', '9:4', '--spacing', '2.5', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.key).toEqual({ label: 'byte 9:4', byte: 9, sizeBytes: 4 });
    expect(j.gathers[0]).toMatchObject({ traceCount: 10, gridCount: 10, spacingM: 2.5, positionSource: 'trace-order' });
    const noSpacing = JSON.parse((await run(['inspect', `${FIXTURES}/trace-order.sgy`, '--json'])).out);
    expect(noSpacing.gathers[0].spacingM).toBeNull();
    expect(noSpacing.gathers[0].warnings[0].code).toBe('geometry.no-spacing');
  });

  it.each([
    [['inspect', `${FIXTURES}/truncated.sgy`], 'segy.truncated'],
    [['inspect', `${FIXTURES}/zero-traces.sgy`], 'segy.zero-traces'],
    [['inspect', `${FIXTURES}/contradictory-interval.sgy`], 'segy.header-contradiction'],
    [['inspect', `${FIXTURES}/nowhere.sgy`], 'input.file-not-found'],
    [['inspect', `${FIXTURES}/good.sgy`, '--key', 'nonsense'], 'segy.bad-key'],
    [['inspect', `${FIXTURES}/good.sgy`, '--spacing', '-3'], 'input.bad-argument'],
    [['inspect', '--no-such-option'], 'input.bad-argument'],
  ])('exit 2 with the coded message on stderr: %s', async (args, problem) => {
    const r = await run(args);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toContain(`[${problem}]`);
  });

  it('reads in a forced byte order, and says so when that order makes the header absurd', async () => {
    const r = await run(['inspect', `${FIXTURES}/good-le-guess.sgy`, '--byte-order', 'little', '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out)).toMatchObject({ byteOrder: 'little', byteOrderSource: 'option', traceCount: 12 });
    const bad = await run(['inspect', `${FIXTURES}/good.sgy`, '--byte-order', 'little']);
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('[segy.format-code]');
  });

  it('reads contradictory headers with --lenient', async () => {
    const r = await run(['inspect', `${FIXTURES}/contradictory-interval.sgy`, '--lenient', '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).warnings[0].code).toBe('segy.header-contradiction');
  });
});

describe('dipweave inspect (real bin)', () => {
  it('runs through bin/dipweave.mjs after the node build', () => {
    const build = spawnSync(process.execPath, ['scripts/build-node.mjs'], { cwd: ROOT, encoding: 'utf8' });
    expect(build.status, build.stderr).toBe(0);
    const ok = spawnSync(process.execPath, ['bin/dipweave.mjs', 'inspect', `${FIXTURES}/good-le.sgy`, '--json'], { cwd: ROOT, encoding: 'utf8' });
    expect(ok.status, ok.stderr).toBe(0);
    expect(JSON.parse(ok.stdout)).toMatchObject({ traceCount: 12, byteOrder: 'little', revision: 2, formatCode: 5 });
    const bad = spawnSync(process.execPath, ['bin/dipweave.mjs', 'inspect', `${FIXTURES}/unknown-format.sgy`], { cwd: ROOT, encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain('[segy.format-code]');
  });
});
