// SEG-Y read benchmark (`npm run bench`): index and read every gather of a generated file of ~250 MB and
// ~1 GB (4-byte IEEE big-endian, 1000 samples, 500 traces per gather) in a temporary folder, each size in
// a fresh child process so its peak RSS is its own. Prints a markdown table. The files are deleted afterwards.
// Timings are with the file in the page cache (it was just written): they measure Dipweave, not the disk.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, openSync, closeSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openFileByteSource } from '../../app/host/file-source';
import { indexGathers, parseGatherKey, readGather } from '../../core/segy/gathers';
import { openSegy } from '../../core/segy/open';

const N_SAMPLES = 1000;
const TRACES_PER_GATHER = 500;
const TRACE_BYTES = 240 + 4 * N_SAMPLES;

/** Sample s of trace t: cheap, deterministic, exact in Float32. */
const sampleValue = (t: number, s: number) => ((t * 7 + s * 13) % 1021) - 510;

function generate(path: string, nTraces: number): void {
  const fd = openSync(path, 'w');
  const head = new Uint8Array(3600);
  const hv = new DataView(head.buffer);
  head.fill(0x40, 0, 3200); // EBCDIC spaces
  hv.setInt16(3216, 2000);
  hv.setUint16(3220, N_SAMPLES);
  hv.setInt16(3224, 5);
  head[3500] = 1;
  hv.setInt16(3502, 1);
  writeSync(fd, head);
  const batch = 1000;
  const buf = new Uint8Array(batch * TRACE_BYTES);
  const v = new DataView(buf.buffer);
  for (let first = 0; first < nTraces; first += batch) {
    const n = Math.min(batch, nTraces - first);
    for (let k = 0; k < n; k++) {
      const t = first + k, at = k * TRACE_BYTES;
      v.setInt32(at, t + 1); v.setInt32(at + 4, t + 1);
      v.setInt32(at + 8, 1000 + Math.floor(t / TRACES_PER_GATHER)); // field record
      v.setInt32(at + 12, (t % TRACES_PER_GATHER) + 1);
      v.setInt16(at + 28, 1);
      v.setInt16(at + 70, -100);
      v.setInt32(at + 80, 2500 * (t % TRACES_PER_GATHER)); // receivers 25 m apart
      v.setUint16(at + 114, N_SAMPLES); v.setInt16(at + 116, 2000);
      for (let s = 0; s < N_SAMPLES; s++) v.setFloat32(at + 240 + 4 * s, sampleValue(t, s));
    }
    writeSync(fd, buf, 0, n * TRACE_BYTES);
  }
  closeSync(fd);
}

async function measure(path: string): Promise<void> {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const src = await openFileByteSource(path);
  const file = await openSegy(src);
  const index = await indexGathers(file, parseGatherKey('record'));
  const t1 = performance.now();
  let check = 0, traces = 0;
  for (let i = 0; i < index.gathers.length; i++) {
    const g = await readGather(file, index, i);
    // Read the result so the work cannot be skipped; verify it against the generator.
    for (let k = 0; k < g.nTraces; k++) check += g.data[k * N_SAMPLES + 7] - sampleValue(g.traceIndices[k], 7);
    traces += g.nTraces;
  }
  const t2 = performance.now();
  const cpu = process.cpuUsage(c0);
  await src.close();
  if (check !== 0 || traces !== file.traceCount) throw new Error(`benchmark read wrong values (check ${check}, traces ${traces})`);
  const r = { sizeBytes: file.sizeBytes, traces, gathers: index.gathers.length, indexS: (t1 - t0) / 1000, readS: (t2 - t1) / 1000, cpuS: (cpu.user + cpu.system) / 1e6, maxRssKb: process.resourceUsage().maxRSS };
  process.stdout.write(JSON.stringify(r) + '\n');
}

async function main(): Promise<void> {
  if (process.env.DIPWEAVE_BENCH_CHILD) return measure(process.env.DIPWEAVE_BENCH_CHILD);
  const dir = mkdtempSync(join(tmpdir(), 'dipweave-bench-'));
  const rows: string[] = [];
  try {
    for (const nTraces of [62_500, 250_000]) {
      const path = join(dir, `bench-${nTraces}.sgy`);
      generate(path, nTraces);
      const child = spawnSync(process.execPath, ['--import', 'tsx', new URL(import.meta.url).pathname], {
        env: { ...process.env, DIPWEAVE_BENCH_CHILD: path }, encoding: 'utf8',
      });
      rmSync(path, { force: true });
      if (child.status !== 0) throw new Error(`child failed: ${child.stderr}`);
      const r = JSON.parse(child.stdout.trim().split('\n').pop()!);
      const mb = r.sizeBytes / 1e6;
      rows.push(`| ${mb.toFixed(0)} | ${r.traces} | ${r.gathers} | ${r.indexS.toFixed(2)} | ${r.readS.toFixed(2)} | ${(mb / (r.indexS + r.readS)).toFixed(0)} | ${(mb / r.readS).toFixed(0)} | ${r.cpuS.toFixed(2)} | ${(mb / r.cpuS).toFixed(0)} | ${(r.maxRssKb / 1024).toFixed(0)} |`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  process.stdout.write([
    '4-byte IEEE big-endian, 1000 samples/trace, 500 traces/gather, key = field record; one thread; file in page cache.',
    'Wall-clock figures suffer when other processes share the cores; CPU seconds (user + system of this process) do not.',
    '',
    '| file MB | traces | gathers | index s | read all gathers s | MB/s wall (index + read) | MB/s wall (read only) | CPU s | MB/s per CPU s | peak RSS MB |',
    '|---|---|---|---|---|---|---|---|---|---|',
    ...rows,
    '',
  ].join('\n'));
}

await main();
