// Units as people type them, in column headers and in a preamble's sample interval: read to SI, or refused by name.
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { CaptureError } from '../../core/capture/types';
import { UsageError } from '../../core/inputError';
import { parseStatedUnit } from '../../core/units/unitText';

const N = 30;
/** Relative tolerance for a number scaled once to SI. */
const REL = 1e-12;

/** Time spellings and their scale to seconds. */
const TIME_UNITS: [string, number][] = [
  ['s', 1],
  ['ms', 1e-3],
  ['us', 1e-6],
  ['\u00b5s', 1e-6],
  ['\u03bcs', 1e-6],
  ['ns', 1e-9],
  ['ps', 1e-12],
  ['uS', 1e-6],
  ['nS', 1e-9],
  ['mSec', 1e-3],
  ['NS', 1e-9],
  ['nsecs', 1e-9],
  ['usec', 1e-6],
  ['microseconds', 1e-6],
  ['Sec', 1],
  ['seconds', 1],
  // Minutes, hours and days: accepted for use with the SI (SI Brochure, 9th edition, 2019, table 8).
  ['min', 60],
  ['Min', 60],
  ['minutes', 60],
  ['h', 3600],
  ['hr', 3600],
  ['Hours', 3600],
  ['d', 86400],
];

/** Value spellings, their scale to SI and the SI unit. */
const VALUE_UNITS: [string, number, string][] = [
  ['V', 1, 'V'],
  ['mV', 1e-3, 'V'],
  ['\u00b5V', 1e-6, 'V'],
  ['uV', 1e-6, 'V'],
  ['kV', 1e3, 'V'],
  ['A', 1, 'A'],
  ['mA', 1e-3, 'A'],
  ['\u00b5A', 1e-6, 'A'],
  ['uA', 1e-6, 'A'],
];

const values = Array.from({ length: N }, (_, i) => 1 + ((i * 7) % 5));

/** Rows 't,v' with t = 10, 11, 12... in the header's unit. */
function timedRows(): string {
  return values.map((v, i) => `${10 + i},${v}`).join('\n');
}

function close(actual: number, expected: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(REL * Math.abs(expected));
}

function captureError(run: () => unknown): CaptureError {
  try {
    run();
  } catch (error) {
    if (error instanceof CaptureError) return error;
    throw error;
  }
  throw new Error('expected a CaptureError');
}

describe('time units in a column header', () => {
  const forms: [string, (unit: string) => string][] = [
    ['Time (unit)', (u) => `Time (${u})`],
    ['Time[unit]', (u) => `Time[${u}]`],
    ['time_unit', (u) => `time_${u}`],
    ['Time in unit', (u) => `Time in ${u}`],
    ['in unit', (u) => `in ${u}`],
    ['"Time, unit"', (u) => `"Time, ${u}"`],
  ];
  for (const [form, heading] of forms) {
    it.each(TIME_UNITS)(`${form} with '%s' gives the axis in s`, (unit, scale) => {
      const capture = parseCapture(`${heading(unit)},CH1(V)\n${timedRows()}`);
      const { time } = capture.channels[0];
      close(time[0], 10 * scale);
      close(capture.sampleInterval as number, scale);
      expect(capture.warnings).toEqual([]);
    });
  }
});

