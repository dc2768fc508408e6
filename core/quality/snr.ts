/**
 * Fill quality: SNR (dB) = 10 log10(||d||² / ||d − d_rec||²), computed on the scored samples only
 * (methods.md §5; Gan et al. 2015 eq. 9). Including exactly honoured known traces would inflate it.
 * Returns +Infinity for an exact reconstruction and NaN when the reference has no energy.
 */
export function snrDb(truth: ArrayLike<number>, estimate: ArrayLike<number>, scoredTraces: ArrayLike<number> | null, nSamples: number): number {
  let signal = 0;
  let error = 0;
  const traces = scoredTraces ?? Array.from({ length: truth.length / nSamples }, (_, i) => i);
  for (let j = 0; j < traces.length; j++) {
    const base = traces[j] * nSamples;
    for (let t = 0; t < nSamples; t++) {
      const d = truth[base + t];
      const e = d - estimate[base + t];
      signal += d * d;
      error += e * e;
    }
  }
  if (signal === 0) return Number.NaN;
  if (error === 0) return Number.POSITIVE_INFINITY;
  return 10 * Math.log10(signal / error);
}

/** RMS of the given traces (all samples). */
export function rmsOfTraces(data: ArrayLike<number>, traces: ArrayLike<number>, nSamples: number): number {
  let s = 0;
  for (let j = 0; j < traces.length; j++) {
    const base = traces[j] * nSamples;
    for (let t = 0; t < nSamples; t++) s += data[base + t] * data[base + t];
  }
  return traces.length ? Math.sqrt(s / (traces.length * nSamples)) : 0;
}
