/**
 * The typed message protocol between the page and the core worker (workers/core.worker.ts): a union of
 * messages told apart by `type`, each request numbered by `id`. Only plain data and typed arrays cross.
 */
import type { FileProblem } from '../../../core/problems';
import type { FillPlan } from '../../../core/fill/plan';
import type { FillProgress } from '../../../core/fill/pipeline';

/** Where the worker reads a file: a Blob it can slice itself, or a desktop file it asks the page for. */
export type SourceRef = { kind: 'blob'; blob: Blob } | { kind: 'remote'; fileId: string; sizeBytes: number };

/**
 * How traces are grouped into gathers: a name understood by core/segy/gathers.ts parseGatherKey
 * ('shot', 'cmp', 'receiver', 'source-point', …) or a byte position "BYTE[:2|:4]".
 */
export type GatherKeyName = string;

/** The keys offered in the gather-key menu (our labels). */
export const GATHER_KEY_CHOICES: readonly { key: GatherKeyName; label: string }[] = [
  { key: 'shot', label: 'shot (field record, bytes 9–12)' },
  { key: 'cmp', label: 'CMP (ensemble, bytes 21–24)' },
  { key: 'receiver', label: 'receiver (group X, bytes 81–84)' },
  { key: 'source-point', label: 'source point (bytes 17–20)' },
];

export interface GatherSummary {
  readonly index: number;
  readonly keyValue: number;
  readonly traceCount: number;
}

export interface OpenedFile {
  readonly name: string;
  readonly sizeBytes: number;
  readonly traceCount: number;
  readonly nSamples: number;
  readonly sampleIntervalUs: number;
  readonly formatCode: number;
  readonly textHeader: string;
  readonly warnings: FileProblem[];
  readonly key: GatherKeyName;
  /** The key's label and 1-based byte position, for display. */
  readonly keyLabel: string;
  readonly gathers: GatherSummary[];
}

/** One gather laid out on its regular grid of positions (absent positions as zero traces). */
export interface GatherPayload {
  readonly index: number;
  readonly keyValue: number;
  readonly nTraces: number;
  readonly nSamples: number;
  readonly dtSeconds: number;
  /** Trace-major samples (core/grid/gather.ts). */
  readonly data: Float32Array;
  /** 1 where a recorded trace sits at the position. */
  readonly present: Uint8Array;
  /** 1 where the recorded trace is flagged dead or all zero. */
  readonly dead: Uint8Array;
  /** 1 where the recorded trace was flagged as filled by Dipweave (a re-opened output file). */
  readonly filledFlag: Uint8Array;
  /** Position along the gather axis, m, per grid position. */
  readonly positionM: Float64Array;
  /** Source–receiver offset, m, per grid position (NaN where unknown). */
  readonly offsetM: Float64Array;
  /** File trace index per position, −1 where absent. */
  readonly fileTrace: Int32Array;
  readonly spacingM: number | null;
  /** Refinement factor applied to the header grid (1 = none). */
  readonly factor: number;
  readonly positionTitle: string;
  readonly warnings: FileProblem[];
}

export interface HeaderField {
  readonly name: string;
  /** 1-based byte position in the 240-byte trace header (SEG-Y rev 1). */
  readonly byte: number;
  readonly value: number;
}

export type SlopeMethod = 'pwd' | 'tensor';

export interface SlopeOptions {
  method: SlopeMethod;
  radiusTimeSamples: number;
  radiusTraces: number;
  /** Plane-wave destruction filter order: 1 = 3-point, 2 = 5-point. */
  order: 1 | 2;
}

export interface SlopeResult {
  /** The estimate before edits, pair grid (nTraces−1)·nSamples, samples per trace. */
  readonly slopePairs: Float64Array;
  /** Trace grid nTraces·nSamples, samples per trace. */
  readonly slopeTraces: Float64Array;
  /** Trace grid, 0..1. */
  readonly confidence: Float64Array;
  readonly seconds: number;
  /** Method, radii and what was done, in words for the panel. */
  readonly description: string;
  /** Mean confidence inside each run of positions to fill, for the "guessed here" warning. */
  readonly gaps: { firstTrace: number; lastTrace: number; meanConfidence: number }[];
}

export type SolverName = 'lsq' | 'net';

export interface FillSettings {
  solver: SolverName;
  /** Least squares: iteration cap and relative-residual tolerance. */
  maxIterations: number;
  tolerance: number;
  /** Network: training steps and seed. */
  steps: number;
  seed: number;
  /** Run the hold-out check (hide live traces like the missing ones and score their fill). */
  holdout: boolean;
  /** Re-estimate slopes on the filled gather and fill again; kept only if the hold-out score improves. */
  secondPass: boolean;
}

