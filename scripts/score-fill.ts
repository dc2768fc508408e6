// Developer tool: score a filled SEG-Y file against a truth file (synthetic tests, the demo).
// For every trace flagged as filled, finds the truth trace of the same record at the same group X and
// reports SNR (dB) on those traces only, per gather. Usage: tsx scripts/score-fill.ts FILLED.sgy TRUTH.sgy
import { openFileByteSource } from '../app/host/file-source';
import { openSegy, indexGathers, readGather, parseGatherKey } from '../core/segy/index';

const [filledPath, truthPath] = process.argv.slice(2);
const filled = await openSegy(await openFileByteSource(filledPath));
const truth = await openSegy(await openFileByteSource(truthPath));
const key = parseGatherKey('record');
const fi = await indexGathers(filled, key);
const ti = await indexGathers(truth, key);
for (let g = 0; g < fi.gathers.length; g++) {
  const fg = await readGather(filled, fi, g);
  const tIdx = ti.gathers.findIndex((e) => e.keyValue === fg.keyValue);
  const tg = await readGather(truth, ti, tIdx);
  let sig = 0, err = 0, n = 0;
  for (let i = 0; i < fg.nTraces; i++) {
    if (fg.headers[i].fields.DIPWEAVE_FILLED_FLAG !== 1) continue;
    const gx = fg.headers[i].receiverX;
    const j = tg.headers.findIndex((th) => Math.abs(th.receiverX - gx) < 0.01);
    if (j < 0) continue;
    n++;
    for (let t = 0; t < fg.nSamples; t++) {
      const d = tg.data[j * tg.nSamples + t];
      const e = d - fg.data[i * fg.nSamples + t];
      sig += d * d; err += e * e;
    }
  }
  console.log(`gather ${fg.keyValue}: ${n} filled traces scored, SNR ${(10 * Math.log10(sig / err)).toFixed(2)} dB`);
}
