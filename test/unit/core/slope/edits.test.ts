import { describe, expect, it } from 'vitest';
import { applyDipEdits, insidePolygon, linkPath, softWeight, validateDipEdits, type DipEdit } from '../../../../core/slope/edits';
import { isInputFileError } from '../../../../core/problems';

const nT = 21, nS = 101;
const field = (v = 0.5) => new Float64Array((nT - 1) * nS).fill(v);
const at = (f: Float64Array, p: number, t: number) => f[p * nS + t];

describe('dip edits', () => {
  // Brush: an ellipse in (traces, samples); weight 1 inside (1 − softness)·radius, raised-cosine to 0 at the radius.
  it('brush set: exact value at the centre, analytic cosine taper on the soft edge, untouched outside', () => {
    const f = field(), w = field(0);
    const e: DipEdit = { kind: 'brush', mode: 'set', slopeSamplesPerTrace: 2, points: [{ trace: 10.5, sample: 50 }], radiusTraces: 4, radiusSamples: 20, softness: 0.5 };
    applyDipEdits(f, w, nT, nS, [e]);
    expect(at(f, 10, 50)).toBe(2);
    // 15 samples away along time: d = 0.75 → weight ½(1 + cos(π·0.25/0.5)) = 0.5
    expect(at(w, 10, 65)).toBeCloseTo(0.5, 12);
    expect(at(f, 10, 65)).toBeCloseTo(0.5 * 0.5 + 0.5 * 2, 12);
    expect(at(f, 10, 71)).toBe(0.5);
    expect(at(f, 15, 50)).toBe(0.5); // 4.5 traces away
    expect(softWeight(0.2, 0.5)).toBe(1);
  });

  it('brush add along a stroke adds the full value on the whole path', () => {
    const f = field(), w = field(0);
    applyDipEdits(f, w, nT, nS, [{ kind: 'brush', mode: 'add', slopeSamplesPerTrace: -0.25, points: [{ trace: 2.5, sample: 10 }, { trace: 12.5, sample: 60 }], radiusTraces: 1, radiusSamples: 3, softness: 0 }]);
    expect(at(f, 7, 35)).toBeCloseTo(0.25, 12); // on the segment's midpoint
    expect(at(f, 2, 10)).toBeCloseTo(0.25, 12);
    expect(at(f, 7, 60)).toBe(0.5);
  });

  it('region set acts inside the polygon only; region smooth keeps a constant field constant', () => {
    const poly = [{ trace: 3, sample: 20 }, { trace: 9, sample: 20 }, { trace: 9, sample: 80 }, { trace: 3, sample: 80 }];
    const f = field(), w = field(0);
    applyDipEdits(f, w, nT, nS, [{ kind: 'region', polygon: poly, action: 'set', slopeSamplesPerTrace: -1 }]);
    expect(at(f, 5, 50)).toBe(-1);
    expect(at(f, 10, 50)).toBe(0.5);
    expect(at(f, 5, 10)).toBe(0.5);
    expect(insidePolygon(5, 50, poly)).toBe(true);
    expect(insidePolygon(10, 50, poly)).toBe(false);
    const g = field(1.25), wg = field(0);
    applyDipEdits(g, wg, nT, nS, [{ kind: 'region', polygon: poly, action: 'smooth', radiusTraces: 3, radiusSamples: 5 }]);
    expect(at(g, 5, 50)).toBeCloseTo(1.25, 12);
    expect(at(wg, 5, 50)).toBe(1);
  });

  // Link: the cubic Hermite path with end values t_A, t_B and end slopes σ_A, σ_B (methods.md §3.5). With both end
  // slopes equal to the chord slope the path is the straight line and its slope is the chord slope everywhere.
  it('link: straight chord case and the Hermite end conditions', () => {
    const a = { trace: 4, sample: 30 }, b = { trace: 16, sample: 54 };
    const chord = (54 - 30) / 12;
    for (const x of [4, 7.5, 10, 16]) {
      const p = linkPath(a, b, chord, chord, x);
      expect(p.slope).toBeCloseTo(chord, 12);
      expect(p.sample).toBeCloseTo(30 + chord * (x - 4), 12);
    }
    const q0 = linkPath(a, b, 0.5, 3, 4), q1 = linkPath(a, b, 0.5, 3, 16);
    expect(q0.sample).toBeCloseTo(30, 12); expect(q0.slope).toBeCloseTo(0.5, 12);
    expect(q1.sample).toBeCloseTo(54, 12); expect(q1.slope).toBeCloseTo(3, 12);
    const f = field(0), w = field(0);
    applyDipEdits(f, w, nT, nS, [{ kind: 'link', from: a, to: b, halfWidthSamples: 6 }]); // end slopes read from the field (0)
    const mid = linkPath(a, b, 0, 0, 10.5);
    expect(at(f, 10, Math.round(mid.sample))).toBeCloseTo(mid.slope, 1);
    expect(mid.slope).toBeCloseTo(1.5 * chord * (1 - 4 * ((10.5 - 4) / 12 - 0.5) ** 2), 12); // Hermite with zero end slopes: 6ξ(1−ξ)·Δt/D
    expect(at(f, 10, Math.round(mid.sample) + 20)).toBe(0);
    expect(at(f, 2, 30)).toBe(0); // outside the link's span
  });

  it('edits are plain JSON: a round trip applies identically', () => {
    const edits: DipEdit[] = [
      { kind: 'brush', mode: 'set', slopeSamplesPerTrace: 1, points: [{ trace: 5, sample: 40 }], radiusTraces: 2, radiusSamples: 8, softness: 0.3 },
      { kind: 'link', from: { trace: 8, sample: 20 }, to: { trace: 14, sample: 35 } },
    ];
    const a = field(), b = field();
    applyDipEdits(a, field(0), nT, nS, edits);
    applyDipEdits(b, field(0), nT, nS, validateDipEdits(JSON.parse(JSON.stringify(edits))));
    expect(Array.from(a)).toEqual(Array.from(b));
  });

  it('bad edits give input.bad-dips', () => {
    const bad = [
      [{ kind: 'paint' }],
      [{ kind: 'brush', mode: 'set', slopeSamplesPerTrace: NaN, points: [{ trace: 1, sample: 1 }], radiusTraces: 1, radiusSamples: 1, softness: 0 }],
      [{ kind: 'region', polygon: [{ trace: 1, sample: 1 }], action: 'set', slopeSamplesPerTrace: 1 }],
      [{ kind: 'link', from: { trace: 3, sample: 1 }, to: { trace: 3.5, sample: 9 } }],
      'not a list',
    ];
    for (const e of bad) {
      try { validateDipEdits(e); throw new Error('accepted'); } catch (err) { expect(isInputFileError(err) && err.problem.code).toBe('input.bad-dips'); }
    }
  });
});