export interface FillResult {
  readonly data: Float32Array;
  readonly holdoutSnrDb: number | null;
  readonly holdoutDescription: string;
  readonly holdoutTraces: number[];
  readonly converged: boolean;
  readonly secondPass: 'off' | 'kept' | 'rejected';
  /** The slopes the fill used (pair grid). */
  readonly slopePairs: Float64Array;
  /** RMS inside the widest gap over RMS of its live neighbours (amplitude kept ≈ 1). */
  readonly gapRmsRatio: number | null;
  readonly iterations: number;
  readonly seconds: number;
  readonly solver: SolverName;
  readonly details: Record<string, number | string>;
}

export interface SpectraResult {
  readonly frequencyHz: Float64Array;
  readonly beforeDb: Float64Array;
  readonly afterDb: Float64Array | null;
  readonly fkBefore: { amplitude: Float64Array; nK: number; nF: number; wavenumber: Float64Array; frequencyHz: Float64Array; unit: string };
  readonly fkAfter: { amplitude: Float64Array; nK: number; nF: number; wavenumber: Float64Array; frequencyHz: Float64Array; unit: string } | null;
}

export interface ExportGather {
  readonly gather: number;
  readonly data: Float32Array;
  /** 1 where the trace at the grid position is a fill result. */
  readonly filled: Uint8Array;
}

/** Request/response/progress types per message type. */
export interface Api {
  open: { req: { source: SourceRef; name: string; key?: GatherKeyName }; res: OpenedFile; progress: never };
  /** New key, grid spacing override, or refinement factor (k−1 new positions between recorded ones, as the CLI's --factor). */
  regroup: { req: { key: GatherKeyName; spacingM: number | null; factor: number }; res: OpenedFile; progress: never };
  read: { req: { gather: number }; res: GatherPayload; progress: never };
  header: { req: { fileTrace: number }; res: HeaderField[]; progress: never };
  slopes: {
    req: { data: Float32Array; nTraces: number; nSamples: number; dtSeconds: number; unknown: Uint8Array; factor: number; options: SlopeOptions };
    res: SlopeResult; progress: never;
  };
  fill: {
    req: { data: Float32Array; nTraces: number; nSamples: number; plan: FillPlan; slopePairs: Float64Array | null; settings: FillSettings; slopeOptions: SlopeOptions };
    res: FillResult; progress: FillProgress;
  };
  /** Slopes + fill of every gather of the open file with the same settings, written as one SEG-Y. */
  fillAll: {
    req: {
      slope: SlopeOptions; settings: FillSettings; method: string;
      /** Work per gather key value: dip edits (core form) and traces marked bad. */
      work: Record<string, { edits: unknown[]; bad: number[] }>;
      /** The gather on screen, already filled: written as shown instead of filling it again. */
      current: ExportGather | null;
    };
    res: { blob: Blob; gathers: number; filledTraces: number; report: { keyValue: number; toFill: number; holdoutSnrDb: number | null; seconds: number }[] };
    progress: { gather: number; of: number; keyValue: number };
  };
  spectra: {
    req: { before: Float32Array; after: Float32Array | null; nTraces: number; nSamples: number; dtSeconds: number; spacingM: number | null; liveTraces: number[]; filledTraces: number[] };
    res: SpectraResult; progress: never;
  };
  /**
   * A reference gather (a synthetic test's truth, e.g. samples/grv07-full.sgy) aligned to the grid on screen:
   * the gather with the same key value, shifted so that its traces match the recorded traces on screen.
   */
  reference: {
    req: { blob: Blob; name: string; key: GatherKeyName; keyValue: number; data: Float32Array; present: Uint8Array; nTraces: number; nSamples: number };
    res: { data: Float32Array; shift: number; mismatch: number; referenceTraces: number };
    progress: never;
  };
  writeGather: { req: ExportGather & { method: string }; res: { blob: Blob; tracesWritten: number; filledTraces: number }; progress: never };
  writeSlopes: { req: { gather: number; slopeTraces: Float32Array; unitLabel: string; method: string }; res: { blob: Blob }; progress: never };
}

export type ApiName = keyof Api;

export type ToWorker = { [K in ApiName]: { id: number; type: K; payload: Api[K]['req']; cancelFlag: Int32Array | null } }[ApiName] | BytesReply;

export interface ErrorPayload {
  kind: 'input' | 'bug' | 'cancelled';
  message: string;
  problem?: FileProblem;
}

/** The worker asks the page for bytes of a desktop file (window.dipweave.readRange exists only on the page). */
export interface NeedBytes {
  id: number;
  type: 'need-bytes';
  fileId: string;
  offsetBytes: number;
  lengthBytes: number;
}

export type BytesReply = { type: 'bytes'; id: number; bytes: Uint8Array | null; error: string | null };

export type FromWorker =
  | NeedBytes
  | { id: number; type: 'ok'; result: unknown }
  | { id: number; type: 'progress'; progress: unknown }
  | { id: number; type: 'error'; error: ErrorPayload };
