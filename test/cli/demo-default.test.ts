// When the user names no file, the CLI opens the bundled demo line, as the app does at first start (issue 2, item 7).
import { mkdtempSync, rmSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliContext } from '../../app/cli/context';
import { runCli } from '../../app/cli/runner';
import { findDemoFile } from '../../app/host/demo-files';

const cwd = mkdtempSync(join(tmpdir(), 'dipweave-demo-'));
afterAll(() => rmSync(cwd, { recursive: true, force: true }));

async function run(args: string[]) {
  let out = '';
  let err = '';
  const ctx: CliContext = { cwd, stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, cancel: { cancelled: false }, cores: 1 };
  const code = await runCli(args, ctx);
  return { code, out, err };
}

describe('the demo line is the default input', () => {
  it('is found from the source tree', () => {
    expect(findDemoFile()).toMatch(/samples\/grv07-gap\.sgy$/);
  });

  it('inspect with no file reads the demo and says so on stderr', async () => {
    const r = await run(['inspect', '--json']);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/no file named; using the demo line grv07-gap\.sgy/);
    const j = JSON.parse(r.out);
    // The demo generator (core/synth/demo-scenario.ts) makes 5 shots of 144 channels with 16 absent per shot.
    expect(j.gathers).toHaveLength(5);
    expect(j.gathers.every((g: { gridCount: number; missing: number[] }) => g.gridCount === 144 && g.missing.length === 16)).toBe(true);
  });

  it('a named input still needs --out, and nothing is written', async () => {
    const r = await run(['fill', findDemoFile()]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/needs --out.*\[input\.bad-argument\]/);
    expect(existsSync(join(cwd, 'grv07-gap.filled.sgy'))).toBe(false);
  });

  it('an unknown demo name is a coded error, not a crash', () => {
    expect(() => findDemoFile('no-such-demo.sgy')).toThrow(/\[input\.file-not-found\]/);
  });
});
