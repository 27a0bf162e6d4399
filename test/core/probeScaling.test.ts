// The probe's ratio and polarity as typed (10, 10x, 10:1) and as applied to a channel's values.
import { describe, expect, it } from 'vitest';
import type { Channel } from '../../core/capture/types';
import { UsageError } from '../../core/inputError';
import { parseMeasureSettings } from '../../core/workflow/measureSettings';
import { applyProbe, parseProbeRatio } from '../../core/workflow/probeScaling';

const channel: Channel = { name: 'CH1', unit: 'V', time: Float64Array.of(0, 1, 2), values: Float64Array.of(0.1, -0.2, 4.8), clipped: Uint8Array.of(0, 0, 1), dropped: 0 };

describe('parseProbeRatio', () => {
  for (const [text, ratio] of [['10', 10], ['10x', 10], ['10 : 1', 10], ['0.5', 0.5], ['100X', 100], ['1e2', 100]] as const) {
    it(`reads '${text}' as ${ratio}`, () => expect(parseProbeRatio(text, '--probe-ratio')).toBe(ratio));
  }
  for (const text of ['0', '-10', '', 'ten', '10:2', 'Infinity']) {
    it(`refuses '${text}' naming the option`, () => {
      expect(() => parseProbeRatio(text, '--probe-ratio')).toThrow(UsageError);
      expect(() => parseProbeRatio(text, '--probe-ratio')).toThrow(`--probe-ratio '${text}'`);
    });
  }
});

describe('applyProbe', () => {
  it('multiplies the values, turns them over when inverted, and keeps time and clipping', () => {
    const scaled = applyProbe(channel, { ratio: 10, invert: true });
    expect(Array.from(scaled.values)).toEqual([-1, 2, -48]);
    expect(scaled.time).toBe(channel.time);
    expect(scaled.clipped).toBe(channel.clipped);
    expect(Array.from(channel.values)).toEqual([0.1, -0.2, 4.8]);
  });

  it('leaves the channel as it is without a probe, or with ratio 1 and no inversion', () => {
    expect(applyProbe(channel, undefined)).toBe(channel);
    expect(applyProbe(channel, { ratio: 1, invert: false })).toBe(channel);
  });
});

describe('parseMeasureSettings: probe', () => {
  it('gives no probe when neither option is given, and ratio 1 for --invert alone', () => {
    expect(parseMeasureSettings({}).probe).toBeUndefined();
    expect(parseMeasureSettings({ invert: true }).probe).toEqual({ ratio: 1, invert: true });
    expect(parseMeasureSettings({ probeRatio: '10:1' }).probe).toEqual({ ratio: 10, invert: false });
  });
});
