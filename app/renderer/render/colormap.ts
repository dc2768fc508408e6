/**
 * Colour scales for the section and the dip layer, as 256-entry RGBA lookup tables (Uint32, little-endian
 * ABGR as ImageData's Uint32 view expects on every platform we ship to).
 * Our own choices: a grey scale (positive = dark, the usual paper-plot reading: common practice, no source),
 * a diverging "loam" scale (teal for negative, warm paper white at zero, rust for positive), and a dip scale
 * (indigo for negative slopes, pale at zero, ochre for positive).
 */
export type AmplitudeScaleName = 'grey' | 'loam';

export interface Lut {
  /** 256 packed colours; index 0 = most negative, 255 = most positive. */
  readonly packed: Uint32Array;
  /** The same colours as CSS strings for legends and colour bars. */
  readonly css: readonly string[];
}

type Rgb = readonly [number, number, number];

function interpolateStops(stops: readonly Rgb[]): Lut {
  const packed = new Uint32Array(256);
  const css: string[] = [];
  for (let i = 0; i < 256; i++) {
    const u = (i / 255) * (stops.length - 1);
    const k = Math.min(stops.length - 2, Math.floor(u));
    const f = u - k;
    const a = stops[k];
    const b = stops[k + 1];
    const r = Math.round(a[0] + (b[0] - a[0]) * f);
    const g = Math.round(a[1] + (b[1] - a[1]) * f);
    const bl = Math.round(a[2] + (b[2] - a[2]) * f);
    packed[i] = packRgba(r, g, bl, 255);
    css.push(`rgb(${r},${g},${bl})`);
  }
  return { packed, css };
}

/** Packs for a little-endian Uint32 view over RGBA bytes. */
export function packRgba(r: number, g: number, b: number, a: number): number {
  return ((a << 24) | (b << 16) | (g << 8) | r) >>> 0;
}

const GREY: Rgb[] = [[250, 250, 247], [20, 20, 24]];
const LOAM: Rgb[] = [[12, 84, 96], [96, 170, 170], [247, 243, 232], [214, 128, 72], [122, 38, 18]];
const DIP: Rgb[] = [[58, 42, 140], [140, 130, 205], [238, 236, 226], [222, 178, 74], [150, 96, 6]];

export const AMPLITUDE_LUTS: Record<AmplitudeScaleName, Lut> = {
  grey: interpolateStops(GREY),
  loam: interpolateStops(LOAM),
};

export const DIP_LUT: Lut = interpolateStops(DIP);

/** Maps a value in [-1, 1] (clamped) to a LUT index 0..255. */
export function lutIndex(v: number): number {
  if (!(v > -1)) return v === v ? 0 : 128; // NaN shows as zero amplitude
  if (v >= 1) return 255;
  return ((v + 1) * 127.5) | 0;
}
