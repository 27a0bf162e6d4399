// The report plot: min/max decimation, axis ticks, the SVG it draws and the redrawn fitted curve.
import { describe, expect, it } from 'vitest';
import { decimateMinMax } from '../../core/report/decimate';
import { axisTitle, scaleAxis } from '../../core/report/plotScale';
import { PLOT_COLORS, plotColumns, renderOverlayPlot } from '../../core/report/svgPlot';

describe('decimateMinMax', () => {
  it('keeps the extreme of every column, so a one-sample spike survives', () => {
    const n = 100_000;
    const x = Float64Array.from({ length: n }, (_, i) => i * 1e-9);
    const y = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 500));
    y[31_337] = 40; // spike
    y[77_777] = -40;
    const env = decimateMinMax(x, y, 0, x[n - 1], 500);
    expect(env.x.length).toBe(500);
    expect(Math.max(...env.max)).toBe(40);
    expect(Math.min(...env.min)).toBe(-40);
    for (let c = 0; c < env.x.length; c++) expect(env.min[c]).toBeLessThanOrEqual(env.max[c]);
    // Column centres are evenly spaced across the range.
    expect(env.x[1] - env.x[0]).toBeCloseTo(x[n - 1] / 500, 15);
  });

  it('leaves out empty columns, NaN samples and samples outside the range', () => {
    const x = [0, 1, 2, 9, 10, 11];
    const y = [1, Number.NaN, 3, 4, 5, 100];
    const env = decimateMinMax(x, y, 0, 10, 10);
    expect(Array.from(env.min)).toEqual([1, 3, 4]);
    expect(Array.from(env.max)).toEqual([1, 3, 5]);
  });
});

describe('scaleAxis', () => {
  it.each([
    { min: -2e-7, max: 1.8e-6, unit: 's', ticks: [0, 5e-7, 1e-6, 1.5e-6], labels: ['0.0', '0.5', '1.0', '1.5'], prefixed: 'µs' },
    { min: -3, max: 412, unit: 'V', ticks: [0, 100, 200, 300, 400], labels: ['0', '100', '200', '300', '400'], prefixed: 'V' },
    { min: 0.0021, max: 0.0119, unit: 'A', ticks: [0.004, 0.006, 0.008, 0.01], labels: ['4', '6', '8', '10'], prefixed: 'mA' },
    { min: -1.2, max: 1.2, unit: 'V', ticks: [-1, -0.5, 0, 0.5, 1], labels: ['-1.0', '-0.5', '0.0', '0.5', '1.0'], prefixed: 'V' },
  ])('from $min to $max in $unit', ({ min, max, unit, ticks, labels, prefixed }) => {
    const axis = scaleAxis(min, max, unit, 5);
    axis.ticks.forEach((t, i) => expect(t).toBeCloseTo(ticks[i], 15));
    expect(axis.ticks.length).toBe(ticks.length);
    expect(axis.labels).toEqual(labels);
    expect(axis.unit).toBe(prefixed);
  });

  it('labels a range far from zero from a round origin the title names, when asked', () => {
    // 8 µs of a logger's axis 1234.5 s in: without an origin every label would read 1.234500 (ks).
    const far = scaleAxis(1234.499999003, 1234.500006995, 's', 5, true);
    expect(far.origin).toBe('1.2345 ks');
    expect(far.unit).toBe('µs');
    expect(far.labels).toEqual(['0', '2', '4', '6']);
    far.ticks.forEach((t, i) => expect(t - 1234.5).toBeCloseTo(2 * i * 1e-6, 9));
    expect(axisTitle('Time', far)).toBe('Time − 1.2345 ks (µs)');
    // A 400 V bus ringing by 2 V.
    const bus = scaleAxis(399, 401.2, 'V', 5, true);
    expect(axisTitle('Voltage', bus)).toBe('Voltage − 400 V (V)');
    expect(bus.labels).toEqual(['-1.0', '-0.5', '0.0', '0.5', '1.0']);
    // Near zero, or not asked: labels count from 0 as before.
    expect(scaleAxis(-2e-7, 1.8e-6, 's', 5, true).origin).toBeNull();
    expect(axisTitle('Time', scaleAxis(-2e-7, 1.8e-6, 's', 5, true))).toBe('Time (µs)');
    expect(scaleAxis(399, 401.2, 'V', 5).origin).toBeNull();
  });
});

describe('renderOverlayPlot', () => {
  const x = Float64Array.from({ length: 200 }, (_, i) => i * 1e-8);
  const y = x.map((t) => Math.exp(-t * 2e6) * Math.cos(t * 3e7));
  const svg = renderOverlayPlot({
    id: 'u1-m1',
    title: 'SN<1> & "x"',
    width: 880,
    height: 320,
    xRange: [0, x[199]],
    yUnit: 'V',
    yLabel: 'CH1',
    measured: decimateMinMax(x, y, 0, x[199], plotColumns(880)),
    fit: { x, y },
    prediction: { x, y: y.map((v) => v * 1.1) },
    band: { x, lower: y.map((v) => v - 0.1), upper: y.map((v) => v + 0.1) },
  });

  it('draws measured data in neutral grey, the fit solid blue and the prediction dashed vermillion', () => {
    expect(svg).toMatch(new RegExp(`<polyline class="measured" points="[^"]+" fill="none" stroke="${PLOT_COLORS.measured}"`));
    expect(svg).toMatch(/<polyline class="fit" points="[^"]+" fill="none" stroke="#0072B2" stroke-width="1.8" stroke-linejoin/);
    expect(svg).toMatch(/<polyline class="prediction" points="[^"]+" fill="none" stroke="#D55E00" stroke-width="1.8" stroke-dasharray="7 4"/);
    expect(svg).toMatch(/<polygon class="band" points="[^"]+" fill="#D55E00" fill-opacity="0.14"/);
  });

  it('has engineering-notation axes, a legend and an escaped accessible title, and no grid', () => {
    expect(svg).toContain('time (µs)');
    expect(svg).toContain('CH1 (V)');
    expect(svg).toContain('aria-label="SN&lt;1&gt; &amp; &quot;x&quot;"');
    for (const label of ['measured', 'fit', 'design prediction', 'tolerance band']) expect(svg).toContain(`>${label}</text>`);
    expect(svg).not.toMatch(/grid/i);
    expect(svg).toMatch(/^<svg [^>]*width="880" height="320" viewBox="0 0 880 320"/);
  });

  it('keeps every point inside the view box', () => {
    for (const match of svg.matchAll(/points="([^"]+)"/g)) {
      for (const pair of match[1].split(' ')) {
        const [px, py] = pair.split(',').map(Number);
        expect(px).toBeGreaterThanOrEqual(0);
        expect(px).toBeLessThanOrEqual(880);
        expect(py).toBeGreaterThanOrEqual(0);
        expect(py).toBeLessThanOrEqual(320);
      }
    }
  });
});

