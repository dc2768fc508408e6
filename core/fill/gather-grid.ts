/**
 * From a gather read from SEG-Y to the regular grid the fill works on, and back: refine a geometry by a
 * decimation factor, build the fill plan from missing and dead positions, and place traces on the grid.
 * Shared by the CLI and the desktop app so both fill the same positions. Layout: core/grid/gather.ts.
 */
import type { GatherGeometry } from '../segy/geometry';
import { planFill, type FillPlan } from './plan';

/**
 * The geometry on a grid k times finer: recorded traces keep their positions, k−1 new positions between each
 * neighbouring pair of the original grid. Used when the user gives --factor k. @returns a new geometry
 */
export function refineGeometry(geo: GatherGeometry, k: number): GatherGeometry {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`refineGeometry: factor must be a whole number ≥ 1. Value: ${k}`);
  if (k === 1) return geo;
  const gridCount = (geo.gridCount - 1) * k + 1;
  const gridIndexOfTrace = geo.gridIndexOfTrace.map((g) => g * k);
  const traceOfGrid = new Int32Array(gridCount).fill(-1);
  gridIndexOfTrace.forEach((g, t) => { traceOfGrid[g] = t; });
  const missing: number[] = [];
  for (let g = 0; g < gridCount; g++) if (traceOfGrid[g] < 0) missing.push(g);
  return {
    ...geo,
    spacingM: geo.spacingM / k,
    gridIndexOfTrace,
    gridCount,
    traceOfGrid,
    missingGrid: Int32Array.from(missing),
    deadGrid: geo.deadGrid.map((g) => g * k),
    maxJitter: geo.maxJitter * k,
  };
}

/** One grid position per trace in gather order, nothing missing: for gathers written through unchanged. */
export function passThroughGeometry(nTraces: number): GatherGeometry {
  const idx = Int32Array.from({ length: nTraces }, (_, i) => i);
  return {
    positionsM: new Float64Array(nTraces).fill(Number.NaN), positionSource: 'trace-order', spacingM: Number.NaN, originM: Number.NaN,
    gridIndexOfTrace: idx, gridCount: nTraces, traceOfGrid: idx.slice(), missingGrid: new Int32Array(0), deadGrid: new Int32Array(0),
    maxJitter: 0, warnings: [],
  };
}

/** The fill plan of a gather: absent grid positions, dead traces and positions marked bad. */
export function planFromGeometry(geo: GatherGeometry, bad: readonly number[] = [], factor?: number): FillPlan {
  const present = new Uint8Array(geo.gridCount);
  for (let g = 0; g < geo.gridCount; g++) present[g] = geo.traceOfGrid[g] >= 0 ? 1 : 0;
  const dead = new Uint8Array(geo.gridCount);
  for (const g of geo.deadGrid) dead[g] = 1;
  return planFill({ nTraces: geo.gridCount, present, dead, bad: bad.filter((b) => b < geo.gridCount), factor });
}

/** Recorded traces placed on the grid (absent positions hold zeros). @returns gridCount × nSamples */
export function gatherOnGrid(data: Float32Array, geo: GatherGeometry, nSamples: number): Float32Array {
  const out = new Float32Array(geo.gridCount * nSamples);
  for (let g = 0; g < geo.gridCount; g++) {
    const t = geo.traceOfGrid[g];
    if (t >= 0) out.set(data.subarray(t * nSamples, (t + 1) * nSamples), g * nSamples);
  }
  return out;
}
