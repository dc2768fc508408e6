# Writes a small shot-gather SEG-Y with Debian's python3-segyio (an outside writer): two shots of 96 channels,
# 500 samples at 2 ms, receiver X in bytes 81-84 with coordinate scalar -100, a 12-channel hole in shot 1.
# Usage: make_segy.py OUT.sgy
import sys
import numpy as np
import segyio

out = sys.argv[1]
ns, dt_us, nch = 500, 2000, 96
hole = set(range(40, 52))
t = np.arange(ns) * dt_us / 1e6


def ricker(tt, f):
    a = (np.pi * f * tt) ** 2
    return (1 - 2 * a) * np.exp(-a)


traces = []
for shot in (1, 2):
    for ch in range(nch):
        if shot == 1 and ch in hole:
            continue
        x = ch * 12.5
        tr = np.zeros(ns, dtype=np.float32)
        for t0, v in ((0.2, 1600.0), (0.45, 1900.0), (0.7, 2300.0)):
            tr += ricker(t - np.sqrt(t0 ** 2 + ((100 + x) / v) ** 2), 30.0).astype(np.float32)
        traces.append((shot, ch, x, tr))

spec = segyio.spec()
spec.format = 5
spec.samples = list(range(ns))
spec.tracecount = len(traces)
with segyio.create(out, spec) as f:
    f.bin.update(hdt=dt_us, hns=ns)
    for i, (shot, ch, x, tr) in enumerate(traces):
        f.header[i] = {segyio.su.fldr: shot, segyio.su.tracf: ch + 1, segyio.su.offset: int(100 + x),
                       segyio.su.gx: int(x * 100), segyio.su.sx: 0, segyio.su.scalco: -100, segyio.su.ns: ns,
                       segyio.su.dt: dt_us, segyio.su.trid: 1, segyio.su.tracl: i + 1}
        f.trace[i] = tr
