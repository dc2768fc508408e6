#!/usr/bin/python3
# Reads a SEG-Y file written by Dipweave with Debian's python3-segyio and prints what segyio sees as JSON.
# Versions this was written against: segyio 1.8.3 (Debian python3-segyio), numpy 1.24.2, Python 3.11.
# Usage: /usr/bin/python3 segyio_read.py FILE big|little
import json
import sys

import numpy as np
import segyio

path, endian = sys.argv[1], sys.argv[2]
with segyio.open(path, ignore_geometry=True, endian=endian, strict=False) as f:
    out = {
        'tracecount': f.tracecount,
        'samples_per_trace': len(f.samples),
        'format': int(f.bin[segyio.BinField.Format]),
        'interval': int(f.bin[segyio.BinField.Interval]),
        'ext_headers': int(f.bin[segyio.BinField.ExtendedHeaders]),
        'text': f.text[0].decode('latin-1'),
        'samples': [f.trace[i].astype(np.float64).tolist() for i in range(f.tracecount)],
        'headers': [{
            'TRACE_SEQUENCE_IN_FILE': h[segyio.TraceField.TRACE_SEQUENCE_FILE],
            'FIELD_RECORD': h[segyio.TraceField.FieldRecord],
            'TRACE_ID_CODE': h[segyio.TraceField.TraceIdentificationCode],
            'OFFSET': h[segyio.TraceField.offset],
            'RECEIVER_X': h[segyio.TraceField.GroupX],
            'COORDINATE_SCALAR': h[segyio.TraceField.SourceGroupScalar],
        } for h in f.header],
    }
    # Bytes 233-234 of each trace header, raw from the file (segyio 1.8.3 does not byte-swap its
    # UnassignedInt1 field in little-endian files, so the layout segyio reports is used instead).
    bps = {1: 4, 2: 4, 3: 2, 5: 4, 8: 1}[out['format']]
    trace0 = 3600 + 3200 * max(0, out['ext_headers'])
    size = 240 + bps * out['samples_per_trace']
    raw = open(path, 'rb').read()
    dt = '>i2' if endian == 'big' else '<i2'
    for i, h in enumerate(out['headers']):
        h['BYTES_233_234'] = int(np.frombuffer(raw, dtype=dt, count=1, offset=trace0 + i * size + 232)[0])
print(json.dumps(out))
