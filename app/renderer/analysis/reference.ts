/**
 * Lines up a reference gather (the complete recordings of a synthetic test) with the gather on screen: the
 * shift s such that reference position x + s holds the recording of screen position x, chosen by the
 * smallest relative RMS misfit over the recorded traces on screen. Layout: trace-major (core/grid/gather.ts).
 * @returns shift −1 when the reference is shorter than the gather; misfit = sqrt(Σ(a−b)²/Σa²) at the best shift
 */
export function alignReference(data: ArrayLike<number>, present: ArrayLike<number>, nTraces: number,
  ref: ArrayLike<number>, nRef: number, nSamples: number): { shift: number; misfit: number } {
  let best = -1;
  let bestMis = Infinity;
  for (let shift = 0; shift + nTraces <= nRef; shift++) {
    let e = 0;
    let s2 = 0;
    for (let x = 0; x < nTraces; x++) {
      if (!present[x]) continue;
      const a0 = x * nSamples, b0 = (x + shift) * nSamples;
      for (let t = 0; t < nSamples; t++) {
        const a = data[a0 + t], b = ref[b0 + t];
        e += (a - b) * (a - b);
        s2 += a * a;
      }
    }
    const mis = s2 > 0 ? Math.sqrt(e / s2) : Infinity;
    if (mis < bestMis) {
      bestMis = mis;
      best = shift;
    }
  }
  return { shift: best, misfit: bestMis };
}
