// A probe's attenuation and polarity applied to one channel's values before the fit: the scope recorded what
// reached its input, the node saw `ratio` times that, with the sign flipped when the probe is connected reversed.

import type { Channel } from '../capture/types';
import { UsageError } from '../inputError';

export interface ProbeScaling {
  /** Every value is multiplied by this (10 for a 10:1 probe the scope read as 1:1). */
  ratio: number;
  /** The probe is connected the other way round: every value changes sign. */
  invert: boolean;
}

/** '10', '10x', '10:1' or '0.5' as a positive, finite multiplier; `option` names the flag or field in the message. */
export function parseProbeRatio(text: string, option: string): number {
  const match = /^\s*([0-9]*\.?[0-9]+(?:e[-+]?\d+)?)\s*(?:x|:\s*1)?\s*$/i.exec(text);
  const ratio = match ? Number(match[1]) : NaN;
  if (!(ratio > 0) || !Number.isFinite(ratio)) {
    throw new UsageError(`${option} '${text}': expected a positive attenuation such as 10, 10x or 10:1 (each value is multiplied by it)`);
  }
  return ratio;
}

/** The channel as the node saw it; the same channel when nothing is to change. */
export function applyProbe(channel: Channel, probe: ProbeScaling | undefined): Channel {
  if (!probe || (probe.ratio === 1 && !probe.invert)) return channel;
  const factor = probe.invert ? -probe.ratio : probe.ratio;
  return { ...channel, values: channel.values.map((v) => v * factor) };
}