describe('time units of a sample-interval line', () => {
  const body = `CH1 (V)\n${values.join('\n')}`;
  it.each(TIME_UNITS)("'Sample Interval,2 %s' gives the interval in s", (unit, scale) => {
    const capture = parseCapture(`Sample Interval,2 ${unit}\n${body}`);
    close(capture.sampleInterval as number, 2 * scale);
    expect(capture.channels[0].time[0]).toBe(0);
    close(capture.channels[0].time[N - 1], (N - 1) * 2 * scale);
  });

  it.each(TIME_UNITS)("'XIncrement (%s): 2' gives the interval in s", (unit, scale) => {
    const capture = parseCapture(`XIncrement (${unit}): 2\n${body}`);
    close(capture.sampleInterval as number, 2 * scale);
  });

  it.each(['samples', 'Points', '#'])("a time column counting in '%s' is a sample index: the axis comes from the interval", (unit) => {
    const rows = values.map((v, i) => `${i},${v}`).join('\n');
    const capture = parseCapture(`Sample Interval,2 ns\nTime (${unit}),CH1 (V)\n${rows}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['CH1']);
    close(capture.sampleInterval as number, 2e-9);
    close(capture.channels[0].time[N - 1], (N - 1) * 2e-9);
  });
});

describe('value units in a column header', () => {
  const forms: [string, (unit: string) => string][] = [
    ['CH1 (unit)', (u) => `CH1 (${u})`],
    ['CH1(unit)', (u) => `CH1(${u})`],
    ['CH1 [unit]', (u) => `CH1 [${u}]`],
    ['CH1_unit', (u) => `CH1_${u}`],
    ['CH1 in unit', (u) => `CH1 in ${u}`],
    ['"CH1, unit"', (u) => `"CH1, ${u}"`],
  ];
  for (const [form, heading] of forms) {
    // A one-letter suffix stays part of the name ('V_C', 'I_A'): the '_unit' form is read from two letters on.
    const units = form.includes('_') ? VALUE_UNITS.filter(([unit]) => unit.length >= 2) : VALUE_UNITS;
    it.each(units)(`${form} with '%s' gives SI values`, (unit, scale, si) => {
      const capture = parseCapture(`Time (s),${heading(unit)}\n${timedRows()}`);
      const channel = capture.channels[0];
      expect(channel.name).toBe('CH1');
      expect(channel.unit).toBe(si);
      values.forEach((v, i) => close(channel.values[i], v * scale));
    });
  }
});

describe("the word for time in an export set to another language names the time column", () => {
  it.each(['Temps', 'Tiempo', 'Zeit', 'Tempo', 'Tijd', 'Tid', 'Czas', 'Aika', '\u0412\u0440\u0435\u043c\u044f', '\u65f6\u95f4', '\u6642\u9593'])("'%s'", (name) => {
    const capture = parseCapture(`${name},CH1 (V)\n${timedRows()}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['CH1']);
    close(capture.channels[0].time[1], 11);
  });
});

describe("a circuit simulator's probe heading gives its quantity's unit and keeps the node in the name", () => {
  it.each([
    ['V(out)', 'V(out)', 'V', 1],
    ['v(n001)', 'v(n001)', 'V', 1],
    ['I(L1)', 'I(L1)', 'A', 1],
    ['i(vsense)', 'i(vsense)', 'A', 1],
    // A unit in the brackets is the unit of a channel named by the letter.
    ['V(mV)', 'V', 'V', 1e-3],
    ['I(mA)', 'I', 'A', 1e-3],
  ])("'%s'", (heading, name, unit, scale) => {
    const capture = parseCapture(`time\t${heading}\n${values.map((v, i) => `${i * 1e-9}\t${v}`).join('\n')}`);
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([[name, unit]]);
    close(capture.channels[0].values[2], values[2] * scale);
  });
});

describe("a comma before a word that is no unit leaves the heading a name", () => {
  it.each(['"Probe A, B"', '"Node, out"'])("%s is a channel's name, without a unit", (heading) => {
    const capture = parseCapture(`Time (s),${heading}\n${timedRows()}`);
    expect(capture.channels[0].name).toBe(heading.slice(1, -1));
    expect(capture.channels[0].unit).toBe('');
  });
});

describe("'in' before a word that is no unit leaves the heading a name", () => {
  it.each(['Plug in A2', 'Log in', 'Sign in ok'])("'%s' is a channel's name, without a unit", (heading) => {
    const capture = parseCapture(`Time (s),${heading}\n${timedRows()}`);
    expect(capture.channels[0].name).toBe(heading);
    expect(capture.channels[0].unit).toBe('');
  });
});

