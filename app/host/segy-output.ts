/**
 * Writing a SEG-Y file with filled traces, one gather at a time, through a temporary file
 * (app/host/atomic-output.ts). The caller feeds gathers in the order they should appear.
 */
import type { CancelToken } from '../../core/problems';
import type { SegyFile } from '../../core/segy/open';
import { SegyWriter, type OutputGather, type WriterOptions, type WriterSummary } from '../../core/segy/writer';
import { writeFileAtomically } from './atomic-output';

export interface GatherSink {
  /** Encode and append one gather's traces. */
  writeGather(gather: OutputGather): Promise<void>;
}

/**
 * Write `outputPath` from `input` (opened from `inputPath`). `produce` calls sink.writeGather for each
 * gather; when it returns, the note and header counts are patched and the file is renamed into place.
 */
export async function writeFilledSegy(
  outputPath: string, inputPath: string, input: SegyFile, options: WriterOptions,
  produce: (sink: GatherSink) => Promise<void>, cancel?: CancelToken,
): Promise<WriterSummary> {
  const writer = new SegyWriter(input, options);
  let summary: WriterSummary | undefined;
  await writeFileAtomically(outputPath, [inputPath], async (out) => {
    await out.write(writer.headerBytes());
    await produce({ writeGather: (g) => out.write(writer.encodeGather(g)) });
    const { patches, summary: s } = writer.finish();
    for (const p of patches) await out.writeAt(p.offsetBytes, p.bytes);
    summary = s;
  }, cancel);
  return summary!;
}
