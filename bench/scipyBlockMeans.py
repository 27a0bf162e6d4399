"""The quick pipeline an engineer would script for a long record: numpy.loadtxt, block means, scipy.optimize.curve_fit.

Usage: python3 bench/scipyBlockMeans.py <capture.csv> <truth.json> <blocks>
Timed from outside as a whole process (interpreter start and imports included), as the command line is.
Prints one JSON line with the estimates, or one line starting with 'skipped:' when numpy or scipy is missing.
"""

import json
import sys

# The same model as the careful baseline (it prints the 'skipped:' line itself when numpy or scipy is missing).
from scipyBaseline import np, curve_fit, step_response


def main(capture_path, truth_path, blocks):
    with open(truth_path) as f:
        truth = json.load(f)
    p = truth["params"]
    exact = [p["t0"], p["yPre"], p["yFinal"], p["alpha"], truth["omegaD"]]
    start = [v * (1.01 if k % 2 == 0 else 0.99) for k, v in enumerate(exact)]
    data = np.loadtxt(capture_path, delimiter=",", skiprows=1)
    size = max(1, len(data) // blocks)
    usable = (len(data) // size) * size
    t = data[:usable, 0].reshape(-1, size).mean(axis=1)
    y = data[:usable, 1].reshape(-1, size).mean(axis=1)
    values, covariance = curve_fit(step_response, t, y, p0=start)
    stderr = np.sqrt(np.diag(covariance))
    print(json.dumps({"alpha": float(values[3]), "alphaStderr": float(stderr[3]), "omegaD": float(values[4]), "omegaDStderr": float(stderr[4])}))


if __name__ == "__main__":
    if len(sys.argv) != 4:
        print("usage: python3 bench/scipyBlockMeans.py <capture.csv> <truth.json> <blocks>", file=sys.stderr)
        sys.exit(2)
    main(sys.argv[1], sys.argv[2], int(sys.argv[3]))
