"""Reference side of the ETS benchmark: statsmodels ETSModel (additive errors) fitted with its
default start on the same series. Reads float64 series from argv[1] (argv[2] series × argv[3]
points, already on the model's scale), fits the model named by argv[4] ("holt-winters" or
"damped"), and prints one JSON line {"seconds", "llf": [...]}. Run by bench/run.js with Debian's
/usr/bin/python3 when python3-statsmodels is installed.
"""
import json
import sys
import time
import warnings

import numpy as np
from statsmodels.tsa.exponential_smoothing.ets import ETSModel

warnings.simplefilter("ignore")
path, count, length, method = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), sys.argv[4]
data = np.fromfile(path, dtype="<f8").reshape(count, length)
spec = {
    "holt-winters": dict(error="add", trend="add", damped_trend=False, seasonal="add", seasonal_periods=12),
    "damped": dict(error="add", trend="add", damped_trend=True, seasonal=None),
}[method]
t0 = time.perf_counter()
c0 = time.process_time()
llf = []
for row in data:
    res = ETSModel(row, **spec).fit(disp=False)
    llf.append(float(res.llf))
seconds = time.perf_counter() - t0
cpu = time.process_time() - c0
print(json.dumps({"seconds": seconds, "cpu_seconds": cpu, "llf": llf}))
