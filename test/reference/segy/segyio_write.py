#!/usr/bin/python3
# Writes small SEG-Y files with Debian's python3-segyio, one per sample format segyio can write and per
# byte order, plus manifest.json with the samples and header values segyio reads back from each file.
# Versions this was written against: segyio 1.8.3 (Debian python3-segyio), numpy 1.24.2, Python 3.11.
# Usage: /usr/bin/python3 segyio_write.py OUTDIR
import json
import os
import sys

import numpy as np
import segyio

out = sys.argv[1]
rng = np.random.default_rng(1234)
n_traces, n_samples = 7, 23
# Sample format codes of SEG-Y rev 1 and 2.0; segyio refuses the ones it cannot write (recorded as skipped).
codes = [1, 2, 3, 5, 6, 7, 8, 9, 10, 11, 12, 15, 16]
ranges = {2: (-2**31, 2**31 - 1), 3: (-2**15, 2**15 - 1), 7: (-2**23, 2**23 - 1), 8: (-128, 127), 9: (-2**40, 2**40),
          10: (0, 2**32 - 1), 11: (0, 2**16 - 1), 12: (0, 2**40), 15: (0, 2**24 - 1), 16: (0, 255)}
files, skipped = [], []
for code in codes:
    for endian in ('big', 'little'):
        path = os.path.join(out, f'segyio-f{code}-{endian}.sgy')
        spec = segyio.spec()
        spec.format = code
        spec.samples = list(range(n_samples))
        spec.tracecount = n_traces
        spec.endian = endian
        try:
            if code in ranges:
                lo, hi = ranges[code]
                # Keep integers exactly representable in Float32 (|v| < 2^24) so the comparison is exact.
                lo, hi = max(lo, -2**24 + 1), min(hi, 2**24 - 1)
                data = rng.integers(lo, hi, size=(n_traces, n_samples), endpoint=True).astype(np.float64)
            else:
                data = (rng.standard_normal((n_traces, n_samples)) * 1000).astype(np.float32).astype(np.float64)
            with segyio.create(path, spec) as f:
                f.bin.update({segyio.BinField.Interval: 2000, segyio.BinField.Samples: n_samples, segyio.BinField.Format: code})
                for i in range(n_traces):
                    f.header[i] = {
                        segyio.TraceField.TRACE_SEQUENCE_FILE: i + 1,
                        segyio.TraceField.FieldRecord: 3001,
                        segyio.TraceField.TraceNumber: i + 1,
                        segyio.TraceField.offset: 100 + 50 * i,
                        segyio.TraceField.SourceGroupScalar: -100,
                        segyio.TraceField.GroupX: 250000 + 5000 * i,
                        segyio.TraceField.ElevationScalar: -10,
                        segyio.TraceField.ReceiverGroupElevation: -1234,
                        segyio.TraceField.TRACE_SAMPLE_COUNT: n_samples,
                        segyio.TraceField.TRACE_SAMPLE_INTERVAL: 2000,
                    }
                    f.trace[i] = data[i].astype(f.dtype) if hasattr(f, 'dtype') else data[i]
            bps = {1: 4, 2: 4, 3: 2, 5: 4, 8: 1}[code]
            expected = 3600 + n_traces * (240 + n_samples * bps)
            if os.path.getsize(path) != expected:
                # segyio 1.8.3 writes one sample short per trace for 1- and 2-byte formats (seen here).
                raise RuntimeError(f'segyio wrote {os.path.getsize(path)} bytes, expected {expected}')
            with segyio.open(path, ignore_geometry=True, endian=endian) as f:
                samples = [f.trace[i].astype(np.float64).tolist() for i in range(n_traces)]
                headers = [{'FIELD_RECORD': h[segyio.TraceField.FieldRecord], 'OFFSET': h[segyio.TraceField.offset],
                            'RECEIVER_X': h[segyio.TraceField.GroupX], 'COORDINATE_SCALAR': h[segyio.TraceField.SourceGroupScalar],
                            'RECEIVER_ELEVATION': h[segyio.TraceField.ReceiverGroupElevation],
                            'TRACE_SEQUENCE_IN_FILE': h[segyio.TraceField.TRACE_SEQUENCE_FILE]} for h in f.header]
                files.append({'path': path, 'format': code, 'endian': endian, 'samples': samples, 'headers': headers,
                              'interval': int(f.bin[segyio.BinField.Interval])})
        except Exception as e:  # segyio cannot write this format
            skipped.append({'format': code, 'endian': endian, 'reason': f'{type(e).__name__}: {e}'})
            if os.path.exists(path):
                os.remove(path)
json.dump({'segyio': segyio.__version__, 'numpy': np.__version__, 'files': files, 'skipped': skipped},
          open(os.path.join(out, 'manifest.json'), 'w'))
