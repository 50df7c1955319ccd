#!/usr/bin/python3
"""Writes reference.json: values from SciPy and NumPy that the Go tests of
package activation compare against. Run once with Debian's python3-scipy and
python3-numpy (`/usr/bin/python3 gen_reference.py` in this folder); the
versions used are recorded in the file.

Functions and their independent reference implementations:
  logistic        scipy.special.expit
  logistic_deriv  expit(z) * expit(-z)
  tanh            numpy.tanh
  arctan          numpy.arctan
  softplus        numpy.logaddexp(0, z)
  softplus_deriv  scipy.special.expit
  log_logistic    scipy.special.log_expit  (= -softplus(-z))
  exp_neg_abs     numpy.exp(-abs(z))
  softmax         scipy.special.softmax
  log_softmax     scipy.special.log_softmax
"""
import json
import sys

import numpy as np
import scipy
import scipy.special as sp

points = sorted(set([
    -1000.0, -745.0, -710.0, -100.0, -40.0, -20.0, -5.0, -1.0, -0.5, -1e-8, -1e-300,
    0.0,
    1e-300, 1e-8, 0.5, 1.0, 5.0, 20.0, 40.0, 100.0, 710.0, 745.0, 1000.0,
]))
z = np.array(points, dtype=np.float64)


def as_list(a):
    return [float(v) for v in a]


vectors = {
    "large": [1000.0, 1001.0, 1002.0],
    "mixed": [-3.0, 0.0, 1e-8, 2.5, -1000.0],
    "ties": [1.0, 4.0, 4.0, -2.0],
    "single": [7.0],
    "spread": [-1000.0, 0.0, 1000.0],
}

out = {
    "generator": "testdata/gen_reference.py",
    "python": sys.version.split()[0],
    "numpy": np.__version__,
    "scipy": scipy.__version__,
    "points": as_list(z),
    "logistic": as_list(sp.expit(z)),
    "logistic_deriv": as_list(sp.expit(z) * sp.expit(-z)),
    "tanh": as_list(np.tanh(z)),
    "arctan": as_list(np.arctan(z)),
    "softplus": as_list(np.logaddexp(0.0, z)),
    "softplus_deriv": as_list(sp.expit(z)),
    "log_logistic": as_list(sp.log_expit(z)),
    # e^(-|z|): for z < -40 this equals expit(z) to within rounding, since
    # 1 + e^z rounds to 1; used where expit itself flushes to 0.
    "exp_neg_abs": as_list(np.exp(-np.abs(z))),
    "softmax": {},
    "log_softmax": {},
}
for name, v in vectors.items():
    a = np.array(v, dtype=np.float64)
    out["softmax"][name] = {"input": v, "T": 1.0, "output": as_list(sp.softmax(a))}
    out["log_softmax"][name] = {"input": v, "T": 1.0, "output": as_list(sp.log_softmax(a))}
# Temperature T enters as softmax(z / T).
a = np.array(vectors["mixed"], dtype=np.float64)
out["softmax"]["mixed_T0.25"] = {"input": vectors["mixed"], "T": 0.25, "output": as_list(sp.softmax(a / 0.25))}
out["log_softmax"]["mixed_T4"] = {"input": vectors["mixed"], "T": 4.0, "output": as_list(sp.log_softmax(a / 4.0))}

with open("reference.json", "w") as f:
    json.dump(out, f, indent=1, sort_keys=True)
    f.write("\n")
