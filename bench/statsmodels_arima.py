"""Reference side of the ARIMA benchmark: statsmodels SARIMAX with simple differencing (the same
likelihood as Fanwise's) fitted with its default start on the same series. Reads float64 series
from argv[1] (argv[2] series × argv[3] points, already on the model's scale), fits
ARIMA(argv[4]) × (argv[5]) with period 12, prints one JSON line {"seconds", "cpu" (process time), "llf": [...]},
with "llf_at_given" when argv[6] names a file of parameters (see below).
Run by bench/arima.js with Debian's /usr/bin/python3 when python3-statsmodels is installed.
"""
import json
import sys
import time
import warnings

import numpy as np
from statsmodels.tsa.statespace.sarimax import SARIMAX

warnings.simplefilter("ignore")
path, count, length = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
order = tuple(int(v) for v in sys.argv[4].split(","))
sorder = tuple(int(v) for v in sys.argv[5].split(",")) + (12,)
data = np.fromfile(path, dtype="<f8").reshape(count, length)
t0 = time.perf_counter()
c0 = time.process_time()
llf = []
for row in data:
    res = SARIMAX(row, order=order, seasonal_order=sorder, simple_differencing=True).fit(disp=False)
    llf.append(float(res.llf))
seconds = time.perf_counter() - t0
cpu = time.process_time() - c0
out = {"seconds": seconds, "cpu": cpu, "llf": llf}
if len(sys.argv) > 6:
    # After the timing: statsmodels' own log-likelihood at another program's fitted parameters
    # (argv[6]: float64, series × parameters in statsmodels' order, e.g. ma.L1, ma.S.L12, sigma2).
    theirs = np.fromfile(sys.argv[6], dtype="<f8").reshape(count, -1)
    out["llf_at_given"] = [
        float(SARIMAX(row, order=order, seasonal_order=sorder, simple_differencing=True).loglike(theirs[i]))
        for i, row in enumerate(data)
    ]
print(json.dumps(out))
