/**
 * Seeded pseudo-random numbers (mulberry32 for uniforms, Box-Muller for normals).
 * core/ and test/ never call Math.random: every result must be reproducible from a seed.
 */
export class Rng {
  private state: number;
  private spare = NaN;

  constructor(seed: number) {
    this.state = (seed >>> 0) ^ 0x6d2b79f5;
  }

  /** Uniform in [0, 1). */
  uniform(): number {
    let t = (this.state = (this.state + 0x6d2b79f5) >>> 0);
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  /** Uniform integer in [lo, hi). */
  int(lo: number, hi: number): number {
    return lo + Math.floor(this.uniform() * (hi - lo));
  }

  /** Standard normal. */
  normal(): number {
    if (!Number.isNaN(this.spare)) {
      const s = this.spare;
      this.spare = NaN;
      return s;
    }
    let u = 0;
    while (u === 0) u = this.uniform();
    const v = this.uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }
}
