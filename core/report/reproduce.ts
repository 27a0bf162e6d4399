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
  return words.map(shellQuote).join(' ');
}
