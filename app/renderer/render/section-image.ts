/**
 * Builds the variable-density picture of a whole gather, with the dip layer blended in, as packed RGBA
 * pixels in the gather's own trace-major layout: the image is nSamples wide and nTraces high, pixel
 * (sample, trace) at trace * nSamples + sample (core/grid/gather.ts), so every read and write runs along
 * memory. The view draws it with the axes swapped (time down, positions across).
 * Pure arithmetic, no DOM: the view copies the pixels into an ImageData once and then only blits it while
 * zooming and panning.
 */
import { lutIndex, packRgba, type Lut } from './colormap';
import { TraceStatus } from './trace-status';

export interface DipLayer {
  /** Slope per trace position and sample (trace-major), in the unit of `maxAbs`. */
  readonly field: Float32Array;
  /** 0..1 per trace position and sample; null = full confidence everywhere. */
  readonly confidence: Float32Array | null;
  /** |slope| that maps to full colour. */
  readonly maxAbs: number;
  /** 0..1, the layer's strength where confidence is 1. */
  readonly opacity: number;
  readonly lut: Lut;
}

export interface ImageInput {
  readonly nTraces: number;
  readonly nSamples: number;
  /** Gained samples, about [-1, 1] at the clip (render/gain.ts). */
  readonly shown: Float32Array;
  readonly status: Uint8Array;
  /** Null for wiggle-only display: the background is plain paper. */
  readonly lut: Lut | null;
  readonly dip: DipLayer | null;
}

const PAPER = packRgba(252, 251, 247, 255);
const MISSING = packRgba(246, 226, 196, 255);
const DEAD = packRgba(70, 72, 80, 255);

/** Fills `out` (length nTraces·nSamples). @returns out */
export function buildSectionPixels(out: Uint32Array, input: ImageInput): Uint32Array {
  const { nTraces, nSamples, shown, status, lut, dip } = input;
  const packed = lut?.packed;
  const dipPacked = dip?.lut.packed;
  const dipInv = dip && dip.maxAbs > 0 ? 1 / dip.maxAbs : 0;
  const conf = dip?.confidence ?? null;
  const field = dip?.field ?? null;
  const opacity256 = dip ? Math.round(dip.opacity * 256) : 0;
  for (let x = 0; x < nTraces; x++) {
    const st = status[x];
    const base = x * nSamples;
    if (st === TraceStatus.missing) {
      // Flat pale ground; the view hatches it in screen space (render/draw-section.ts), so the hatch keeps
      // its spacing at every zoom.
      out.fill(MISSING, base, base + nSamples);
      continue;
    }
    if (st === TraceStatus.dead) {
      out.fill(DEAD, base, base + nSamples);
      continue;
    }
    for (let t = 0; t < nSamples; t++) {
      const i = base + t;
      let c = packed ? packed[lutIndex(shown[i])] : PAPER;
      if (dipPacked && field) {
        const w = conf ? (opacity256 * conf[i]) | 0 : opacity256;
        if (w > 0) c = blend256(c, dipPacked[lutIndex(field[i] * dipInv)], w);
      }
      out[i] = c;
    }
  }
  return out;
}

/** Integer blend of two packed opaque colours, weight w/256 of the second (w in 0..256). */
export function blend256(a: number, b: number, w: number): number {
  const v = 256 - w;
  const r = ((a & 255) * v + (b & 255) * w) >> 8;
  const g = (((a >>> 8) & 255) * v + ((b >>> 8) & 255) * w) >> 8;
  const bl = (((a >>> 16) & 255) * v + ((b >>> 16) & 255) * w) >> 8;
  return (0xff000000 | (bl << 16) | (g << 8) | r) >>> 0;
}

/** Linear blend of two packed colours, weight w of the second. */
export function blend(a: number, b: number, w: number): number {
  const v = 1 - w;
  const r = (a & 255) * v + (b & 255) * w;
  const g = ((a >>> 8) & 255) * v + ((b >>> 8) & 255) * w;
  const bl = ((a >>> 16) & 255) * v + ((b >>> 16) & 255) * w;
  return packRgba(r | 0, g | 0, bl | 0, 255);
}
