/**
 * Where a slope lives. Plane-wave destruction compares traces p and p+1, so its slope belongs to the PAIR
 * position p+½ (methods.md §2.3): nPairs = nTraces−1 columns, pair-major field[p * nSamples + t], the same
 * layout as core/pwd/operator.ts. People and SEG-Y output want one value per trace: trace x takes the mean of
 * pairs x−1 and x (one neighbour at the ends). The way back, pair p takes the mean of traces p and p+1.
 * Both maps act at the same time sample t (a row), so they are exact for slopes constant along x.
 */

/** Pair grid → trace grid. out: nTraces*nSamples; pairs: (nTraces−1)*nSamples. nTraces ≥ 2. Unchecked. @returns out */
export function pairsToTracesUnchecked(out: Float64Array, pairs: Float64Array, nTraces: number, nSamples: number): Float64Array {
  const nPairs = nTraces - 1;
  for (let x = 0; x < nTraces; x++) {
    const o = x * nSamples;
    const l = (x - 1) * nSamples;
    const r = x * nSamples;
    if (x === 0) for (let t = 0; t < nSamples; t++) out[o + t] = pairs[r + t];
    else if (x === nPairs) for (let t = 0; t < nSamples; t++) out[o + t] = pairs[l + t];
    else for (let t = 0; t < nSamples; t++) out[o + t] = 0.5 * (pairs[l + t] + pairs[r + t]);
  }
  return out;
}

/**
 * Weighted pair → trace map: trace x = Σ w·v / Σ w over its neighbouring pairs; where both weights are 0 the
 * plain mean is used. Useful when one neighbouring pair touches a missing trace. Unchecked. @returns out
 */
export function pairsToTracesWeightedUnchecked(out: Float64Array, pairs: Float64Array, weights: Float64Array, nTraces: number, nSamples: number): Float64Array {
  const nPairs = nTraces - 1;
  for (let x = 0; x < nTraces; x++) {
    const o = x * nSamples;
    for (let t = 0; t < nSamples; t++) {
      let sw = 0, sv = 0, n = 0, s = 0;
      if (x > 0) {
        const i = (x - 1) * nSamples + t;
        sw += weights[i]; sv += weights[i] * pairs[i]; s += pairs[i]; n++;
      }
      if (x < nPairs) {
        const i = x * nSamples + t;
        sw += weights[i]; sv += weights[i] * pairs[i]; s += pairs[i]; n++;
      }
      out[o + t] = sw > 0 ? sv / sw : s / n;
    }
  }
  return out;
}

/** Trace grid → pair grid (mean of the two traces). Unchecked. @returns out */
export function tracesToPairsUnchecked(out: Float64Array, traces: Float64Array, nTraces: number, nSamples: number): Float64Array {
  for (let p = 0; p < nTraces - 1; p++) {
    const o = p * nSamples;
    const r = (p + 1) * nSamples;
    for (let t = 0; t < nSamples; t++) out[o + t] = 0.5 * (traces[o + t] + traces[r + t]);
  }
  return out;
}

function check(name: string, len: number, cols: number, nSamples: number): void {
  if (len !== cols * nSamples) throw new RangeError(`${name}: length ${len} ≠ ${cols}*${nSamples}`);
}

export function pairsToTraces(pairs: Float64Array, nTraces: number, nSamples: number): Float64Array {
  if (nTraces < 2) throw new RangeError(`pairsToTraces: need nTraces ≥ 2. Value: ${nTraces}`);
  check('pairsToTraces', pairs.length, nTraces - 1, nSamples);
  return pairsToTracesUnchecked(new Float64Array(nTraces * nSamples), pairs, nTraces, nSamples);
}

export function tracesToPairs(traces: Float64Array, nTraces: number, nSamples: number): Float64Array {
  if (nTraces < 2) throw new RangeError(`tracesToPairs: need nTraces ≥ 2. Value: ${nTraces}`);
  check('tracesToPairs', traces.length, nTraces, nSamples);
  return tracesToPairsUnchecked(new Float64Array((nTraces - 1) * nSamples), traces, nTraces, nSamples);
}

/** Position, in trace units, of pair p: p + ½. */
export function pairPositionTrace(p: number): number {
  return p + 0.5;
}