// A channel's unread unit is refused when that channel is chosen (selectChannel), a time column's as the file is read.
describe('a unit that cannot be read is refused, naming where and the option', () => {
  it.each(['dBV', 'dBm', 'dB'])("'CH1 (%s)' is a level in decibels: refused as no linear value, on its line", (unit) => {
    const error = captureError(() => selectChannel(parseCapture(`Time (s),CH1 (${unit})\n${timedRows()}`)));
    expect(error.line).toBe(1);
    expect(error.message).toContain(`unit '${unit}' is a level in decibels, and a response is fitted to linear values`);
  });

  it.each(['MS', 'Ms', 'MSec'])("'Time (%s)' is ambiguous: --time-unit", (unit) => {
    const error = captureError(() => parseCapture(`Time (${unit}),CH1 (V)\n${timedRows()}`));
    expect(error.line).toBe(1);
    expect(error.message).toContain(`column 'Time (${unit})'`);
    expect(error.message).toContain(`'${unit}' is ambiguous`);
    expect(error.message).toContain('--time-unit');
  });

  it("'Sample Interval,2 MS' is ambiguous: --time-unit, on its line", () => {
    const error = captureError(() => parseCapture(`# scope\nSample Interval,2 MS\nCH1 (V)\n${values.join('\n')}`));
    expect(error.line).toBe(2);
    expect(error.message).toMatch(/^line 2: 'Sample Interval': unit 'MS' is ambiguous .*--time-unit/);
  });

  it.each([
    ['Time (furlongs),CH1 (V)', "column 'Time (furlongs)'", "'furlongs'", '--time-unit'],
    ['Time (\u00b5x),CH1 (V)', "column 'Time (\u00b5x)'", "'\u00b5x'", '--time-unit'],
    ['Time (s),CH1 (furlongs)', "column 'CH1 (furlongs)'", "'furlongs'", '--value-unit'],
    ['Time (s),CH1 (\u00b5x)', "column 'CH1 (\u00b5x)'", "'\u00b5x'", '--value-unit'],
    ['Time (s),CH1 (\u0007)', "column 'CH1 (\\x07)'", "'\\x07'", '--value-unit'],
    ['Time (V),CH1 (V)', "column 'Time (V)'", "'V' is not a unit of time", '--time-unit'],
  ])("'%s' is refused", (header, column, unit, option) => {
    const error = captureError(() => selectChannel(parseCapture(`${header}\n${timedRows()}`)));
    expect(error.line).toBe(1);
    expect(error.message).toContain(column);
    expect(error.message).toContain(unit);
    expect(error.message).toContain(option);
    expect(error.message).not.toMatch(/[\u0000-\u001f]/);
  });

  it.each([
    ['Sample Interval,2 furlongs', "'furlongs'"],
    ['Sample Interval: 2 \u00b5x', "'\u00b5x'"],
    ['dt [\u0001],2', "'\\x01'"],
  ])("'%s' is refused on its line with --time-unit", (line, unit) => {
    const error = captureError(() => parseCapture(`${line}\nCH1 (V)\n${values.join('\n')}`));
    expect(error.line).toBe(1);
    expect(error.message).toContain(unit);
    expect(error.message).toContain('--time-unit');
    expect(error.message).not.toMatch(/[\u0000-\u001f]/);
  });

  it('a column without a unit keeps being read as written (time in s), with a note', () => {
    const capture = parseCapture(`Time,CH1\n${timedRows()}`);
    expect(capture.channels[0].time[0]).toBe(10);
    expect(capture.channels[0].unit).toBe('');
    expect(capture.channels[0].values[0]).toBe(values[0]);
    expect(capture.warnings).toEqual(["time column 'Time' states no unit and was read as seconds; state another unit with --time-unit"]);
  });

  it('a label in brackets is no unit', () => {
    const capture = parseCapture(`XIncrement (CH1),2e-9\nTime (s),Vout (CH 1),Vin (10x probe)\n${values.map((v, i) => `${i * 1e-9},${v},${v}`).join('\n')}`);
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([
      ['Vout', ''],
      ['Vin', ''],
    ]);
    expect(capture.warnings.join('\n')).not.toContain('unit');
  });

  it('a date or clock time after a start key is no unit', () => {
    const capture = parseCapture(`Start Time,2024-03-14 09:26:05\nSample Interval,1e-6\nCH1 (V)\n${values.join('\n')}`);
    expect(capture.sampleInterval).toBe(1e-6);
    expect(capture.channels[0].time[0]).toBe(0);
  });
});

