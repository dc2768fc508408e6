// `npm run samples`: regenerates the demo files in samples/ (listed in samples/README.md) from the invented
// scenario in core/synth/demo-scenario.ts. Deterministic: test/unit/core/synth/demo-files.test.ts checks the
// committed files are byte-identical to a fresh run, so they cannot drift from the generator.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildDemoFiles } from '../core/synth/demo-segy';

const dir = new URL('../samples/', import.meta.url).pathname;
for (const { spec, bytes } of buildDemoFiles()) {
  writeFileSync(join(dir, spec.fileName), bytes);
  console.log(`${spec.fileName}  ${bytes.length} bytes  ${spec.description}`);
}
