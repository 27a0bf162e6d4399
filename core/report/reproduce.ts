// The command line that runs a logged fit again, from the record's settings.

import type { BenchRecord } from './benchRecord';

/** POSIX shell quoting: plain words stay as they are, anything else goes in single quotes. */
export function shellQuote(word: string): string {
  return /^[A-Za-z0-9_./:=,%+-]+$/.test(word) ? word : `'${word.replace(/'/g, `'\\''`)}'`;
}

/** `ringbench fit <capture> --column ... --known ...`: the same fit from the same file. */
export function reproduceCommand(record: BenchRecord): string {
  const s = record.settings;
  const words = ['ringbench', 'fit', record.capture.path];
  const option = (name: string, value: string | null) => {
    if (value !== null) words.push(`--${name}`, value);
  };
  option('column', s.column);
  option('sample-interval', s.sampleInterval);
  option('from', s.from);
  option('to', s.to);
  option('topology', s.topology);
  option('known', s.known);
  if (s.sortTime) words.push('--sort-time');
  // Stated only in records that asked for them (older records have none of these).
  option('time-unit', s.timeUnit ?? null);
  option('value-unit', s.valueUnit ?? null);
  option('segment', s.segment ?? null);
  option('event', s.event ?? null);
  option('probe-ratio', s.probeRatio ?? null);
  if (s.invert) words.push('--invert');
  if (s.jumpStart) words.push('--jump-start');
  option('modes', s.modes ?? null);
  // fit takes --mode only with a known part (a record checked against a design has none).
  option('mode', s.known === null ? null : (s.mode ?? null));
  option('scope-bandwidth', s.scopeBandwidth ?? null);
  option('probe-capacitance', s.probeCapacitance ?? null);
  option('ground-lead', s.groundLead ?? null);
  return words.map(shellQuote).join(' ');
}
