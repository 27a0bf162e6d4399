// Whole-number converter codes under a preamble stating their scale: converted when it says how, else kept as codes, said either way.

import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';

/** A table of codes under `preamble` lines, comma-separated unless `delimiter` says otherwise. */
function codes(preamble: string[], delimiter = ','): string {
  const time = (i: number) => (delimiter === ';' ? `${i},5E-6` : (i * 1e-6).toExponential(3));
  const rows = Array.from({ length: 30 }, (_, i) => `${time(i)}${delimiter}${Math.round(100 * Math.cos(i / 3))}`);
  return `${[...preamble, `Time (s)${delimiter}CH1`, ...rows].join('\n')}\n`;
}

function read(preamble: string[], delimiter = ',') {
  const capture = parseCapture(codes(preamble, delimiter));
  return { channel: capture.channels[0], warnings: capture.warnings.join('\n') };
}

describe('converter codes', () => {
  it('converts with a per-division scale written with its unit after the number', () => {
    const { channel, warnings } = read(['Vertical scale,200 mV/div', 'Codes per division,25']);
    expect(channel.unit).toBe('V');
    expect(channel.values[0]).toBeCloseTo(100 * 0.008, 12);
    expect(warnings).toMatch(/converted as code × 8 mV \+ 0 V, from 'Vertical scale' ÷ 'Codes per division'/);
  });

  it('converts a per-code scale in milliamperes, with decimal commas, to amperes', () => {
    const { channel, warnings } = read(['Scale per code (mA);0,5'], ';');
    expect(channel.unit).toBe('A');
    expect(channel.values[0]).toBeCloseTo(100 * 0.5e-3, 12);
    expect(warnings).toMatch(/code × 500 µA/);
  });

  it('adds an offset given in volts and says a unit was assumed when none is written', () => {
    const { channel, warnings } = read(['Volts per code,0.01', 'Offset,0.25 V']);
    expect(channel.values[0]).toBeCloseTo(1.25, 12);
    expect(warnings).toMatch(/code × 10 mV \+ 250 mV/);
    const bare = read(['LSB,0.01']);
    expect(bare.channel.unit).toBe('V');
    expect(bare.warnings).toMatch(/no unit stated: V assumed/);
  });

  it('keeps codes when the offset gives no unit, or the codes per division are missing, saying why', () => {
    const unitless = read(['Vertical scale (V/div),0.2', 'Codes per division,25', 'Vertical offset,1.5']);
    expect(unitless.channel.unit).toBe('');
    expect(unitless.channel.values[0]).toBe(100);
    expect(unitless.warnings).toMatch(/kept as codes, unscaled \(the offset 'Vertical offset' \(1.5\) gives no unit: volts or divisions\)/);
    expect(read(['Volts per code,about 8 mV']).warnings).toMatch(/kept as codes, unscaled/);
    expect(read(['Volts/div,0.2']).warnings).toMatch(/kept as codes, unscaled \(the preamble gives neither the value of one code nor the codes per division\)/);
  });

  it('takes no time-axis key for a vertical scale', () => {
    const { channel, warnings } = read(['Time/div,1e-6', 'Horizontal offset,0']);
    expect(channel.unit).toBe('');
    expect(warnings).not.toMatch(/converter codes/);
  });
});
