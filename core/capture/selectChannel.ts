// Picks the channel to work on: by name first (exactly, then in any case), else by 0-based index; the first when not told.
// A channel whose unit could not be read is refused here, naming the channels that could be fitted instead.

import { CaptureError, type Capture, type Channel } from './types';

function available(capture: Capture): string {
  return capture.channels.map((c, i) => `${i}: '${c.name}'`).join(', ');
}

/** The channel the text names, exactly or else in any case; a name wins over an index ('1' is the channel named 1). */
function byName(capture: Capture, text: string): Channel | undefined {
  const wanted = text.trim();
  return capture.channels.find((c) => c.name === wanted) ?? capture.channels.find((c) => c.name.toLowerCase() === wanted.toLowerCase());
}

export function selectChannel(capture: Capture, selector?: string | number): Channel {
  if (capture.channels.length === 0) throw new CaptureError('the capture has no channels');
  if (selector === undefined) return withReadUnit(capture, capture.channels[0]);
  const named = byName(capture, String(selector));
  if (named) return withReadUnit(capture, named);
  if (typeof selector === 'number') {
    const channel = Number.isInteger(selector) ? capture.channels[selector] : undefined;
    if (!channel) {
      throw new CaptureError(`channel index ${selector} is out of range; available channels: ${available(capture)}`);
    }
    return withReadUnit(capture, channel);
  }
  throw new CaptureError(`no channel named '${selector}'; available channels: ${available(capture)}`);
}

/**
 * The channel, unless its header's unit could not be read: a channel fitted without its unit would be weighed for
 * no caution and reported in no unit, so it is refused, naming the channels of the capture whose units were read.
 */
export function withReadUnit(capture: Capture, channel: Channel): Channel {
  if (!channel.unreadUnit) return channel;
  const others = capture.channels.filter((c) => c.name !== channel.name && !c.unreadUnit).map((c) => `'${c.name}'`);
  const instead = others.length === 0 ? '' : `, or choose another channel with --column (${others.join(', ')})`;
  throw new CaptureError(`${channel.unreadUnit.message}${instead}`, channel.unreadUnit.line);
}
