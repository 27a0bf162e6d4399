// Choosing the channel to work on: by name (any case), by 0-based index, or the first by default.

import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { CaptureError } from '../../core/capture/types';

const rows = Array.from({ length: 25 }, (_, i) => `${i * 1e-9},${i},${-i},${2 * i}`).join('\n');
const capture = parseCapture(`Time (s),Vgs (V),Vds (V),Id (A)\n${rows}`);

describe('selectChannel', () => {
  it.each([
    [undefined, 'Vgs'],
    [0, 'Vgs'],
    [2, 'Id'],
    ['Vds', 'Vds'],
    ['vDS', 'Vds'],
    ['  id ', 'Id'],
  ])('%s -> %s', (selector, name) => {
    expect(selectChannel(capture, selector).name).toBe(name);
  });

  it.each([
    [3, 'channel index 3 is out of range'],
    [-1, 'channel index -1 is out of range'],
    [0.5, 'channel index 0.5 is out of range'],
    ['CH4', "no channel named 'CH4'"],
    ['Time', "no channel named 'Time'"],
  ])('%s fails listing the channels', (selector, message) => {
    let caught: unknown;
    try {
      selectChannel(capture, selector);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(CaptureError);
    expect((caught as Error).message).toContain(message);
    expect((caught as Error).message).toContain("available channels: 0: 'Vgs', 1: 'Vds', 2: 'Id'");
  });
});

describe('selectChannel with channels named by numbers', () => {
  const numbered = Array.from({ length: 25 }, (_, i) => `${i * 1e-9},${i},${-i}`).join('\n');

  it.each([
    ['Time,1,2', '1', '1', 1],
    ['Time,1,2', '2', '2', -1],
    ['Time,1,2', 1, '1', 1],
    ['Time,1,2', 0, '1', 1],
    ['Time,2,1', '1', '1', -1],
    ['x-axis,1,2\nsecond,Volt,Volt', '1', '1', 1],
  ])('header %j: %j picks the channel named %j (names win over indexes)', (header, selector, name, sign) => {
    const channel = selectChannel(parseCapture(`${header}\n${numbered}`), selector);
    expect(channel.name).toBe(name);
    expect(Math.sign(channel.values[3])).toBe(sign);
  });
});

describe('a line of numbers above the data that names no time column is no names row', () => {
  it('keeps generic names, so an index picks by position', () => {
    const rows = Array.from({ length: 25 }, (_, i) => `${i * 1e-9},${i},${-i}`).join('\n');
    const capture = parseCapture(`Averages,1,2\n${rows}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['channel 1', 'channel 2']);
    expect(selectChannel(capture, 1).name).toBe('channel 2');
  });
});
