/**
 * Adam (Kingma & Ba 2015, ICLR, Algorithm 1; β₁ 0.9, β₂ 0.999, ε 1e−8 as in the paper) over one flat parameter
 * vector. Allocation-free step; the learning rate is passed per step so the caller owns the schedule.
 */
export interface AdamState {
  readonly m: Float64Array;
  readonly v: Float64Array;
  step: number;
  readonly beta1: number;
  readonly beta2: number;
  readonly epsilon: number;
}

export function createAdam(nParams: number, beta1 = 0.9, beta2 = 0.999, epsilon = 1e-8): AdamState {
  return { m: new Float64Array(nParams), v: new Float64Array(nParams), step: 0, beta1, beta2, epsilon };
}

/** params −= lr · m̂ / (√v̂ + ε), with bias-corrected moments. @returns params */
export function adamStep(params: Float64Array, grad: Float64Array, state: AdamState, learningRate: number): Float64Array {
  const { m, v, beta1, beta2, epsilon } = state;
  state.step++;
  const c1 = 1 / (1 - beta1 ** state.step);
  const c2 = 1 / (1 - beta2 ** state.step);
  for (let i = 0; i < params.length; i++) {
    const g = grad[i];
    m[i] = beta1 * m[i] + (1 - beta1) * g;
    v[i] = beta2 * v[i] + (1 - beta2) * g * g;
    params[i] -= (learningRate * m[i] * c1) / (Math.sqrt(v[i] * c2) + epsilon);
  }
  return params;
}
