import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliContext } from '../../app/cli/context';
import { runCli } from '../../app/cli/runner';
import { buildFillFixture } from './fill-fixture';

const dir = mkdtempSync(join(tmpdir(), 'dipweave-fill-net-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('dipweave fill --solver net', () => {
  it('passes the network options through and reports the network solver with its hold-out score', async () => {
    writeFileSync(join(dir, 'in.sgy'), buildFillFixture([{ record: 1, nPositions: 20, absent: [9, 10] }]));
    let err = '';
    const ctx: CliContext = { cwd: dir, stdout: () => undefined, stderr: (t) => { err += t; }, cancel: { cancelled: false }, cores: 1 };
    const code = await runCli(['fill', 'in.sgy', '--out', 'out.sgy', '--solver', 'net', '--steps', '20', '--width', '8', '--depth', '1', '--seed', '5', '--lambda', 'auto', '--time-budget', '30'], ctx);
    expect(err).toMatch(/gather 1: filled 2 trace/);
    expect(code).toBe(0);
    const report = JSON.parse(readFileSync(join(dir, 'out.report.json'), 'utf8'));
    expect(report.settings.solver).toBe('net');
    expect(report.settings.net).toEqual({ steps: 20, width: 8, depth: 1, seed: 5, lambda: 'auto', timeBudgetSeconds: 30 });
    expect(report.gathers[0]).toMatchObject({ solver: 'net', missingCount: 2 });
    expect(typeof report.gathers[0].holdoutSnrDb).toBe('number');
    expect(report.gathers[0].details).toMatchObject({ solver: 'net', width: 8, depth: 1, seed: 5 });
  });

  it('refuses out-of-range network options with exit code 2', async () => {
    let err = '';
    const ctx: CliContext = { cwd: dir, stdout: () => undefined, stderr: (t) => { err += t; }, cancel: { cancelled: false }, cores: 1 };
    expect(await runCli(['fill', 'in.sgy', '--out', 'bad.sgy', '--solver', 'net', '--lambda', '-3'], ctx)).toBe(2);
    expect(await runCli(['fill', 'in.sgy', '--out', 'bad.sgy', '--solver', 'net', '--width', '9999'], ctx)).toBe(2);
    expect(err).toMatch(/\[input\.bad-argument\][^]*\[input\.bad-argument\]/);
    expect(err).not.toMatch(/gather 1/); // refused before any gather was read
  });
});
