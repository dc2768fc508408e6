import { describe, expect, it } from 'vitest';
import { buildSectionPixels, blend256 } from '../../../../../app/renderer/render/section-image';
import { AMPLITUDE_LUTS, DIP_LUT, lutIndex, packRgba } from '../../../../../app/renderer/render/colormap';
import { TraceStatus } from '../../../../../app/renderer/render/trace-status';

describe('section picture', () => {
  const nTraces = 3, nSamples = 4;
  const shown = Float32Array.from([-1, 0, 0.5, 2, /* trace 1 */ 9, 9, 9, 9, /* trace 2 */ 0.25, -0.25, 1, -2]);

  it('is trace-major (pixel of trace x, sample t at x·nSamples + t) and maps amplitude through the LUT, clamped', () => {
    const out = buildSectionPixels(new Uint32Array(nTraces * nSamples), {
      nTraces, nSamples, shown, status: Uint8Array.from([TraceStatus.live, TraceStatus.missing, TraceStatus.live]), lut: AMPLITUDE_LUTS.grey, dip: null,
    });
    const lut = AMPLITUDE_LUTS.grey.packed;
    expect(out[0]).toBe(lut[0]);
    expect(out[3]).toBe(lut[255]);
    expect(out[2]).toBe(lut[lutIndex(0.5)]);
    expect(out[2 * nSamples + 2]).toBe(lut[255]);
    // Missing trace: one flat ground colour, never its (meaningless) samples.
    expect(new Set(out.subarray(nSamples, 2 * nSamples)).size).toBe(1);
    expect(out[nSamples]).not.toBe(lut[255]);
  });

  // Positive = dark on a grey variable-density plot: common practice, no source; the screen states it.
  it('grey: positive is dark (polarity statement on screen), negative light', () => {
    const lum = (c: number) => (c & 255) + ((c >>> 8) & 255) + ((c >>> 16) & 255);
    expect(lum(AMPLITUDE_LUTS.grey.packed[255])).toBeLessThan(lum(AMPLITUDE_LUTS.grey.packed[0]));
  });

  it('the dip layer is absent where confidence is 0 and at full strength where it is 1', () => {
    const conf = Float32Array.from([0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1]);
    const field = new Float32Array(nTraces * nSamples).fill(1);
    const out = buildSectionPixels(new Uint32Array(nTraces * nSamples), {
      nTraces, nSamples, shown, status: new Uint8Array(nTraces), lut: AMPLITUDE_LUTS.grey,
      dip: { field, confidence: conf, maxAbs: 1, opacity: 1, lut: DIP_LUT },
    });
    expect(out[0]).toBe(AMPLITUDE_LUTS.grey.packed[0]);
    expect(out[2 * nSamples]).toBe(blend256(AMPLITUDE_LUTS.grey.packed[lutIndex(0.25)], DIP_LUT.packed[255], 256));
    expect(out[2 * nSamples]).toBe(DIP_LUT.packed[255]);
  });

  it('blend256 is exact at the ends and halfway', () => {
    const a = packRgba(0, 100, 200, 255), b = packRgba(200, 100, 0, 255);
    expect(blend256(a, b, 0)).toBe(a);
    expect(blend256(a, b, 256)).toBe(b);
    expect(blend256(a, b, 128)).toBe(packRgba(100, 100, 100, 255));
  });
});
