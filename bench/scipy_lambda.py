"""Reference side of the λ benchmark: scipy.stats.boxcox_normmax(method='mle') on the same series.

Reads float64 series from the file given as argv[1] (shape given by argv[2] x argv[3]), times the
loop, and prints one JSON line: {"seconds": s, "lambdas": [...]}. Run by bench/run.js with Debian's
/usr/bin/python3 when python3-scipy is installed.
"""
import json
import sys
import time

import numpy as np
from scipy import stats

path, count, length = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
data = np.fromfile(path, dtype="<f8").reshape(count, length)
t0 = time.perf_counter()
c0 = time.process_time()
lams = [float(stats.boxcox_normmax(row, method="mle")) for row in data]
seconds = time.perf_counter() - t0
cpu = time.process_time() - c0
print(json.dumps({"seconds": seconds, "cpu_seconds": cpu, "lambdas": lams, "scipy": __import__("scipy").__version__}))
