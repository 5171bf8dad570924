# Peer of scripts/bench-engine.ts: the scalar-annihilation closed form vectorised in numpy on the
# same points. Protocol on stdin/stdout so the two can alternate in one run:
#   argv: <points.f64 path> s m2 pref pp2 t1 u1 e2     then lines "run" -> "<ms> <checksum>", "quit".
import sys
import time

import numpy as np

path = sys.argv[1]
s, m2, pref, pp2, t1, u1, e2 = (float(x) for x in sys.argv[2:9])
c = np.fromfile(path, dtype=np.float64)


def evaluate(c):
    t = t1 - pp2 * (1.0 - c)
    u = u1 - pp2 * (1.0 + c)
    c12 = 1.0 - (2.0 * m2 * s) / ((t - m2) * (u - m2))
    return pref * 4.0 * e2 * e2 * (1.0 + c12 * c12)


print("ready", flush=True)
for line in sys.stdin:
    command = line.strip()
    if command == "quit":
        break
    if command == "run":
        start = time.perf_counter()
        out = evaluate(c)
        elapsed = (time.perf_counter() - start) * 1e3
        print(f"{elapsed} {float(out.sum())!r}", flush=True)
    elif command == "dump":
        evaluate(c).tofile(path + ".out")
        print("dumped", flush=True)
