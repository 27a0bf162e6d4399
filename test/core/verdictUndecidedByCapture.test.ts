// A limit the design states that this capture's fit cannot decide gives no verdict (the capture's answer, exit 1 on the
// command line), where checkDesign alone refuses it as bad input; limits the capture does decide leave the verdict to run.
import { describe, expect, it } from 'vitest';
import type { Design } from '../../core/circuit/design';
import { undecidedByCapture } from '../../core/circuit/verdict';
import { quantity } from '../../core/quantity';
import type { FitSummary } from '../../core/report/fitSummary';
import { verdictRefusal } from '../../core/workflow/measure';

/** Series R 20 Ω, L 10 µH, C 1 µF (invented values): zeta 3.16, a slow root that dominates, so a single decay is comparable. */
const OVERDAMPED: Design = {
  format: 'ringbench-design',
  version: 1,
  name: 'damped clamp',
  topology: 'series',
  components: { R: { value: 20, tolerance: 0.05 }, L: { value: 10e-6, tolerance: 0.1 }, C: { value: 1e-6, tolerance: 0.02 } },
  source: { kind: 'step', amplitude: 12, initialLevel: 0 },
  probe: 'capacitor-voltage',
};

const stepMetrics = { model: { overshoot: quantity(1, 0.1, '%'), settlingTime2: quantity(5e-6, 1e-7, 's'), settlingTime5: quantity(4e-6, 1e-7, 's') }, reason: null };
/** What verdictRefusal reads of a fit summary. */
type Read = Pick<FitSummary, 'status' | 'tau' | 'alpha' | 'omega0' | 'transitions'>;

function ring(alpha: number, omega0: number, transitions: unknown = stepMetrics): Read {
  return { status: 'converged', alpha: quantity(alpha, 0.01 * Math.abs(alpha), 's^-1'), omega0: quantity(omega0, 1, 'rad/s'), transitions } as Read;
}

function singleDecay(tau: number): Read {
  return { status: 'converged', tau: quantity(tau, 0.005 * tau, 's'), alpha: quantity(NaN, null, 's^-1'), omega0: quantity(NaN, null, 'rad/s'), transitions: stepMetrics } as Read;
}

const limited = (limits: Design['limits']): Design => ({ ...OVERDAMPED, limits });

describe('no verdict when the capture cannot decide a limit the design states', () => {
  it('a single decay against zeta or f0 limits: tau alone is measured', () => {
    const refusal = verdictRefusal(limited({ zeta: { lower: 3, upper: 3.3 }, f0: { lower: 40e3, upper: 60e3 } }), singleDecay(20e-6), []);
    expect(refusal).toBe("this capture does not decide the design limits zeta, f0 (a single decay gives tau alone), so nothing was checked against 'damped clamp'");
  });

  it('a fit with no step metrics against a settling limit, with the fit’s own reason', () => {
    const ringdown = ring(1e5, 3e5, { model: null, reason: 'a ringdown about one level has no step' });
    expect(verdictRefusal(limited({ settlingTime5: { lower: null, upper: 1e-3 } }), ringdown, [])).toBe(
      "this capture does not decide the design limits settlingTime5 (a ringdown about one level has no step), so nothing was checked against 'damped clamp'",
    );
  });

  it('rates that are not positive against a part’s limits: no part is derived', () => {
    expect(undecidedByCapture(limited({ C: { lower: 0.9e-6, upper: 1.1e-6 } }), ring(-50, 3e5))).toMatch(/limits C \(the fitted alpha or omega0 is not positive, so no part is derived\)/);
  });

  it('both causes at once are named together', () => {
    const ringdown = ring(-50, 3e5, { model: null, reason: 'no step' });
    expect(undecidedByCapture(limited({ R: { lower: 1, upper: 30 }, overshoot: { lower: null, upper: 10 } }), ringdown)).toBe(
      "this capture does not decide the design limits R (the fitted alpha or omega0 is not positive, so no part is derived); overshoot (no step), so nothing was checked against 'damped clamp'",
    );
  });

  it('leaves the verdict to run when every limit is one the capture decides, or the design limits nothing', () => {
    expect(verdictRefusal(limited({ zeta: { lower: 3, upper: 3.3 }, C: { lower: 0.9e-6, upper: 1.1e-6 }, overshoot: { lower: null, upper: 10 } }), ring(1e6, 3.2e5), [])).toBeNull();
    expect(verdictRefusal(OVERDAMPED, ring(1e5, 3e5, { model: null, reason: 'no step' }), [])).toBeNull();
    expect(verdictRefusal(OVERDAMPED, singleDecay(20e-6), [])).toBeNull();
  });
});
