/**
 * The core in a Web Worker: opens SEG-Y files, reads gathers and headers, estimates slopes, fills, computes
 * spectra and writes SEG-Y. One instance keeps the open file (the "io" worker); another runs the long jobs
 * (slopes, fill, spectra), so reading headers under the cursor never waits behind a fill.
 * Messages: workers/protocol.ts. Cancellation: a SharedArrayBuffer flag polled through the CancelToken.
 */
/// <reference lib="webworker" />
import { InputFileError, isInputFileError, type CancelToken } from '../../../core/problems';
import { refineGeometry } from '../../../core/fill/gather-grid';
import { openSegy, type SegyFile } from '../../../core/segy/open';
import { indexGathers, parseGatherKey, readGather, type GatherIndex, type LoadedGather } from '../../../core/segy/gathers';
import { gatherGeometry, type GatherGeometry } from '../../../core/segy/geometry';
import { SegyWriter, type BytePatch } from '../../../core/segy/writer';
import { planFill, countToFill } from '../../../core/fill/plan';
import { fillGather } from '../../../core/fill/pipeline';
import { solveGapsNet } from '../../../core/nn/solver';
import { estimateSlopes } from '../../../core/slope/estimate';
import { validateDipEdits } from '../../../core/slope/edits';
import { TRACE_HEADER, TRACE_HEADER_BYTES, FILLED_FLAG_VALUE } from '../../../core/segy/fields';
import { readTraceFields } from '../../../core/segy/trace-header';
import { blobByteSource, remoteByteSource } from '../io/blob-source';
import type { Api, ApiName, BytesReply, ErrorPayload, FromWorker, GatherPayload, OpenedFile, ToWorker } from './protocol';
import { JOBS, coreFillSettings, coreSlopeOptions, estimatorFor } from './jobs';

declare const self: DedicatedWorkerGlobalScope;

interface Session {
  file: SegyFile;
  index: GatherIndex;
  key: string;
  spacingM: number | null;
  factor: number;
  /** Last gather read, with its raw headers (the writer copies them unchanged). */
  last: { gather: number; loaded: LoadedGather; geometry: GatherGeometry; payload: GatherPayload } | null;
}

let session: Session | null = null;
let nextBytesId = 1;
const waitingBytes = new Map<number, { resolve: (b: Uint8Array) => void; reject: (e: Error) => void }>();

function post(msg: FromWorker, transfer: Transferable[] = []): void {
  self.postMessage(msg, transfer);
}

function askPage(fileId: string, offsetBytes: number, lengthBytes: number): Promise<Uint8Array> {
  const id = nextBytesId++;
  return new Promise((resolve, reject) => {
    waitingBytes.set(id, { resolve, reject });
    post({ id, type: 'need-bytes', fileId, offsetBytes, lengthBytes });
  });
}

function summary(s: Session): OpenedFile {
  const f = s.file;
  return {
    name: f.name, sizeBytes: f.sizeBytes, traceCount: f.traceCount, nSamples: f.nSamples, sampleIntervalUs: f.sampleIntervalUs,
    formatCode: f.formatCode, textHeader: f.textCards.join('\n'), warnings: [...f.warnings], key: s.key,
    keyLabel: `${s.index.key.label} (bytes ${s.index.key.byte}–${s.index.key.byte + s.index.key.sizeBytes - 1})`,
    gathers: s.index.gathers.map((g, index) => ({ index, keyValue: g.keyValue, traceCount: g.traceIndices.length })),
  };
}

