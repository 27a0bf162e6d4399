"""The pipeline a careful engineer would write instead: numpy.loadtxt plus scipy.optimize.curve_fit from a good start.

Usage: python3 bench/scipyBaseline.py <capture.csv> <truth.json>
Prints one JSON line: load and fit times (s, timed inside Python), the estimates and their standard errors.
Prints one line starting with 'skipped:' when numpy or scipy cannot be imported.
"""

import json
import resource
import sys
import time

try:
    import numpy as np
    from scipy.optimize import curve_fit
except ImportError as error:  # the benchmark prints this line and goes on without the baseline
    print(f"skipped: numpy and scipy are needed for the baseline ({error})")
    sys.exit(0)


def step_response(t, t0, y_pre, y_final, alpha, omega_d):
    """Underdamped step from rest: continuous with zero slope at t0, the form an engineer would write by hand."""
    tau = np.maximum(t - t0, 0.0)
    ring = np.exp(-alpha * tau) * (np.cos(omega_d * tau) + alpha / omega_d * np.sin(omega_d * tau))
    return np.where(t < t0, y_pre, y_final + (y_pre - y_final) * ring)


def main(capture_path, truth_path):
    with open(truth_path) as f:
        truth = json.load(f)
    p = truth["params"]
    exact = [p["t0"], p["yPre"], p["yFinal"], p["alpha"], truth["omegaD"]]
    # A good initial guess: the truth perturbed by 1 %, alternating in sign.
    start = [v * (1.01 if k % 2 == 0 else 0.99) for k, v in enumerate(exact)]

    began = time.perf_counter()
    data = np.loadtxt(capture_path, delimiter=",", skiprows=1)
    loaded = time.perf_counter()
    t, y = data[:, 0], data[:, 1]
    values, covariance = curve_fit(step_response, t, y, p0=start)
    fitted = time.perf_counter()

    stderr = np.sqrt(np.diag(covariance))
    print(
        json.dumps(
            {
                "loadS": loaded - began,
                "fitS": fitted - loaded,
                "alpha": float(values[3]),
                "alphaStderr": float(stderr[3]),
                "omegaD": float(values[4]),
                "omegaDStderr": float(stderr[4]),
                "peakMB": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
            }
        )
    )


if __name__ == "__main__":
    if len(sys.argv) != 3:
        print("usage: python3 bench/scipyBaseline.py <capture.csv> <truth.json>", file=sys.stderr)
        sys.exit(2)
    main(sys.argv[1], sys.argv[2])
