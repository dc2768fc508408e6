import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliContext } from '../../app/cli/context';
import { runCli } from '../../app/cli/runner';
import { parseShard, shardRange } from '../../app/cli/commands/fill';
import { buildFillFixture } from './fill-fixture';

const dir = mkdtempSync(join(tmpdir(), 'dipweave-stitch-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]) {
  let err = '';
  const ctx: CliContext = { cwd: dir, stdout: () => undefined, stderr: (t) => { err += t; }, cancel: { cancelled: false }, cores: 1 };
  return { code: await runCli(args, ctx), err };
}

// Three small gathers with different holes, so each shard has work.
writeFileSync(join(dir, 'three.sgy'), buildFillFixture([
  { record: 1, nPositions: 24, absent: [10, 11, 12] },
  { record: 2, nPositions: 24, absent: [5] },
  { record: 3, nPositions: 24, dead: [17] },
]));

describe('shards and dipweave stitch', () => {
  it('splits gathers into contiguous, nearly equal shards covering each gather once', () => {
    expect(parseShard('2/8')).toEqual({ index: 2, count: 8 });
    for (const bad of ['0/2', '3/2', '1/0', 'x', '1-2']) expect(() => parseShard(bad)).toThrow(/--shard/);
    for (const [n, count] of [[200, 8], [3, 2], [5, 7]]) {
      const seen: number[] = [];
      for (let i = 1; i <= count; i++) {
        const [a, b] = shardRange(n, i, count);
        for (let g = a; g < b; g++) seen.push(g);
      }
      expect(seen).toEqual(Array.from({ length: n }, (_, g) => g));
    }
  });

  it('shard runs stitched together give the same bytes as one run, whatever the order of the parts', async () => {
    for (const i of [1, 2]) expect((await run(['fill', 'three.sgy', '--out', `part${i}.sgy`, '--shard', `${i}/2`, '--jobs', '1'])).code).toBe(0);
    const s = await run(['stitch', 'three.sgy', 'part2.sgy', 'part1.sgy', '--out', 'joined.sgy']);
    expect(s.err).toMatch(/joined 2 shard/);
    expect(s.code).toBe(0);
    expect((await run(['fill', 'three.sgy', '--out', 'whole.sgy', '--jobs', '2'])).code).toBe(0);
    expect(readFileSync(join(dir, 'joined.sgy')).equals(readFileSync(join(dir, 'whole.sgy')))).toBe(true);
    const joined = JSON.parse(readFileSync(join(dir, 'joined.report.json'), 'utf8'));
    const whole = JSON.parse(readFileSync(join(dir, 'whole.report.json'), 'utf8'));
    expect(joined.gathers.map((g: { keyValue: number }) => g.keyValue)).toEqual([1, 2, 3]);
    expect(joined.gathers.map((g: { holdoutSnrDb: number }) => g.holdoutSnrDb)).toEqual(whole.gathers.map((g: { holdoutSnrDb: number }) => g.holdoutSnrDb));
    expect(joined.summary).toEqual(whole.summary);
  });

  it('refuses an incomplete set of shards and an output that is one of the parts', async () => {
    const r = await run(['stitch', 'three.sgy', 'part2.sgy', '--out', 'partial.sgy']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/every shard exactly once.*\[input\.bad-argument\]/);
    const w = await run(['stitch', 'three.sgy', 'part1.sgy', 'part2.sgy', '--out', 'part1.sgy']);
    expect(w.code).toBe(2);
    expect(w.err).toMatch(/\[input\.would-overwrite\]/);
  });
});
