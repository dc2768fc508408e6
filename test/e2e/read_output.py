# Reads a SEG-Y written by Dipweave with Debian's python3-segyio (an outside reader) and reports, as JSON:
# trace count, samples, the textual header, the filled-trace flag (bytes 233-234, read from the raw bytes
# since segyio names no field there) and the samples of every trace.
# Usage: read_output.py FILE.sgy
import json
import struct
import sys
import segyio

path = sys.argv[1]
with segyio.open(path, ignore_geometry=True) as f:
    n = f.tracecount
    ns = len(f.samples)
    fmt = int(f.bin[segyio.BinField.Format])
    text = segyio.tools.wrap(f.text[0])
    traces = [f.trace[i].astype(float).tolist() for i in range(n)]
    dt_us = int(f.bin[segyio.BinField.Interval])
    ext = int(f.bin[segyio.BinField.ExtendedHeaders])
bps = {1: 4, 2: 4, 3: 2, 5: 4, 8: 1}[fmt]
start = 3600 + 3200 * max(0, ext)
flags = []
ids = []
with open(path, 'rb') as raw:
    data = raw.read()
for i in range(n):
    at = start + i * (240 + ns * bps)
    flags.append(struct.unpack('>h', data[at + 232:at + 234])[0])
    ids.append(struct.unpack('>h', data[at + 28:at + 30])[0])
print(json.dumps({'n': n, 'ns': ns, 'format': fmt, 'dtUs': dt_us, 'text': text, 'flags': flags, 'ids': ids, 'traces': traces}))
