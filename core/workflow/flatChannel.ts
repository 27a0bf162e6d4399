// A flat channel's pointer to the capture's channels that vary: a channel holding one value is most often the wrong one chosen.

import type { Channel } from '../capture/types';

type NamedValues = Pick<Channel, 'name' | 'values' | 'unreadUnit'>;

/** Whether the channel's finite samples hold more than one value. */
function varies({ values }: NamedValues): boolean {
  let first = NaN;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (Number.isNaN(first)) first = v;
    else if (v !== first) return true;
  }
  return false;
}

/**
 * The words to add to a flat channel's message naming the capture's channels that vary, or null when the channel
 * varies or no other channel does. `others` are the capture's channels besides the one measured; one whose unit does
 * not read is not named, as it cannot be fitted (selectChannel.ts).
 */
export function varyingChannelsNote(channel: NamedValues, others: readonly NamedValues[]): string | null {
  if (varies(channel)) return null;
  const names = others.filter((c) => c.name !== channel.name && !c.unreadUnit && varies(c)).map((c) => `'${c.name}'`);
  if (names.length === 0) return null;
  const list = names.length === 1 ? `channel ${names[0]}` : `channels ${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
  return `; ${list} of this capture ${names.length === 1 ? 'varies' : 'vary'}: choose the channel to fit (--column)`;
}
