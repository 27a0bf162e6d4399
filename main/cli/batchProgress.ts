// The progress bar `batch` draws on stderr when it is a terminal: captures done, rate and time left, redrawn in place.

import type { CliIo } from './io';

const BAR_WIDTH = 24;

function clockText(seconds: number): string {
  const s = Math.round(seconds);
  const [h, m] = [Math.floor(s / 3600), Math.floor((s % 3600) / 60)];
  const ss = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

/** One line of progress, e.g. `[#########---------------]  45/120  3.2 captures/s  0:23 left`. */
export function progressLine(done: number, total: number, elapsedSeconds: number): string {
  const filled = total > 0 ? Math.round((BAR_WIDTH * done) / total) : BAR_WIDTH;
  const bar = `[${'#'.repeat(filled)}${'-'.repeat(BAR_WIDTH - filled)}]`;
  const count = `${String(done).padStart(String(total).length)}/${total}`;
  if (done >= total) return `${bar}  ${count}  done in ${clockText(elapsedSeconds)}`;
  const rate = done > 0 && elapsedSeconds > 0 ? done / elapsedSeconds : null;
  const rateText = rate === null ? '- captures/s' : `${rate.toPrecision(2)} captures/s`;
  const left = rate === null ? '-' : clockText((total - done) / rate);
  return `${bar}  ${count}  ${rateText}  ${left} left`;
}

export interface Progress {
  /** `done` captures finished: draw the bar again. */
  update(done: number): void;
  /** Write a line to stdout without tearing the bar. */
  print(text: string): void;
}

/**
 * A bar on stderr when it is a terminal, redrawn in place (io.redraw), or one line per update where the io cannot
 * redraw; nothing at all when stderr is no terminal (a pipe, a file, a job runner's log) or nothing is to be done.
 */
export function startProgress(io: CliIo, total: number, now: () => number = () => performance.now()): Progress {
  if (!io.interactive || total === 0) return { update: () => {}, print: (text) => io.out(text) };
  const { redraw } = io;
  const draw = redraw ? (text: string) => redraw(text) : (text: string) => io.err(`${text}\n`);
  const began = now();
  let line = progressLine(0, total, 0);
  draw(line);
  return {
    update(done) {
      line = progressLine(done, total, (now() - began) / 1000);
      draw(line);
      if (done >= total && redraw) io.err('\n');
    },
    print(text) {
      if (redraw) redraw('');
      io.out(text);
      if (redraw) redraw(line);
    },
  };
}
