/** Public surface of core/slope: what the fill pipeline, the UI worker and the CLI import. */
export { estimateSlopes, withDipEdits, SLOPE_DEFAULTS } from './estimate';
export type { SlopeField, SlopeInfo, SlopeMethod, SlopeOptions } from './types';
export { applyDipEdits, validateDipEdits, linkPath, type DipEdit, type DipPoint, type BrushEdit, type RegionEdit, type LinkEdit } from './edits';
export { pairsToTraces, tracesToPairs, pairsToTracesUnchecked, tracesToPairsUnchecked, pairPositionTrace } from './pair-grid';
export { slopeToUnit, slopeFromUnit, slopeUnitFactor, convertSlopeArray, SLOPE_UNITS, SLOPE_UNIT_LABEL, type SlopeUnit, type SlopeUnitContext } from './units';
export { detectDecimationFactor } from './decimation';
export { centredToSplitSlopes, centredToSplitSlopesUnchecked } from './split-convention';