describe("a channel whose unit cannot be read is kept beside the others, and refused only when it is chosen", () => {
  const rows = values.map((v, i) => `${i * 1e-6},${v},${2 * v}`).join('\n');

  it.each([
    ['Temp (degC)', "unit 'degC' is not recognised"],
    ['MATH (VV)', "unit 'VV' is not recognised"],
    ['FFT (dBV)', "unit 'dBV' is a level in decibels"],
  ])("'%s' beside CH1 (V): CH1 is read in V and chosen by name; the other is named in a note and refused", (heading, why) => {
    const capture = parseCapture(`Time (s),${heading},CH1 (V)\n${rows}`);
    expect(capture.channels.map((c) => c.unit)).toEqual(['', 'V']);
    expect(capture.channels[0].values[0]).toBe(values[0]);
    expect(capture.warnings.join('\n')).toContain(`column '${heading}': ${why}`);
    expect(selectChannel(capture, 'CH1').values[1]).toBe(2 * values[1]);
    const error = captureError(() => selectChannel(capture));
    expect(error.line).toBe(1);
    expect(error.message).toContain(`column '${heading}': ${why}`);
    expect(error.message).toContain("or choose another channel with --column ('CH1')");
  });

  it("a units row with one unit that does not read ('(VV)') keeps the names above it, and names its own line", () => {
    const capture = parseCapture(`TIME,CH1,MATH\n(s),(V),(VV)\n${rows}`);
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([
      ['CH1', 'V'],
      ['MATH', ''],
    ]);
    const error = captureError(() => selectChannel(capture, 'MATH'));
    expect(error.line).toBe(2);
    expect(error.message).toContain("column 'MATH': unit 'VV' is not recognised");
    const time = captureError(() => parseCapture(`Time,CH1\n(furlongs),(V)\n${timedRows()}`));
    expect(time.line).toBe(2);
    expect(time.message).toContain("column 'Time': unit 'furlongs' is not recognised; state the time unit with --time-unit");
  });

  it('a stated value unit reads every channel, that one too', () => {
    const capture = parseCapture(`Time (s),Temp (degC),CH1 (V)\n${rows}`, { valueUnit: parseStatedUnit('mV', false, '--value-unit') });
    expect(selectChannel(capture).values[0]).toBeCloseTo(values[0] * 1e-3, 15);
  });

  it("a time name heading another unit ('T (degC)') is a channel beside a plain time column", () => {
    const capture = parseCapture(`Time (s),T (degC),CH1 (V)\n${rows}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['T', 'CH1']);
    close(capture.channels[1].time[1], 1e-6);
    expect(captureError(() => selectChannel(capture)).message).toContain('--value-unit');
  });

  it('a lone time column heading a unit that is not of time is still refused as the time column', () => {
    const error = captureError(() => parseCapture(`T (degC),CH1 (V)\n${values.map((v, i) => `${i},${v}`).join('\n')}`));
    expect(error.message).toContain("column 'T (degC)'");
    expect(error.message).toContain('--time-unit');
  });

  it("a header's text that names a property of every object ('constructor') is no unit", () => {
    const error = captureError(() => selectChannel(parseCapture(`Time (s),CH1 (constructor)\n${timedRows()}`)));
    expect(error.message).toContain("unit 'constructor' is not recognised");
    expect(captureError(() => parseCapture(`Time (hasOwnProperty),CH1 (V)\n${timedRows()}`)).message).toContain('is not recognised');
  });
});

describe('a time column that states no unit is read as seconds, with a note', () => {
  const timeUnit = (text: string) => parseStatedUnit(text, true, '--time-unit');
  // Times written '10.0' (not '10'): a headerless 'whole number,digit' row would read as one number with a decimal comma.
  const rows = values.map((v, i) => `${10 + i}.0,${v}`).join('\n');

  it.each([
    ['t,v', "time column 't' states"],
    ['Time,CH1 (V)', "time column 'Time' states"],
    ['', 'time column 1 states'],
  ])("'%s': the note names the column and --time-unit, in the import summary too", (header, named) => {
    const capture = parseCapture(`${header === '' ? '' : `${header}\n`}${rows}`);
    close(capture.channels[0].time[1], 11);
    expect(capture.warnings).toEqual([`${named} no unit and was read as seconds; state another unit with --time-unit`]);
    expect(capture.importSummary.warnings).toEqual(capture.warnings);
    expect(capture.importSummary.time).toMatchObject({ kind: 'column', unit: '' });
  });

  it('time/value pairs: one note naming every time column without a unit', () => {
    const rows = values.map((v, i) => `${i},${v},${i + 0.5},${-v},${i},${v}`).join('\n');
    const capture = parseCapture(`TimeA,A,TimeB,B,Time (s),C\n${rows}`);
    expect(capture.warnings).toEqual([
      "time columns 'TimeA' and 'TimeB' state no unit and were read as seconds; state another unit with --time-unit",
    ]);
  });

  it('no note when the unit comes from the header, a units row or timeUnit', () => {
    const stated = [
      parseCapture(`Time (us),CH1 (V)\n${rows}`),
      parseCapture(`Time,CH1\n(us),(V)\n${rows}`),
      parseCapture(`(us),(V)\n${rows}`),
      parseCapture(`Time,CH1\n${rows}`, { timeUnit: timeUnit('us') }),
      parseCapture(rows, { timeUnit: timeUnit('us') }),
    ];
    for (const capture of stated) {
      close(capture.channels[0].time[1], 11e-6);
      expect(capture.warnings).toEqual([]);
      expect(capture.importSummary.time).toMatchObject({ kind: 'column', unit: 'µs' });
    }
  });

  it('no note for an axis built from a sample interval, nor for a headerless first column read as a channel', () => {
    const capture = parseCapture(values.map((v) => `${v},${-v}`).join('\n'), { sampleInterval: 1e-6 });
    expect(capture.channels.map((c) => c.name)).toEqual(['channel 1', 'channel 2']);
    expect(capture.warnings).toEqual([]);
  });
});

describe('a sample interval stated without a unit is read as seconds, with a note', () => {
  const timeUnit = (text: string) => parseStatedUnit(text, true, '--time-unit');
  const column = values.join('\n');
  const note = (key: string, line: number): string =>
    `the sample interval '${key}' on line ${line} states no unit and was read as seconds; state another unit with --time-unit`;

  it.each([
    ['delta t,2.000000E-6', 'delta t', 1, 2e-6],
    ['Record Length,20\nSample Interval,2e-7', 'Sample Interval', 2, 2e-7],
  ])("'%s': the note names the line and --time-unit, in the import summary too", (preamble, key, line, interval) => {
    const capture = parseCapture(`${preamble}\n${column}`);
    expect(capture.sampleInterval).toBeCloseTo(interval, 18);
    expect(capture.warnings).toEqual([note(key, line)]);
    expect(capture.importSummary.warnings).toEqual(capture.warnings);
  });

  it('no note when the line, the preamble or timeUnit states the unit, or the sampleInterval option gives the interval', () => {
    const stated = [
      parseCapture(`Sample Interval,2e-7,s\n${column}`),
      parseCapture(`Sample Interval (us),0.2\n${column}`),
      parseCapture(`Horizontal Units,s\nSample Interval,2e-7\n${column}`),
      parseCapture(`Sample Interval,0.2\n${column}`, { timeUnit: timeUnit('us') }),
      parseCapture(`Sample Interval,2e-7\n${column}`, { sampleInterval: 2e-7 }),
      parseCapture(column, { sampleInterval: 2e-7 }),
    ];
    for (const capture of stated) {
      expect(capture.sampleInterval).toBeCloseTo(2e-7, 18);
      expect(capture.warnings).toEqual([]);
    }
  });

  it('a start time stated without a unit is named too, with the interval or alone; a start of 0 needs no unit', () => {
    const both = parseCapture(`Sample Interval,2e-7\nX Origin,-1e-6\n${column}`);
    expect(both.channels[0].time[0]).toBeCloseTo(-1e-6, 18);
    expect(both.warnings).toEqual([
      "the sample interval 'Sample Interval' on line 1 and the start time 'X Origin' on line 2 state no unit and were read as seconds; state another unit with --time-unit",
    ]);
    const startOnly = parseCapture(`Sample Interval,2e-7,s\nX Origin,-1e-6\n${column}`);
    expect(startOnly.warnings).toEqual(["the start time 'X Origin' on line 2 states no unit and was read as seconds; state another unit with --time-unit"]);
    expect(parseCapture(`Sample Interval,2e-7,s\nX Origin,0\n${column}`).warnings).toEqual([]);
    expect(parseCapture(`Sample Interval,2e-7,s\nX Origin,-1,us\n${column}`).warnings).toEqual([]);
    // A preamble's time unit reads both, with its own note.
    expect(parseCapture(`Horizontal Units,us\nSample Interval,0.2\nX Origin,-1\n${column}`).warnings.join('\n')).not.toContain('read as seconds');
  });
});

describe('the stated units fix each refusal', () => {
  const timeUnit = (text: string) => parseStatedUnit(text, true, '--time-unit');
  const valueUnit = (text: string) => parseStatedUnit(text, false, '--value-unit');

  it('timeUnit reads an ambiguous or unknown time column, with a note', () => {
    for (const unit of ['MS', 'furlongs']) {
      const capture = parseCapture(`Time (${unit}),CH1 (V)\n${timedRows()}`, { timeUnit: timeUnit('ms') });
      close(capture.channels[0].time[0], 10e-3);
      expect(capture.warnings.join('\n')).toContain(`'${unit}' is replaced by --time-unit ms`);
    }
  });

  it('timeUnit reads a stated interval, and a time column without a unit, silently', () => {
    const interval = parseCapture(`Sample Interval,2 MS\nCH1 (V)\n${values.join('\n')}`, { timeUnit: timeUnit('ms') });
    close(interval.sampleInterval as number, 2e-3);
    expect(interval.warnings.join('\n')).toContain("'MS' of 'Sample Interval' is replaced by --time-unit ms");
    const bare = parseCapture(`Time,CH1 (V)\n${timedRows()}`, { timeUnit: timeUnit('us') });
    close(bare.channels[0].time[0], 10e-6);
    expect(bare.warnings).toEqual([]);
  });

  it('timeUnit scales a headerless time column; valueUnit its channel', () => {
    const rows = values.map((v, i) => `${10 + 2.5 * i},${v}`).join('\n');
    const capture = parseCapture(rows, { timeUnit: timeUnit('ns'), valueUnit: valueUnit('mA') });
    close(capture.channels[0].time[1], 12.5e-9);
    expect(capture.channels[0].unit).toBe('A');
    close(capture.channels[0].values[0], values[0] * 1e-3);
  });

  it('valueUnit reads an unknown channel unit, with a note', () => {
    const capture = parseCapture(`Time (s),CH1 (\u00b5x)\n${timedRows()}`, { valueUnit: valueUnit('mV') });
    expect(capture.channels[0].unit).toBe('V');
    close(capture.channels[0].values[0], values[0] * 1e-3);
    expect(capture.warnings.join('\n')).toContain("column 'CH1 (\u00b5x)': its unit '\u00b5x' is replaced by --value-unit mV");
  });

  it('the same unit stated as the file has it gives no note', () => {
    const capture = parseCapture(`Time (us),CH1 (mV)\n${timedRows()}`, { timeUnit: timeUnit('\u00b5s'), valueUnit: valueUnit('mv') });
    expect(capture.warnings).toEqual([]);
  });

  it.each([
    ['MS', true, "--time-unit 'MS': unit 'MS' is ambiguous"],
    ['furlongs', true, "--time-unit 'furlongs': unit 'furlongs' is not recognised"],
    ['mV', true, "--time-unit 'mV': unit 'mV' is not a unit of time"],
    ['us', false, "--value-unit 'us': unit 'us' is a unit of time"],
    ['\u0007', false, "--value-unit '\\x07'"],
  ])("a stated unit '%s' that cannot be used is a UsageError naming the option", (text, isTime, message) => {
    const option = isTime ? '--time-unit' : '--value-unit';
    expect(() => parseStatedUnit(text, isTime, option)).toThrow(UsageError);
    expect(() => parseStatedUnit(text, isTime, option)).toThrow(message);
  });
});

describe('the time unit a preamble states for the horizontal axis', () => {
  it.each([
    ['Horizontal Units,us', ',', 1e-6, 'Horizontal Units'],
    ['Time unit: ms', ',', 1e-3, 'Time unit'],
    ['X Unit\tns', '\t', 1e-9, 'X Unit'],
    ['# Time units = us', ',', 1e-6, 'Time units'],
    ['Horizontal Units;US', ';', 1e-6, 'Horizontal Units'],
  ])("'%s' gives the unit of a time column whose header gives none, with a note", (line, d, scale, key) => {
    const rows = values.map((v, i) => `${10 + i}${d}${v}`).join('\n');
    const capture = parseCapture(`Model${d === ',' ? ',' : d}bench scope\n${line}\nTime${d}CH1\n${rows}`);
    close(capture.channels[0].time[0], 10 * scale);
    close(capture.sampleInterval as number, scale);
    expect(capture.importSummary.time).toMatchObject({ kind: 'column', column: 'Time' });
    expect(capture.warnings.join('\n')).toContain(`column 'Time' gives no unit: read in`);
    expect(capture.warnings.join('\n')).toContain(`as '${key}' on line 2 states`);
  });

  it('gives the unit of a headerless time column', () => {
    const capture = parseCapture(`Time unit: us\n${values.map((v, i) => `${10 + 2.5 * i},${v}`).join('\n')}`);
    close(capture.channels[0].time[0], 10e-6);
    expect(capture.importSummary.time).toMatchObject({ kind: 'column', unit: 'µs' });
  });

  it('gives the unit of a stated interval without one, with a note; a unit in the cell after the number is read too', () => {
    const body = `CH1\n${values.join('\n')}`;
    const stated = parseCapture(`Horizontal units: us\nSample interval: 0.2\n${body}`);
    close(stated.sampleInterval as number, 2e-7);
    expect(stated.warnings.join('\n')).toContain("line 2: 'Sample interval' gives no unit: read in us, as 'Horizontal units' on line 1 states");
    close(parseCapture(`Sample Interval,0.2,us\n${body}`).sampleInterval as number, 2e-7);
  });

  it("is under the header's own unit and the --time-unit option", () => {
    const header = parseCapture(`Horizontal Units,ms\nTime (us),CH1\n${timedRows()}`);
    close(header.channels[0].time[0], 10e-6);
    expect(header.warnings).toEqual([]);
    const option = parseCapture(`Horizontal Units,Hz\nTime,CH1\n${timedRows()}`, { timeUnit: parseStatedUnit('ns', true, '--time-unit') });
    close(option.channels[0].time[0], 10e-9);
  });

  it.each([
    ['Horizontal Units,Hz', "'Hz' is not a unit of time"],
    ['Horizontal Units,MS', "'MS' is ambiguous"],
    ['X units: div', "'div' is not recognised"],
  ])("'%s' is refused on its line, naming --time-unit", (line, problem) => {
    const error = captureError(() => parseCapture(`Model,bench scope\n${line}\nTime,CH1\n${timedRows()}`));
    expect(error.line).toBe(2);
    expect(error.message).toContain(problem);
    expect(error.message).toContain('--time-unit');
  });

  it('one that is no unit of time is refused only where it is needed', () => {
    const capture = parseCapture(`X units: div\nTime (us),CH1\n${timedRows()}`);
    close(capture.channels[0].time[0], 10e-6);
  });

  it('a units row over a headerless table gives its time column the unit, whole numbers too', () => {
    const capture = parseCapture(`x-axis,1\nms,Volt\n${timedRows()}`);
    close(capture.channels[0].time[0], 10e-3);
    expect(capture.channels[0].unit).toBe('V');
  });
});

describe("the channels' unit a preamble states for the vertical axis", () => {
  /** A headerless table beside a preamble, as some scopes write a single channel: time, then the values. */
  const preambled = (line: string) => `Record Length,${N}\n${line}\nSample Interval,1e-9\n${values.map((v, i) => `${i * 1e-9},${v}`).join('\n')}`;

  it.each([
    ['Vertical Units,V', 'V', 1, 'Vertical Units'],
    ['Vertical Units,CH1:mV', 'V', 1e-3, 'Vertical Units'],
    ['Y Unit: A', 'A', 1, 'Y Unit'],
    ['# YUnits = uA', 'A', 1e-6, 'YUnits'],
  ])("'%s' gives a channel without a unit its unit, with a note", (line, unit, scale, key) => {
    const capture = parseCapture(preambled(line));
    expect(capture.channels[0].unit).toBe(unit);
    close(capture.channels[0].values[1], values[1] * scale);
    expect(capture.warnings.join('\n')).toContain(`gives no unit: read in ${line.split(/[,:=]\s*/).pop()?.replace('CH1:', '')}, as '${key}' on line 2 states`);
  });

  it("is preamble above a units row, never the names of its columns ('Vertical Units,V' over 'Second,Volt')", () => {
    const capture = parseCapture(`Record Length,${N}\nSample Interval,1e-9\nVertical Units,V\nSecond,Volt\n${values.map((v, i) => `${i * 1e-9},${v}`).join('\n')}`);
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([['channel 1', 'V']]);
    expect(capture.importSummary.time).toMatchObject({ kind: 'column', column: 'column 1', unit: 's' });
  });

  it("is under the header's own unit and the --value-unit option", () => {
    const header = parseCapture(`Vertical Units,mV\nTime (s),CH1 (V)\n${timedRows()}`);
    expect(header.channels[0].unit).toBe('V');
    close(header.channels[0].values[1], values[1]);
    expect(header.warnings).toEqual([]);
    const option = parseCapture(preambled('Vertical Units,mV'), { valueUnit: parseStatedUnit('A', false, '--value-unit') });
    expect(option.channels[0].unit).toBe('A');
    close(option.channels[0].values[1], values[1]);
  });

  it('one that reads as no channel unit (divisions, a time), or several, leaves the channel without a unit, and the file is read', () => {
    for (const line of ['Vertical Units,div', 'Vertical Units,s', 'Vertical Units,V,A']) {
      const capture = parseCapture(preambled(line));
      expect(capture.channels[0].unit).toBe('');
      close(capture.channels[0].values[1], values[1]);
    }
  });

  it('gives a headerless first column that turns out a channel its unit too', () => {
    const capture = parseCapture(`Vertical Units,V\nSample Interval,1e-9\n${values.join('\n')}`);
    expect(capture.channels[0].unit).toBe('V');
  });

  it("is preamble right above a column of values, not its name ('XINCR,5e-9' then 'YUNIT,V')", () => {
    // Taken for the header, the line named the channel 'YUNIT' and gave it the unit V by accident.
    const capture = parseCapture(`XINCR,5e-9\nYUNIT,V\n${values.join('\n')}`);
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([['channel 1', 'V']]);
    close(capture.channels[0].time[1] - capture.channels[0].time[0], 5e-9);
    expect(capture.channels[0].time.length).toBe(values.length);
  });

  it("leaves a header named like a key a header when its cells state nothing ('Start,Stop' over two columns)", () => {
    const capture = parseCapture(`Sample Interval,1e-9\nStart,Stop\n${values.map((v) => `${v},${-v}`).join('\n')}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['Start', 'Stop']);
  });
});