/** Grid layout of one gather: absent positions as zero traces (core/segy/geometry.ts). */
async function readGridGather(s: Session, gather: number, cancel: CancelToken): Promise<GatherPayload> {
  if (s.last?.gather === gather) return { ...s.last.payload, data: s.last.payload.data.slice() };
  const loaded = await readGather(s.file, s.index, gather, { cancel });
  const geo = refineGeometry(gatherGeometry(loaded.headers, loaded.data, loaded.nSamples, s.spacingM ? { spacingM: s.spacingM } : {}), s.factor);
  const nGrid = geo.gridCount;
  const ns = loaded.nSamples;
  const data = new Float32Array(nGrid * ns);
  const present = new Uint8Array(nGrid);
  const dead = new Uint8Array(nGrid);
  const filledFlag = new Uint8Array(nGrid);
  const positionM = new Float64Array(nGrid);
  const offsetM = new Float64Array(nGrid).fill(Number.NaN);
  const fileTrace = new Int32Array(nGrid).fill(-1);
  for (let k = 0; k < nGrid; k++) {
    positionM[k] = Number.isFinite(geo.spacingM) ? geo.originM + k * geo.spacingM : Number.NaN;
    const t = geo.traceOfGrid[k];
    if (t < 0) continue;
    present[k] = 1;
    data.set(loaded.data.subarray(t * ns, (t + 1) * ns), k * ns);
    offsetM[k] = loaded.headers[t].offsetM;
    fileTrace[k] = loaded.traceIndices[t];
    if (loaded.headers[t].fields.DIPWEAVE_FILLED_FLAG === FILLED_FLAG_VALUE) filledFlag[k] = 1;
  }
  for (const k of geo.deadGrid) dead[k] = 1;
  const titles = { receiver: 'receiver position along the line (m)', source: 'source position along the line (m)', offset: 'offset (m)', 'trace-order': Number.isFinite(geo.spacingM) ? 'position (m, file order × spacing)' : 'trace number (no geometry in headers)' };
  const payload: GatherPayload = {
    index: gather, keyValue: loaded.keyValue, nTraces: nGrid, nSamples: ns, dtSeconds: s.file.sampleIntervalUs / 1e6,
    data, present, dead, filledFlag, positionM,
    offsetM, fileTrace, spacingM: Number.isFinite(geo.spacingM) ? geo.spacingM : null, factor: s.factor, positionTitle: titles[geo.positionSource], warnings: [...geo.warnings],
  };
  s.last = { gather, loaded, geometry: geo, payload };
  return { ...payload, data: data.slice() };
}

/** Joins encoded pieces into one Blob after applying the writer's final patches (header note, counts). */
function assemble(parts: Uint8Array[], patches: readonly BytePatch[]): Blob {
  for (const p of patches) {
    let base = 0;
    for (const part of parts) {
      const end = base + part.length;
      for (let i = 0; i < p.bytes.length; i++) {
        const at = p.offsetBytes + i;
        if (at >= base && at < end) part[at - base] = p.bytes[i];
      }
      base = end;
    }
  }
  return new Blob(parts as Uint8Array<ArrayBuffer>[], { type: 'application/octet-stream' });
}

async function gatherForWriting(s: Session, gather: number, cancel: CancelToken): Promise<{ loaded: LoadedGather; geometry: GatherGeometry; payload: GatherPayload }> {
  await readGridGather(s, gather, cancel);
  return s.last!;
}

type Handler<K extends ApiName> = (payload: Api[K]['req'], cancel: CancelToken, progress: (p: Api[K]['progress']) => void) => Promise<{ result: Api[K]['res']; transfer?: Transferable[] }>;

