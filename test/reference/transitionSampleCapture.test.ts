// Transition metrics of sample-captures/input-filter-step.csv (CH1) against an independent computation
// with numpy on the same samples and the same (fitted) state levels: the 10 % / 90 % reference-level
// instants by linear interpolation (IEEE Std 181-2011 definitions; clause numbers from memory) and the
// overshoot. Skips with a message when python3 with numpy is missing.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { summarizeTransitions } from '../../core/circuit/transitionSummary';
import { fitResponse } from '../../core/fit/fitResponse';
import { SAMPLE_DIR } from '../../sample-captures/sampleManifest';

const NUMPY_SCRIPT = `
import json, sys
import numpy as np
d = json.load(sys.stdin)
t = np.array(d["time"]); v = np.array(d["values"])
x = (v - d["initial"]) / (d["final"] - d["initial"])
after = t >= d["t0"]
def rising(level):
    # indices i with x[i-1] < level <= x[i], both samples at or after the event
    i = np.nonzero((x[:-1] < level) & (x[1:] >= level) & after[:-1])[0] + 1
    return i
def instant(i, level):
    return t[i-1] + (level - x[i-1]) / (x[i] - x[i-1]) * (t[i] - t[i-1])
i50 = rising(0.5)[0]
i10 = rising(0.1); i10 = i10[i10 <= i50][-1]
i90 = rising(0.9); i90 = i90[i90 >= i50][0]
i100 = rising(1.0)[0]
print(json.dumps({"t10": instant(i10, 0.1), "t90": instant(i90, 0.9), "overshoot": 100 * (x[i100:].max() - 1)}))
`;

function numpyAvailable(): boolean {
  const r = spawnSync('python3', ['-c', 'import numpy'], { encoding: 'utf8' });
  return r.status === 0;
}

const hasNumpy = numpyAvailable();
if (!hasNumpy) console.warn('transitionSampleCapture: python3 with numpy is not available; the independent check is skipped.');

describe('input-filter-step.csv CH1 transition metrics', () => {
  const capture = parseCapture(readFileSync(path.join(SAMPLE_DIR, 'input-filter-step.csv'), 'utf8'));
  const channel = selectChannel(capture, 'CH1');
  const fit = fitResponse({ time: channel.time, values: channel.values, unit: channel.unit });
  const summary = summarizeTransitions(channel, fit);

  it.skipIf(!hasNumpy)('rise time and overshoot agree with numpy on the same samples and levels (independent computation)', () => {
    const input = JSON.stringify({
      time: Array.from(channel.time),
      values: Array.from(channel.values),
      initial: summary.levels.initial,
      final: summary.levels.final,
      t0: summary.eventTime,
    });
    const run = spawnSync('python3', ['-c', NUMPY_SCRIPT], { input, encoding: 'utf8' });
    expect(run.status, run.stderr).toBe(0);
    const numpy = JSON.parse(run.stdout) as { t10: number; t90: number; overshoot: number };
    expect(summary.measured!.riseTime! / (numpy.t90 - numpy.t10)).toBeCloseTo(1, 9);
    expect(summary.measured!.overshoot!).toBeCloseTo(numpy.overshoot, 9);
  });

  // The sample maximum sits about 1 percentage point above the model here: noise at the peak, not the
  // levels. The parabola through the peak's samples must agree with the model within 3 standard errors.
  it('the measured peak overshoot agrees with the model overshoot, and the lift of the largest sample is flagged', () => {
    const measured = summary.measured!.peakOvershoot!;
    const model = summary.model!.overshoot;
    expect(summary.levelMethod).toBe('fitted model');
    expect(Math.abs(measured.value - model.value)).toBeLessThan(3 * Math.hypot(measured.stderr!, model.stderr!));
    expect(summary.warnings.join(' ')).toMatch(/noise lifts the largest sample/);
    // Standard second-order step-response relations (e.g. Ogata, Modern Control Engineering, ch. 5; from memory).
    const zeta = fit.zeta.value;
    expect(model.value).toBeCloseTo(100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)), 6);
    expect(summary.model!.peakTime!.value).toBeCloseTo(Math.PI / fit.omegaD!.value, 12);
  });
});
