// A flat channel's message names the capture's channels that vary: the usual cause of a flat line is the wrong channel.
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { measureCapture } from '../../core/workflow/measure';
import { varyingChannelsNote } from '../../core/workflow/flatChannel';

/** A 5 MHz ring after a 1 µs flat lead-in in CH2 and CH3 (CH3 a tenth of CH2); CH1 holds one value. */
function threeChannels(): string {
  const lines = ['Time (s),CH1 (V),CH2 (V),CH3 (A)'];
  for (let i = 0; i < 800; i++) {
    const t = -1e-6 + i * 5e-9;
    const ring = t < 0 ? 0 : Math.exp(-t * 1.5e6) * Math.sin(2 * Math.PI * 5e6 * t) + 0.01 * Math.sin(i * 12.9898);
    lines.push(`${t.toExponential(6)},0.0010,${ring.toFixed(5)},${(ring / 10).toFixed(6)}`);
  }
  return `${lines.join('\n')}\n`;
}

const channel = (values: number[], name = 'x') => ({ name, values: Float64Array.from(values) });

describe('a flat channel names the channels that vary', () => {
  it('names every other channel that varies, and only those', () => {
    const flat = channel([2, 2, NaN, 2], 'A');
    expect(varyingChannelsNote(flat, [flat, channel([1, 1, 1], 'B'), channel([0, 1, 0], 'C')])).toBe("; channel 'C' of this capture varies: choose the channel to fit (--column)");
    expect(varyingChannelsNote(flat, [channel([0, 1], 'C'), channel([3, 1], 'D')])).toBe("; channels 'C' and 'D' of this capture vary: choose the channel to fit (--column)");
  });

  it('does not name a channel whose unit does not read, which cannot be fitted', () => {
    const flat = channel([2, 2, 2], 'CH1');
    const temperature = { ...channel([20, 21, 22], 'Temp'), unreadUnit: { message: "unit 'degC' is not recognised", line: 1 } };
    expect(varyingChannelsNote(flat, [temperature])).toBeNull();
    expect(varyingChannelsNote(flat, [temperature, channel([0, 1, 0], 'CH2')])).toBe("; channel 'CH2' of this capture varies: choose the channel to fit (--column)");
  });

  it('says nothing for a channel that varies, or when no other channel does', () => {
    expect(varyingChannelsNote(channel([0, 1], 'A'), [channel([0, 2], 'B')])).toBeNull();
    expect(varyingChannelsNote(channel([1, 1], 'A'), [channel([5, 5], 'B')])).toBeNull();
  });

  it("adds them to a flat channel's no-response message when measured", () => {
    const capture = parseCapture(threeChannels());
    const flat = selectChannel(capture);
    const { summary } = measureCapture({ file: 'three.csv', channel: flat, otherChannels: capture.channels });
    expect(summary.status).toBe('no-response');
    expect(summary.message).toContain("channels 'CH2' and 'CH3' of this capture vary");
    const ringing = measureCapture({ file: 'three.csv', channel: selectChannel(capture, 'CH2'), otherChannels: capture.channels });
    expect(ringing.summary.status).toBe('converged');
    expect(ringing.summary.message).not.toContain('of this capture vary');
  });
});