const IO: { [K in ApiName]?: Handler<K> } = {
  async open(p, cancel) {
    const source = p.source.kind === 'blob'
      ? blobByteSource(p.name, p.source.blob)
      : (() => { const ref = p.source; return remoteByteSource(p.name, ref.sizeBytes, (o, l) => askPage(ref.fileId, o, l)); })();
    const file = await openSegy(source);
    const key = p.key ?? 'shot';
    const index = await indexGathers(file, parseGatherKey(key), { cancel });
    session = { file, index, key, spacingM: null, factor: 1, last: null };
    return { result: summary(session) };
  },
  async regroup(p, cancel) {
    const s = need();
    const index = await indexGathers(s.file, parseGatherKey(p.key), { cancel });
    if (!Number.isInteger(p.factor) || p.factor < 1 || p.factor > 64)
      throw new InputFileError({ code: 'input.bad-argument', severity: 'error', message: 'the decimation factor must be a whole number from 1 to 64.', found: p.factor });
    session = { ...s, index, key: p.key, spacingM: p.spacingM, factor: p.factor, last: null };
    return { result: summary(session) };
  },
  async read(p, cancel) {
    const g = await readGridGather(need(), p.gather, cancel);
    return { result: g, transfer: [g.data.buffer] };
  },
  async writeGather(p, cancel) {
    const s = need();
    const { loaded, geometry } = await gatherForWriting(s, p.gather, cancel);
    const writer = new SegyWriter(s.file, { method: p.method });
    const head = writer.headerBytes();
    const body = writer.encodeGather({ gather: loaded, geometry, gridData: p.data, filled: p.filled });
    const { patches, summary: sum } = writer.finish();
    return { result: { blob: assemble([head, body], patches), tracesWritten: sum.tracesWritten, filledTraces: sum.filledTraces } };
  },
  async writeSlopes(p, cancel) {
    const s = need();
    const { loaded, geometry } = await gatherForWriting(s, p.gather, cancel);
    // Every grid position carries a slope trace; all are flagged as estimates (they are).
    const writer = new SegyWriter(s.file, { method: p.method, formatCode: 5 });
    const head = writer.headerBytes();
    const body = writer.encodeGather({ gather: loaded, geometry, gridData: p.slopeTraces, filled: new Uint8Array(geometry.gridCount).fill(1) });
    const { patches } = writer.finish();
    return { result: { blob: assemble([head, body], patches) } };
  },
  async fillAll(p, cancel, progress) {
    const s = need();
    const writer = new SegyWriter(s.file, { method: p.method });
    const parts: Uint8Array[] = [writer.headerBytes()];
    const report: { keyValue: number; toFill: number; holdoutSnrDb: number | null; seconds: number }[] = [];
    let filledTraces = 0;
    for (let i = 0; i < s.index.gathers.length; i++) {
      progress({ gather: i, of: s.index.gathers.length, keyValue: s.index.gathers[i].keyValue });
      const { loaded, geometry, payload } = await gatherForWriting(s, i, cancel);
      const work = p.work[String(payload.keyValue)];
      const plan = planFill({ nTraces: payload.nTraces, present: payload.present, dead: payload.dead, bad: (work?.bad ?? []).filter((b) => payload.present[b]), ...(s.factor > 1 ? { factor: s.factor } : {}) });
      const unknown = new Uint8Array(payload.nTraces);
      for (const r of plan.runs) unknown.fill(1, r.firstTrace, r.firstTrace + r.count);
      let gridData: Float32Array;
      let snr: number | null = null;
      let seconds = 0;
      if (p.current && p.current.gather === i) {
        gridData = p.current.data;
      } else if (countToFill(plan) === 0) {
        gridData = payload.data;
      } else {
        const edits = work?.edits?.length ? validateDipEdits(work.edits) : [];
        const live = Uint8Array.from(unknown, (u) => (u ? 0 : 1));
        const slopePairs = edits.length
          ? estimateSlopes(payload.data, payload.nTraces, payload.nSamples, live, { ...coreSlopeOptions(p.slope), edits }, cancel).slopePairs
          : undefined;
        const r = await fillGather({ data: payload.data, nTraces: payload.nTraces, nSamples: payload.nSamples, plan, slopePairs },
          coreFillSettings(p.settings), { cancel, estimator: estimatorFor(p.slope), solvers: { net: (input, st) => solveGapsNet(input, st) } });
        gridData = r.filled;
        snr = Number.isNaN(r.holdoutSnrDb) ? null : r.holdoutSnrDb;
        seconds = r.seconds;
      }
      const filled = p.current && p.current.gather === i ? p.current.filled : unknown;
      parts.push(writer.encodeGather({ gather: loaded, geometry, gridData, filled }));
      filledTraces += filled.reduce((a, b) => a + b, 0);
      report.push({ keyValue: payload.keyValue, toFill: countToFill(plan), holdoutSnrDb: snr, seconds });
    }
    const { patches } = writer.finish();
    return { result: { blob: assemble(parts, patches), gathers: s.index.gathers.length, filledTraces, report } };
  },
  async header(p) {
    const s = need();
    const bytes = await s.file.source.read(s.file.firstTraceOffsetBytes + p.fileTrace * s.file.traceBytes, TRACE_HEADER_BYTES);
    const fields = readTraceFields(bytes, 0, s.file.byteOrder === 'little');
    const out = (Object.keys(TRACE_HEADER) as (keyof typeof TRACE_HEADER)[]).map((name) => ({ name, byte: TRACE_HEADER[name].byte, value: fields[name] }));
    return { result: out };
  },
};

function need(): Session {
  if (!session) throw new Error('no file is open in the worker');
  return session;
}

function errorPayload(e: unknown): ErrorPayload {
  if (e instanceof Error && e.name === 'CancelledError') return { kind: 'cancelled', message: 'cancelled' };
  if (isInputFileError(e)) return { kind: 'input', message: e.message, problem: e.problem };
  return { kind: 'bug', message: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
}

self.onmessage = async (ev: MessageEvent<ToWorker>) => {
  const msg = ev.data;
  if (msg.type === 'bytes') {
    const w = waitingBytes.get((msg as BytesReply).id);
    if (!w) return;
    waitingBytes.delete(msg.id);
    if (msg.bytes) w.resolve(msg.bytes);
    else w.reject(new Error(msg.error ?? 'read failed'));
    return;
  }
  const flag = msg.cancelFlag;
  const cancel: CancelToken = { get cancelled() { return flag !== null && Atomics.load(flag, 0) === 1; } };
  const handler = (IO[msg.type] ?? JOBS[msg.type]) as Handler<ApiName> | undefined;
  try {
    if (!handler) throw new Error(`unknown request "${msg.type}"`);
    const out = await handler(msg.payload as never, cancel, (progress) => post({ id: msg.id, type: 'progress', progress }));
    post({ id: msg.id, type: 'ok', result: out.result }, out.transfer ?? []);
  } catch (e) {
    post({ id: msg.id, type: 'error', error: errorPayload(e) });
  }
};
