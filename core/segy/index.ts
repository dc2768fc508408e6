/** SEG-Y in and out: the public surface of core/segy (docs/segy.md). */
export { memoryByteSource, type ByteSource } from './byte-source';
export * from './fields';
export { SAMPLE_FORMATS, sampleFormat, decodeSamplesUnchecked, encodeSamplesUnchecked, type SampleFormat, type SampleFormatCode } from './formats';
export { ibmBitsToFloat64, float64ToIbmBits, IBM_MAX, IBM_MIN_NORMAL, type IbmRounding } from './ibm';
export { openSegy, type SegyFile, type OpenOptions, type ByteOrder } from './open';
export { applyScalar, parseTraceHeader, readTraceFields, type TraceHeader, type CoordinateUnit } from './trace-header';
export { GATHER_KEY_NAMES, indexGathers, parseGatherKey, readGather, readTraces, type GatherEntry, type GatherIndex, type GatherKey, type LoadedGather, type ReadOptions } from './gathers';
export { gatherGeometry, type GatherGeometry, type GeometryOptions, type PositionSource } from './geometry';
export { decodeText, detectTextEncoding, encodeText, isFreeCard, textCards, type TextEncoding } from './text';
export { SegyWriter, NOTE_MIN_CARDS, type BytePatch, type OutputGather, type WriterOptions, type WriterSummary } from './writer';
