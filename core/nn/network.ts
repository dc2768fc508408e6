/**
 * A small coordinate network u(t̃, x̃) written by hand (methods.md §4): fixed Fourier features, a few dense
 * layers with a smooth activation, a linear output.
 *
 *   γ(v)   = [sin(ω_j·v), cos(ω_j·v)]_{j<m}             v = (t̃, x̃) ∈ [−1, 1]², ω_j = (ωt_j, ωx_j) rad per unit
 *   h_l    = φ(W_l h_{l−1} + b_l)                      l = 1..depth, width units each, φ = sin or tanh
 *   u      = w·h_depth + c
 *
 * Design notes (ours): the feature frequencies are drawn once, seeded, and not trained. They are chosen by the
 * caller (core/nn/features.ts draws them from the live traces' spectrum and, optionally, along the local dips),
 * which fights spectral bias (Tancik et al. 2020, NeurIPS) without a high first-layer gain. Hidden weights use
 * U(±√(6/n)), which for sin gives the unit-variance pre-activations of Sitzmann et al. 2020 (their ω₀ folded in).
 *
 * Parameters live in ONE Float64Array (so Adam, workers and gradient sums treat them as a flat vector):
 *   for l = 1..depth: W_l (width × n_{l−1}, row-major: W[o*nIn + i]), then b_l (width); then w (width), then c.
 */
import { Rng } from '../rng';

export type Activation = 'sin' | 'tanh';

export interface NetArchitecture {
  /** Units per hidden layer (16–128 in practice). */
  readonly width: number;
  /** Number of hidden layers (1–4 in practice). */
  readonly depth: number;
  readonly activation: Activation;
}

export interface NetModel extends NetArchitecture {
  /** Number of Fourier frequencies m (2m features). */
  readonly nFreq: number;
  /** Feature frequencies along t̃ and x̃, radians per unit of the scaled coordinate. Length nFreq. */
  readonly omegaT: Float64Array;
  readonly omegaX: Float64Array;
  /** Offsets into the parameter vector. weightOffset[l], biasOffset[l] for hidden layer l = 0..depth−1. */
  readonly weightOffset: Int32Array;
  readonly biasOffset: Int32Array;
  readonly outWeightOffset: number;
  readonly outBiasOffset: number;
  readonly nParams: number;
}

/** Layer sizes: n_0 = 2·nFreq features, n_l = width. */
export function layerInputSize(model: NetModel, layer: number): number {
  return layer === 0 ? 2 * model.nFreq : model.width;
}

/** Builds the model description (no parameters yet). Checked. */
export function buildNetModel(arch: NetArchitecture, omegaT: Float64Array, omegaX: Float64Array): NetModel {
  const { width, depth, activation } = arch;
  if (!Number.isInteger(width) || width < 1 || width > 512) throw new RangeError(`network width must be an integer in 1..512. Value: ${width}`);
  if (!Number.isInteger(depth) || depth < 1 || depth > 8) throw new RangeError(`network depth must be an integer in 1..8. Value: ${depth}`);
  if (activation !== 'sin' && activation !== 'tanh') throw new RangeError(`activation must be 'sin' or 'tanh'. Value: ${String(activation)}`);
  if (omegaT.length !== omegaX.length || omegaT.length < 1)
    throw new RangeError(`feature frequency arrays must have equal, non-zero length. Values: ${omegaT.length}, ${omegaX.length}`);
  const nFreq = omegaT.length;
  const weightOffset = new Int32Array(depth);
  const biasOffset = new Int32Array(depth);
  let off = 0;
  for (let l = 0; l < depth; l++) {
    const nIn = l === 0 ? 2 * nFreq : width;
    weightOffset[l] = off;
    off += width * nIn;
    biasOffset[l] = off;
    off += width;
  }
  const outWeightOffset = off;
  off += width;
  const outBiasOffset = off;
  off += 1;
  return {
    width, depth, activation, nFreq,
    omegaT: Float64Array.from(omegaT), omegaX: Float64Array.from(omegaX),
    weightOffset, biasOffset, outWeightOffset, outBiasOffset, nParams: off,
  };
}

/** Seeded initial parameters (see the header for the scheme). */
export function initNetParams(model: NetModel, seed: number): Float64Array {
  const rng = new Rng(seed);
  const p = new Float64Array(model.nParams);
  for (let l = 0; l < model.depth; l++) {
    const nIn = layerInputSize(model, l);
    // sin and tanh both keep unit-scale pre-activations with this bound (sin: Sitzmann et al. 2020 with ω₀ folded
    // in; tanh: Glorot-like) — common practice, no source for the exact constant.
    const bound = Math.sqrt(6 / nIn);
    const w0 = model.weightOffset[l];
    for (let i = 0; i < model.width * nIn; i++) p[w0 + i] = (2 * rng.uniform() - 1) * bound;
    // Biases start at zero: the features already carry the phases.
  }
  const bound = Math.sqrt(3 / model.width);
  for (let i = 0; i < model.width; i++) p[model.outWeightOffset + i] = (2 * rng.uniform() - 1) * bound;
  p[model.outBiasOffset] = 0;
  return p;
}

/** Per-point activations and tangents for the forward pass, plus adjoint buffers. Allocated once per model. */
export interface NetScratch {
  /** h[l] and hd[l] (tangent along the seed direction) for l = 0..depth (0 = features). */
  readonly h: Float64Array[];
  readonly hd: Float64Array[];
  /** φ'(z_l) and ż_l for l = 1..depth (index l−1). */
  readonly dphi: Float64Array[];
  readonly zd: Float64Array[];
  /** Adjoint buffers of width max(width, 2·nFreq). */
  readonly abar: Float64Array;
  readonly adbar: Float64Array;
  readonly a: Float64Array;
  readonly ad: Float64Array;
  /** Forward results of the last point: [u, tangent of u along the seed direction]. */
  readonly uv: Float64Array;
}

export function createNetScratch(model: NetModel): NetScratch {
  const h: Float64Array[] = [];
  const hd: Float64Array[] = [];
  const dphi: Float64Array[] = [];
  const zd: Float64Array[] = [];
  for (let l = 0; l <= model.depth; l++) {
    const n = l === 0 ? 2 * model.nFreq : model.width;
    h.push(new Float64Array(n));
    hd.push(new Float64Array(n));
    if (l > 0) {
      dphi.push(new Float64Array(n));
      zd.push(new Float64Array(n));
    }
  }
  const m = Math.max(model.width, 2 * model.nFreq);
  return { h, hd, dphi, zd, abar: new Float64Array(m), adbar: new Float64Array(m), a: new Float64Array(m), ad: new Float64Array(m), uv: new Float64Array(2) };
}
