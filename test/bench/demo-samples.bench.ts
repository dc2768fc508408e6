// Time to synthesize the demo line and to encode its three SEG-Y files (what `npm run samples` does), and
// the file sizes. Prints a markdown table. Run by `npm run bench` (scripts/bench.mjs).
import { DEMO_SCENARIO } from '../../core/synth/demo-scenario';
import { synthesizeMarineLine } from '../../core/synth/marine-shot';
import { DEMO_FILES, encodeDemoSegy } from '../../core/synth/demo-segy';

const runs = 5;
const synth: number[] = [];
const encode: number[] = [];
let bytes = 0;
let check = 0;
for (let r = 0; r < runs; r++) {
  const t0 = performance.now();
  const line = synthesizeMarineLine(DEMO_SCENARIO);
  const t1 = performance.now();
  bytes = 0;
  for (const spec of DEMO_FILES) {
    const b = encodeDemoSegy(line, DEMO_SCENARIO, spec);
    bytes += b.length;
    check += b[b.length - 1];
  }
  const t2 = performance.now();
  synth.push(t1 - t0);
  encode.push(t2 - t1);
  if (!Number.isFinite(line.data[line.data.length - 1])) throw new Error('non-finite sample');
}
const median = (a: number[]) => a.slice().sort((x, y) => x - y)[a.length >> 1];
const sc = DEMO_SCENARIO;
console.log(`| step | size | median of ${runs} runs | min |`);
console.log('|---|---|---|---|');
console.log(`| synthesize the line | ${sc.nShots} shots × ${sc.nChannels} channels × ${sc.nSamples} samples | ${median(synth).toFixed(0)} ms | ${Math.min(...synth).toFixed(0)} ms |`);
console.log(`| encode the 3 SEG-Y files (IBM float) | ${(bytes / 1e6).toFixed(2)} MB in all | ${median(encode).toFixed(0)} ms | ${Math.min(...encode).toFixed(0)} ms |`);
console.log(`\n(checksum ${check}; Node ${process.version})`);
