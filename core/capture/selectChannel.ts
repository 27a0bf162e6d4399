// Picks the channel to work on: by name (case-insensitive) or 0-based index; the first when not told.

import { CaptureError, type Capture, type Channel } from './types';

function available(capture: Capture): string {
  return capture.channels.map((c, i) => `${i}: '${c.name}'`).join(', ');
}

export function selectChannel(capture: Capture, selector?: string | number): Channel {
  if (capture.channels.length === 0) throw new CaptureError('the capture has no channels');
  if (selector === undefined) return capture.channels[0];
  if (typeof selector === 'number') {
    const channel = Number.isInteger(selector) ? capture.channels[selector] : undefined;
    if (!channel) {
      throw new CaptureError(`channel index ${selector} is out of range; available channels: ${available(capture)}`);
    }
    return channel;
  }
  const wanted = selector.trim().toLowerCase();
  const channel = capture.channels.find((c) => c.name.toLowerCase() === wanted);
  if (!channel) throw new CaptureError(`no channel named '${selector}'; available channels: ${available(capture)}`);
  return channel;
}
