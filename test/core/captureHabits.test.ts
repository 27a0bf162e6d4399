// The importer on every export habit of the generator: time axis, channel names and units, rows dropped, warnings.

import { describe, expect, it } from 'vitest';
import { createCaptureReader, parseCapture, parseCaptureFileBytes } from '../../core/capture/parseCapture';
import { fitResponse } from '../../core/fit/fitResponse';
import { RING, exportHabits, type ExportHabit } from '../fixtures/exportHabits';

/** Relative error allowed on the ring frequency fitted on jittered stamps (noise is only the 6-decimal rounding). */
const FIT_TOLERANCE = 0.01;

/** Relative agreement asked of times and values read back from text written to 7 significant digits. */
const CLOSE = 1e-6;

function close(actual: number, expected: number, scale: number): boolean {
  return Math.abs(actual - expected) <= CLOSE * Math.max(Math.abs(expected), scale);
}

function checkHabit(habit: ExportHabit): void {
  const capture = habit.bytes ? parseCaptureFileBytes(habit.bytes, habit.options) : parseCapture(habit.text, habit.options);
  const { expected } = habit;
  const warnings = capture.warnings.join('\n');
  expect(capture.channels.map((c) => ({ name: c.name, unit: c.unit })), warnings).toEqual(expected.channels);
  const [channel] = capture.channels;
  expect(channel.values.length).toBe(expected.samples);
  expect(channel.dropped).toBe(expected.dropped);
  const step = expected.step;
  expect(close(channel.time[0], expected.start, step), `first sample at ${channel.time[0]} s`).toBe(true);
  expect(close(channel.time[1] - channel.time[0], step, step), `step ${channel.time[1] - channel.time[0]} s`).toBe(true);
  if (expected.sampleInterval === null) expect(capture.sampleInterval).toBeNull();
  else expect(close(capture.sampleInterval ?? NaN, expected.sampleInterval, 0)).toBe(true);
  expected.firstValues.forEach((v, i) => expect(close(channel.values[i], v, 1e-6), `value ${i}`).toBe(true));
  if (expected.warning) expect(warnings).toMatch(expected.warning);
  const summary = capture.importSummary;
  expect(summary.segments.map(({ firstLine, lastLine, read }) => ({ firstLine, lastLine, read }))).toEqual(expected.segments ?? []);
  const ignored = expected.ignoredSections ?? [];
  expect(summary.ignoredSections.map(({ firstLine, lastLine }) => ({ firstLine, lastLine }))).toEqual(ignored.map(({ firstLine, lastLine }) => ({ firstLine, lastLine })));
  ignored.forEach((section, k) => expect(summary.ignoredSections[k].reason).toMatch(section.reason));
  const { note, ...encoding } = expected.encoding ?? { name: 'UTF-8', byteOrderMark: false };
  const read = capture.importSummary.encoding;
  expect({ name: read.name, byteOrderMark: read.byteOrderMark }).toEqual(encoding);
  if (note) expect(read.note).toMatch(note);
  else if (!habit.bytes) expect(read.note).toBeUndefined();
}

const habits = exportHabits();

describe('export habits', () => {
  it('covers at least 40 habits', () => {
    expect(habits.length).toBeGreaterThanOrEqual(40);
    expect(new Set(habits.map((h) => h.name)).size).toBe(habits.length);
  });

  for (const habit of habits) {
    if (habit.pending) it.todo(`${habit.name} (not yet read: ${habit.pending})`);
    else it(habit.name, () => checkHabit(habit));
  }
});

describe('jittered time stamps', () => {
  it('are fitted on the times as stamped: the ring frequency comes back', () => {
    const jittered = habits.filter((h) => h.name.startsWith('jittered'));
    expect(jittered.length).toBeGreaterThan(0);
    for (const habit of jittered) {
      const [channel] = parseCapture(habit.text).channels;
      const fit = fitResponse({ time: channel.time, values: channel.values, unit: channel.unit });
      expect(fit.status).not.toBe('failed');
      expect(Math.abs((fit.omegaD?.value ?? NaN) / RING.omegaD - 1), habit.name).toBeLessThan(FIT_TOLERANCE);
    }
  });
});

describe('bad rows', () => {
  it('are dropped and counted until too few samples are left; then the capture is refused naming the first data line', () => {
    const rows = Array.from({ length: 30 }, (_, i) => `${(i + 1) * 1e-6},${i < 12 ? 'N/A' : (i % 7) / 10 + 0.05}`);
    const text = `Time (s),CH1 (V)\n${rows.join('\n')}\n`;
    expect(() => parseCapture(text)).toThrow(/^line 2: no channel has at least 20 usable samples/);
    const kept = parseCapture(text.replaceAll('N/A', '0.5').replace('0.5', 'N/A'));
    expect(kept.channels[0].dropped).toBe(1);
  });
});

describe('line ends split between pieces', () => {
  it('read the same when the text is cut just after its first CR, or its first two (CR CR LF)', () => {
    for (const habit of habits.filter((h) => h.text.includes('\r'))) {
      const first = habit.text.indexOf('\r');
      for (const cut of [first + 1, first + 2]) {
        const reader = createCaptureReader(habit.options);
        reader.push(habit.text.slice(0, cut));
        reader.push(habit.text.slice(cut));
        expect(reader.finish(), `${habit.name}, cut at ${cut}`).toEqual(parseCapture(habit.text, habit.options));
      }
    }
  });
});
