// What a capture's preamble says about how it was acquired: a bandwidth limit, and an acquisition mode that averages.

import { parseQuantityText } from '../units/parseQuantity';

export interface PreambleEntry {
  /** The key as written in the preamble. */
  key: string;
  value: string;
}

/** Keys that state a bandwidth: 'Bandwidth', 'BW Limit', 'Bandwidth Limit', 'CH1 BW' (any case). */
const BANDWIDTH_KEY = /band\s*width|(^|[^a-z])bw([^a-z]|$)/i;
/** Keys that state how samples were acquired: 'Acquisition Mode', 'Acq Mode', 'Mode', 'Acquire' (any case). */
const ACQUISITION_KEY = /acq|mode/i;
/**
 * Acquisition modes that average: high resolution (adjacent samples averaged into one, a boxcar low-pass),
 * averaging over acquisitions (with trigger jitter, a low-pass too), and their usual spellings: 'High Res',
 * 'HiRes', 'HIRES', 'Hi-Res', 'ERES', 'Average', 'AVERage', 'Averaging (16)', 'Avg', 'Boxcar', 'Smooth'.
 */
const AVERAGING_MODE = /hi(gh)?[\s_-]*res|\beres\b|aver|\bavg\b|boxcar|smooth/i;

/** The bandwidth the preamble states, Hz, with its entry; null when none is stated or it reads 'Full', 'Off', 'On'... */
export function statedBandwidth(metadata: Readonly<Record<string, string>>): (PreambleEntry & { hertz: number }) | null {
  for (const [key, value] of Object.entries(metadata)) {
    if (!BANDWIDTH_KEY.test(key)) continue;
    const hertz = readFrequency(value);
    if (hertz !== null) return { key, value, hertz };
  }
  return null;
}

/** The preamble's entry stating an averaging acquisition mode, or null. */
export function averagingAcquisition(metadata: Readonly<Record<string, string>>): PreambleEntry | null {
  for (const [key, value] of Object.entries(metadata)) {
    if (ACQUISITION_KEY.test(key) && AVERAGING_MODE.test(value)) return { key, value };
  }
  return null;
}

/** '20MHz', '200 MHz', '2.0E+08', '20M' as Hz; null for text that is no positive frequency. */
function readFrequency(text: string): number | null {
  try {
    const value = parseQuantityText(text.trim(), 'Hz');
    return value > 0 && Number.isFinite(value) ? value : null;
  } catch {
    return null;
  }
}
