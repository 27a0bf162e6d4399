// The plot's pure parts: zoom and pan arithmetic, axis titles in the prefix shown, cursor readouts, the step's marks,
// and the one table of keys (no key bound twice, every plot command reachable).

import { describe, expect, it } from 'vitest';
import { keepWithin, paddedExtent, panBy, zoomAbout } from '../../renderer/plot/viewRange';
import { axisTicks } from '../../renderer/plot/axes';
import { cursorReadouts, placeCursors } from '../../renderer/plot/cursors';
import { transitionMarks } from '../../renderer/plot/markers';
import { SHORTCUTS, type PlotCommand } from '../../renderer/shortcuts';
import type { TransitionSummary } from '../../core/circuit/transitionSummary';
import { quantity } from '../../core/quantity';

describe('view ranges', () => {
  it('zooms about a point, which stays where it is', () => {
    const zoomed = zoomAbout([0, 10], 2.5, 0.5);
    expect(zoomed).toEqual([1.25, 6.25]);
    expect((2.5 - zoomed[0]) / (zoomed[1] - zoomed[0])).toBeCloseTo(0.25, 12);
  });

  it('never zooms below a ten-millionth of the span', () => {
    const [a, b] = zoomAbout([0, 1e-6], 5e-7, 1e-9, [0, 1e-3]);
    expect(b - a).toBeCloseTo(1e-10, 20);
  });

  it('pans by a share of the width and keeps a time view over the record', () => {
    expect(panBy([2, 4], 0.1)).toEqual([2.2, 4.2]);
    expect(keepWithin([-1, 1], [0, 10])).toEqual([0, 2]);
    expect(keepWithin([9.5, 10.5], [0, 10])).toEqual([9, 10]);
    expect(keepWithin([-5, 20], [0, 10])).toEqual([0, 10]);
    expect(keepWithin([3, 4], [0, 10])).toEqual([3, 4]);
  });

  it('pads the extent of the curves shown, and has none without values', () => {
    expect(paddedExtent([Float64Array.of(1, 3), [2, 5]], 0.25)).toEqual([0, 6]);
    expect(paddedExtent([[]], 0.1)).toBeNull();
    expect(paddedExtent([[2, 2]], 0.1)).toEqual([1.8, 2.2]);
  });
});

describe('axis titles', () => {
  it('name the quantity and the prefixed unit of the range shown', () => {
    expect(axisTicks([-100e-6, 900e-6], 's', 'Time', 800, 'x').title).toBe('Time (µs)');
    expect(axisTicks([-0.2e-3, 3.8e-3], 's', 'Time', 800, 'x').title).toBe('Time (ms)');
    expect(axisTicks([-0.02, 0.03], 'V', 'Residual', 120, 'y').title).toBe('Residual (mV)');
    expect(axisTicks([0, 80], 'V', 'Voltage', 400, 'y').title).toBe('Voltage (V)');
    expect(axisTicks([0, 0.004], '', 'Value', 400, 'y').title).toBe('Value (×1e-3)');
  });

  it('label the ticks in that prefix', () => {
    const ticks = axisTicks([0, 1e-3], 's', 'Time', 600, 'x');
    expect(ticks.title).toBe('Time (ms)');
    expect(ticks.ticktext).toEqual(['0.0', '0.2', '0.4', '0.6', '0.8', '1.0']);
    expect(ticks.tickvals[3]).toBeCloseTo(6e-4, 15);
  });
});

describe('cursor readouts', () => {
  it('read each cursor, Δt, 1/Δt and ΔV in engineering notation', () => {
    const shown = Object.fromEntries(cursorReadouts({ t1: 10e-6, t2: 30e-6, v1: 1.5, v2: 4 }, 'V').map((r) => [r.id, `${r.label} ${r.text}`]));
    expect(shown).toEqual({ t1: 'T1 10 µs', t2: 'T2 30 µs', dt: 'Δt 20 µs', rate: '1/Δt 50 kHz', v1: 'V1 1.5 V', v2: 'V2 4 V', dv: 'ΔV 2.5 V' });
  });

  it('read a current channel as I, and no rate for cursors on one time', () => {
    const shown = Object.fromEntries(cursorReadouts({ t1: 1e-3, t2: 1e-3, v1: 0, v2: 0.25 }, 'A').map((r) => [r.id, `${r.label} ${r.text}`]));
    expect(shown.rate).toBe('1/Δt —');
    expect(shown.dv).toBe('ΔI 250 mA');
  });

  it('are placed inside the view', () => {
    expect(placeCursors([0, 3], [-3, 3])).toEqual({ t1: 1, t2: 2, v1: -1, v2: 1 });
  });
});

describe('step marks', () => {
  const colors = { marker: '#a00', surface: '#fff', text: '#000' };
  const transitions = (overshoot: number, peakTime: number | null): TransitionSummary => ({
    reason: null,
    levelMethod: 'fitted model',
    levels: { initial: 0, final: 10 },
    eventTime: 1e-6,
    measured: null,
    model: {
      riseTime: quantity(2e-6, 1e-9, 's'),
      overshoot: quantity(overshoot, 0.1, '%'),
      peakTime: peakTime === null ? null : quantity(peakTime, 1e-9, 's'),
      settlingTime2: quantity(40e-6, 1e-8, 's'),
      settlingTime5: quantity(30e-6, 1e-8, 's'),
    },
    warnings: [],
  });

  it('put the overshoot at its peak and the settling time after the event', () => {
    const marks = transitionMarks(transitions(20, 5e-6), 1e-4, colors);
    expect(marks.positions).toEqual({ peakTime: 6e-6, peakLevel: 12, settledAt: 41e-6 });
    expect(marks.annotations.map((a) => a.text)).toEqual(['overshoot 20.0 %<br>peak time 5 µs', 'settling time (2 %) 40 µs']);
  });

  it('mark no peak without overshoot, and nothing without a step', () => {
    expect(transitionMarks(transitions(0, null), 1e-4, colors).positions.peakTime).toBeNull();
    expect(transitionMarks({ ...transitions(20, 5e-6), reason: 'a ringdown about one level', model: null }, 1e-4, colors).annotations).toEqual([]);
    expect(transitionMarks(undefined, 1e-4, colors).shapes).toEqual([]);
  });
});

describe('the table of keys', () => {
  it('binds no key twice', () => {
    const bound = SHORTCUTS.flatMap((s) => s.keys.map((k) => `${s.zone === 'menu' ? 'ctrl+' : ''}${k}:${s.shift}`));
    expect(new Set(bound).size).toBe(bound.length);
  });

  it('reaches every plot command', () => {
    const commands: PlotCommand[] = ['pan-earlier', 'pan-later', 'zoom-in-time', 'zoom-out-time', 'zoom-in-level', 'zoom-out-level', 'whole-capture', 'toggle-cursors', 'toggle-markers'];
    for (const command of commands) expect(SHORTCUTS.some((s) => s.command === command)).toBe(true);
  });
});
