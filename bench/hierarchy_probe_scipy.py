# Python twin of bench/hierarchy-probe.js: times scipy.cluster.hierarchy.linkage on the same data.
# Usage: /usr/bin/python3 bench/hierarchy_probe_scipy.py FILE N D METHOD REPEATS  -> one JSON line
import json
import resource
import sys
import time

import numpy as np
from scipy.cluster.hierarchy import linkage

path, n, d, method, repeats = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), sys.argv[4], int(sys.argv[5])
X = np.fromfile(path, dtype=np.float64).reshape(n, d)
times = []
cpu = []
for _ in range(repeats):
    c0 = time.process_time()
    t0 = time.perf_counter()
    Z = linkage(X, method=method)
    times.append(time.perf_counter() - t0)
    cpu.append(time.process_time() - c0)
times.sort()
cpu.sort()
print(json.dumps({"seconds": times[len(times) // 2], "cpuSeconds": cpu[len(cpu) // 2], "top": float(Z[-1, 2]),
                  "maxRssMB": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024}))
