// A channel without its isolated spikes, for the fit and what is judged from it; the cautions still weigh the raw samples.

import type { Channel } from '../capture/types';
import { isolatedSpikes, SPIKE_SIGMAS } from '../fit/isolatedSpikes';
import { formatEngineering } from '../units/format';

/** The channel with its isolated single-sample spikes (isolatedSpikes) left out, and a warning saying so; as it was when it holds none. */
export function withoutSpikes(channel: Channel): { channel: Channel; warning: string | null } {
  const spikes = isolatedSpikes(channel.values);
  if (spikes.length === 0) return { channel, warning: null };
  const n = channel.values.length;
  const keep = n - spikes.length;
  const time = new Float64Array(keep);
  const values = new Float64Array(keep);
  const clipped = new Uint8Array(keep);
  let k = 0;
  let next = 0;
  for (let i = 0; i < n; i++) {
    if (next < spikes.length && spikes[next] === i) {
      next++;
      continue;
    }
    time[k] = channel.time[i];
    values[k] = channel.values[i];
    clipped[k] = channel.clipped[i];
    k++;
  }
  const first = formatEngineering(channel.time[spikes[0]], 's');
  const count = spikes.length === 1 ? '1 isolated spike' : `${spikes.length} isolated spikes`;
  return {
    channel: { ...channel, time, values, clipped },
    warning:
      `${count} left out of the fit (the first at ${first}): single samples standing ${SPIKE_SIGMAS} or more noise deviations off both neighbours, ` +
      'which no response of the circuit makes (pickup or a glitch); the cautions still weigh them',
  };
}
