// Capture import across layouts: delimiters, decimal comma, quotes, line endings, preambles, headers, time columns.

import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { CaptureError, type Capture } from '../../core/capture/types';

const N = 32;
/** A gate-loop ringdown sample, rounded the way an export writes it. */
function ring(i: number): number {
  return Number((2 * Math.exp(-i / 40) * Math.cos((2 * Math.PI * i) / 16)).toFixed(6));
}
const times = Array.from({ length: N }, (_, i) => (i + 1) * 1e-6);
const values = Array.from({ length: N }, (_, i) => ring(i));

function rowsOf(format: (i: number) => string): string {
  return Array.from({ length: N }, (_, i) => format(i)).join('\n');
}

function expectClose(actual: ArrayLike<number>, expected: ArrayLike<number>, relative = 1e-12): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    expect(Math.abs(actual[i] - expected[i])).toBeLessThanOrEqual(relative * Math.max(Math.abs(expected[i]), 1e-300));
  }
}

function captureError(text: string, options = {}): CaptureError {
  try {
    parseCapture(text, options);
  } catch (error) {
    expect(error).toBeInstanceOf(CaptureError);
    expect((error as CaptureError).name).toBe('CaptureError');
    return error as CaptureError;
  }
  throw new Error('expected a CaptureError');
}

const decimalComma = (x: number): string => String(x).replace('.', ',');

describe('delimiters and decimal separators', () => {
  it.each([
    ['comma', ',', 'Time (s),CH1 (V)', (i: number) => `${times[i]},${values[i]}`, false],
    ['semicolon', ';', 'Time (s);CH1 (V)', (i: number) => `${times[i]};${values[i]}`, false],
    ['tab', '\t', 'Time (s)\tCH1 (V)', (i: number) => `${times[i]}\t${values[i]}`, false],
    ['whitespace', ' ', 'Time (s)    CH1 (V)', (i: number) => `  ${times[i]}    ${values[i]}  `, false],
    ['comma with spaces after', ',', 'Time (s), CH1 (V)', (i: number) => `${times[i]}, ${values[i]}`, false],
    ['semicolon, decimal comma', ';', 'Time (s);CH1 (V)', (i: number) => `${decimalComma(times[i])};${decimalComma(values[i])}`, true],
    ['tab, decimal comma', '\t', 'Time (s)\tCH1 (V)', (i: number) => `${decimalComma(times[i])}\t${decimalComma(values[i])}`, true],
    ['quoted, comma', ',', '"Time (s)","CH1 (V)"', (i: number) => `"${times[i]}","${values[i]}"`, false],
    ['quoted decimal comma inside comma-separated', ',', '"Time (s)","CH1 (V)"', (i: number) => `"${decimalComma(times[i])}","${decimalComma(values[i])}"`, true],
  ])('%s', (_, delimiter, header, format, comma) => {
    const capture = parseCapture(`${header}\n${rowsOf(format)}\n`);
    expect(capture.layout.delimiter).toBe(delimiter);
    expect(capture.layout.decimalComma).toBe(comma);
    expect(capture.layout.headerLine).toBe(1);
    expect(capture.layout.firstDataLine).toBe(2);
    expect(capture.layout.rows).toBe(N);
    expect(capture.channels).toHaveLength(1);
    const [channel] = capture.channels;
    expect(channel.name).toBe('CH1');
    expect(channel.unit).toBe('V');
    expectClose(channel.time, times);
    expectClose(channel.values, values);
  });

  it('reads a capture written with the Unicode minus sign (U+2212) as the same numbers, not as no data', () => {
    const minus = (x: number): string => String(x).replace('-', '\u2212');
    const capture = parseCapture(`Time (s),CH1 (V)\n${rowsOf((i) => `${minus(times[i])},${minus(values[i])}`)}\n`);
    expect(capture.layout.firstDataLine).toBe(2);
    expectClose(capture.channels[0].time, times);
    expectClose(capture.channels[0].values, values);
  });

  it('reads "1,5;2,25" as 1.5 and 2.25', () => {
    const text = `Time;CH1\n${rowsOf((i) => `${i + 1},5;${i},25`)}`;
    const capture = parseCapture(text, {});
    expect(capture.channels[0].time[0]).toBe(1.5);
    expect(capture.channels[0].values[0]).toBe(0.25);
    expect(capture.channels[0].values[1]).toBe(1.25);
  });

  it('keeps quoted header cells that contain the delimiter', () => {
    const text = `"Time, delayed (s)","Vds, low side (V)"\n${rowsOf((i) => `${times[i]},${values[i]}`)}`;
    const capture = parseCapture(text);
    expect(capture.channels[0].name).toBe('Vds, low side');
  });
});

describe('line endings and byte-order mark', () => {
  const body = `Time (s),CH1 (V)\n${rowsOf((i) => `${times[i]},${values[i]}`)}\n`;
  it.each([
    ['LF', body],
    ['CRLF', body.replace(/\n/g, '\r\n')],
    ['CR only', body.replace(/\n/g, '\r')],
    ['UTF-8 BOM + CRLF', `\ufeff${body.replace(/\n/g, '\r\n')}`],
    ['no final newline', body.trimEnd()],
  ])('%s', (_, text) => {
    const capture = parseCapture(text);
    expect(capture.layout.headerLine).toBe(1);
    expect(capture.channels[0].name).toBe('CH1');
    expect(capture.channels[0].dropped).toBe(0);
    expectClose(capture.channels[0].values, values);
  });
});

describe('preamble', () => {
  const data = rowsOf((i) => `${values[i]}`);

  it.each([
    ['Sample Interval,2e-9', 2e-9],
    ['delta t,2.000000E-6', 2e-6],
    ['Sampling Period: 5e-7', 5e-7],
    ['XIncrement = 4E-09', 4e-9],
    ['x_increment,1e-8', 1e-8],
    ['Time per point: 4 ns', 4e-9],
    ['dt [ns],2', 2e-9],
    ['Sample interval (us),0.5', 0.5e-6],
    ['Sample Interval: 2 ns', 2e-9],
    ['increment 1e-6', 1e-6],
    ['Sample Interval,Analog:2.00E-09,', 2e-9],
    ['Sample Interval,CH1: 4 ns', 4e-9],
    ['Delta_X\t2.000000E-6\t2.000000E-6\t', 2e-6],
    // A sample rate gives the interval as its reciprocal; behind a comment marker, the interval or rate still counts.
    ['Sample Rate,2.000000e+08', 5e-9],
    ['Sampling rate:200MSa/s', 5e-9],
    ['#Sampling rate:1GSa/s', 1e-9],
    ['Sample rate (Hz),2.5e9', 4e-10],
    ['Sample Rate,500 kHz', 2e-6],
    ['sampling frequency = 1 MSPS', 1e-6],
    ['# Sample Interval: 2 ns', 2e-9],
    // A sample clock states the interval or the rate, as its unit says.
    ['#CLOCK=2.0000nS', 2e-9],
    ['Sample clock,250 MHz', 4e-9],
  ])("takes the interval from '%s'", (line, interval) => {
    const capture = parseCapture(`${line}\nVout (V)\n${data}`);
    expect(capture.sampleInterval).toBeCloseTo(interval, 20);
    const { time } = capture.channels[0];
    expect(time[0]).toBe(0);
    expect(time[N - 1]).toBeCloseTo((N - 1) * interval, 20);
  });

  it('a stated interval is over a stated rate; a rate that does not read states none; a comment gives no metadata', () => {
    const both = parseCapture(`Sample Rate,1e9\nSample Interval,2e-9\nVout (V)\n${data}`);
    expect(both.sampleInterval).toBe(2e-9);
    expect(captureError(`Sample Rate,auto\nVout (V)\n${data}`).message).toContain('no sample interval');
    // A clock without a unit could be either.
    expect(captureError(`Clock,2e-9\nVout (V)\n${data}`).message).toContain('no sample interval');
    const commented = parseCapture(`# bench 3, gate loop\n# Operator: someone\n#Sampling rate:1GSa/s\nVout (V)\n${data}`);
    expect(commented.metadata).toEqual({ 'Sampling rate': '1GSa/s' });
  });

  it("reads a data logger's two header blocks: its X_Value column is time, one unit per channel is every channel's, and its Comment column is no channel", () => {
    const text = [
      'LabVIEW Measurement\t',
      'Writer_Version\t2',
      'Separator\tTab',
      '***End_of_Header***\t',
      '\t',
      'Channels\t2\t',
      'Samples\t32\t32\t',
      'Y_Unit_Label\tVolts\tVolts\t',
      'X_Dimension\tTime\tTime\t',
      'X0\t0.0000000000000000E+0\t0.0000000000000000E+0\t',
      'Delta_X\t1.000000E-6\t1.000000E-6\t',
      '***End_of_Header***\t\t\t',
      'X_Value\tV_S\tV_C\tComment',
      // Its Comment column is free text, empty but where an operator wrote a note.
      rowsOf((i) => `${times[i]}\t${values[i]}\t${-values[i]}${i === 5 ? '\tprobe moved, see log' : ''}`),
    ].join('\n');
    const capture = parseCapture(text);
    expect(capture.warnings.join('\n')).not.toContain('Comment');
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([
      ['V_S', 'V'],
      ['V_C', 'V'],
    ]);
    expectClose(capture.channels[0].time, times);
    expectClose(capture.channels[1].values, values.map((v) => -v));
    expect(capture.importSummary.time).toMatchObject({ kind: 'column', column: 'X_Value' });
  });

  it('reads a long preamble of comments, key/value lines and blanks, and keeps the keys as written', () => {
    const preamble = [
      '# LC input filter, 48 V rail, bench 2',
      '; exported after the second trigger',
      '',
      'Model,Bench scope A',
      'Record Length: 10000',
      'Vertical Units = V',
      'Probe Attenuation,10',
      'Horizontal Scale,1e-7',
      'Trigger Level,1.25',
      '',
      '// written by hand for the test',
      'Sample Interval,2e-9',
      'Start Time,-4e-9',
      '',
      '',
    ];
    const text = `${preamble.join('\n')}\nCH1 (V)\n${data}`;
    const capture = parseCapture(text);
    expect(capture.layout.headerLine).toBe(preamble.length + 1);
    expect(capture.layout.firstDataLine).toBe(preamble.length + 2);
    expect(capture.metadata).toMatchObject({
      Model: 'Bench scope A',
      'Record Length': '10000',
      'Vertical Units': 'V',
      'Probe Attenuation': '10',
      'Horizontal Scale': '1e-7',
      'Sample Interval': '2e-9',
      'Start Time': '-4e-9',
    });
    expect(capture.sampleInterval).toBe(2e-9);
    expect(capture.channels[0].time[0]).toBe(-4e-9);
    expect(capture.channels[0].time[1]).toBeCloseTo(-2e-9, 20);
  });

  it('does not take a per-division horizontal scale as the interval', () => {
    const error = captureError(`Horizontal Scale,1e-7\nCH1 (V)\n${data}`);
    expect(error.message).toContain('no time column and no sample interval');
    expect(error.line).toBe(2);
  });

  it('uses the sampleInterval option when the file states none, and over a stated one with a warning', () => {
    expect(parseCapture(`CH1\n${data}`, { sampleInterval: 1e-6 }).sampleInterval).toBe(1e-6);
    const both = parseCapture(`Sample Interval,2e-9\nCH1\n${data}`, { sampleInterval: 1e-6 });
    expect(both.sampleInterval).toBe(1e-6);
    expect(both.warnings.join('\n')).toMatch(/sampleInterval option .* replaces .*'Sample Interval'/);
  });

  it('ignores a start time that is not a number', () => {
    const capture = parseCapture(`t0,5/26/2021  11:44:55.465797\ndelta t,1e-6\nCH1\n${data}`);
    expect(capture.channels[0].time[0]).toBe(0);
  });

  it('warns when a key gives different values for different channels', () => {
    const capture = parseCapture(`delta t,1e-6,2e-6\nA,B\n${rowsOf((i) => `${values[i]},${values[i]}`)}`);
    expect(capture.sampleInterval).toBe(1e-6);
    expect(capture.warnings.join('\n')).toContain("line 1: 'delta t' gives several different values");
  });
});

describe('headers and units', () => {
  it.each([
    ['Time (s)', 'CH1 [mV]', 1, 1e-3, 'CH1', 'V'],
    ['t [us]', 'I (A)', 1e-6, 1, 'I', 'A'],
    ['time_ns', 'Voltage(V)', 1e-9, 1, 'Voltage', 'V'],
    ['Time/ms', 'CH2_mV', 1e-3, 1e-3, 'CH2', 'V'],
    ['X (s)', 'Ids (kA)', 1, 1e3, 'Ids', 'A'],
    ['TIME', 'V_C', 1, 1, 'V_C', ''],
    ['sec', 'Vout (µV)', 1, 1e-6, 'Vout', 'V'],
  ])('%s / %s', (timeHeading, valueHeading, timeScale, valueScale, name, unit) => {
    const capture = parseCapture(`${timeHeading},${valueHeading}\n${rowsOf((i) => `${i + 1},${values[i]}`)}`);
    const [channel] = capture.channels;
    expect(channel.name).toBe(name);
    expect(channel.unit).toBe(unit);
    expectClose(channel.time, Array.from({ length: N }, (_, i) => (i + 1) * timeScale));
    expectClose(channel.values, values.map((v) => v * valueScale));
  });

  it('reads a units row under the names', () => {
    const capture = parseCapture(`Time,Vsw,Isw\n(us),(V),(mA)\n${rowsOf((i) => `${i},${values[i]},${values[i]}`)}`);
    expect(capture.layout.headerLine).toBe(1);
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([
      ['Vsw', 'V'],
      ['Isw', 'A'],
    ]);
    expect(capture.channels[0].time[1]).toBe(1e-6);
    expect(capture.channels[1].values[0]).toBeCloseTo(values[0] * 1e-3, 15);
  });

  it('refuses an unknown unit, naming the column and the option that states it', () => {
    expect(() => selectChannel(parseCapture(`Time (s),CH1 (div)\n${rowsOf((i) => `${times[i]},${values[i]}`)}`))).toThrow(
      "line 1: column 'CH1 (div)': unit 'div' is not recognised; state the channel's unit with --value-unit",
    );
  });

  it('reads several channels on one shared time axis', () => {
    const capture = parseCapture(`Time (s),Vgs (V),Vds (V),Id (A)\n${rowsOf((i) => `${times[i]},${values[i]},${-values[i]},${2 * values[i]}`)}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['Vgs', 'Vds', 'Id']);
    expect(capture.channels[1].time).toBe(capture.channels[0].time);
    expect(capture.channels[2].values[0]).toBe(2 * values[0]);
    expect(capture.sampleInterval).toBeCloseTo(1e-6, 18);
  });

  it('gives every channel of a time/value pair file its own axis and the pair name', () => {
    const text = `Time Vsw\tValue Vsw\tTime Vgate\tValue Vgate\t\t\n${rowsOf((i) => `${times[i]}\t${values[i]}\t${times[i] + 5e-7}\t${-values[i]}`)}`;
    const capture = parseCapture(text);
    expect(capture.channels.map((c) => c.name)).toEqual(['Vsw', 'Vgate']);
    expectClose(capture.channels[0].time, times);
    expectClose(capture.channels[1].time, times.map((t) => t + 5e-7));
    expect(capture.channels[0].time).not.toBe(capture.channels[1].time);
  });

  it.each([
    ['t1,CH1,t2,CH2', ['CH1', 'CH2']],
    ['x1,y1,x2,y2', ['y1', 'y2']],
    ['T_1,Vsw,T_2,Vgate', ['Vsw', 'Vgate']],
  ])("takes numbered time names '%s' as a time column per channel", (header, names) => {
    const capture = parseCapture(`${header}\n${rowsOf((i) => `${times[i]},${values[i]},${times[i] + 5e-7},${-values[i]}`)}`);
    expect(capture.channels.map((c) => c.name)).toEqual(names);
    expectClose(capture.channels[0].time, times);
    expectClose(capture.channels[1].time, times.map((t) => t + 5e-7));
  });

  it('keeps numbered names as channels beside a time column, beside each other, or not stepping evenly', () => {
    const beside = parseCapture(`Time,T1,T2\n${rowsOf((i) => `${times[i]},${values[i]},${values[i]}`)}`);
    expect(beside.channels.map((c) => c.name)).toEqual(['T1', 'T2']);
    const temperatures = parseCapture(`T1,T2,T3\n${rowsOf((i) => `${20 + values[i]},${21 + values[i]},${22 + values[i]}`)}`, { sampleInterval: 1 });
    expect(temperatures.channels.map((c) => c.name)).toEqual(['T1', 'T2', 'T3']);
    const uneven = parseCapture(`T1,P1\n${rowsOf((i) => `${20 + values[i]},${values[i]}`)}`, { sampleInterval: 1 });
    expect(uneven.channels.map((c) => c.name)).toEqual(['T1', 'P1']);
  });

  it('names repeated headings apart', () => {
    const capture = parseCapture(`Time,CH,CH\n${rowsOf((i) => `${times[i]},${values[i]},${values[i]}`)}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['CH', 'CH (column 3)']);
  });
});

describe('files without a header', () => {
  it('takes a strictly increasing first column as time (two or more columns)', () => {
    const capture = parseCapture(rowsOf((i) => `${times[i]}   ${values[i]}   ${-values[i]}`));
    expect(capture.layout.headerLine).toBeNull();
    expect(capture.channels.map((c) => c.name)).toEqual(['channel 1', 'channel 2']);
    expectClose(capture.channels[0].time, times);
  });

  it('reads a first column that does not increase as a channel when an interval is stated', () => {
    const capture = parseCapture(`delta t,1e-6\n${rowsOf((i) => `${values[i]},${-values[i]}`)}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['channel 1', 'channel 2']);
    expectClose(capture.channels[0].values, values);
    expect(capture.channels[0].time[3]).toBeCloseTo(3e-6, 20);
  });

  it('fails naming the line where a headerless first column stops increasing, without an interval', () => {
    const error = captureError(rowsOf((i) => `${values[i]},${-values[i]}`));
    expect(error.line).toBe(2);
    expect(error.message).toContain('no time column');
  });

  it.each([
    ['# t[us]  CH1[V]', '  ', 1e-6],
    ['#Time (ms),Vout (V)', ',', 1e-3],
    ['% time_ns\tCH1 (V)', '\t', 1e-9],
  ])("reads a header written as a comment, '%s', just above the data: its names and units", (comment, d, scale) => {
    const capture = parseCapture(`# logger export\n${comment}\n\n${rowsOf((i) => `${i + 1}${d}${values[i]}`)}`);
    expect(capture.layout.headerLine).toBe(2);
    expect(capture.channels.map((c) => [c.name, c.unit])).toEqual([[d === ',' ? 'Vout' : 'CH1', 'V']]);
    expectClose(capture.channels[0].time, times.map((_, i) => (i + 1) * scale));
  });

  it('keeps a comment that names no time column, or not every column, a comment', () => {
    for (const comment of ['# Channel A', '# t[us] CH1[V] CH2[V]']) {
      const capture = parseCapture(`${comment}\n${rowsOf((i) => `${times[i]} ${values[i]}`)}`);
      expect(capture.layout.headerLine).toBeNull();
      expect(capture.channels.map((c) => c.name)).toEqual(['channel 1']);
      expectClose(capture.channels[0].time, times);
    }
  });

  it('reads a single column of values with the sampleInterval option', () => {
    const capture = parseCapture(rowsOf((i) => `${values[i]}`), { sampleInterval: 2e-9 });
    expect(capture.layout.delimiter).toBe('');
    expect(capture.channels[0].name).toBe('channel 1');
    expect(capture.channels[0].time[N - 1]).toBeCloseTo((N - 1) * 2e-9, 22);
  });
});

describe('wall-clock time stamps', () => {
  const stamps = (i: number): string => `5/26/2021  11:44:55.${String(465797 + 2 * i).padStart(6, '0')}`;
  const body = `time,V_S,V_C\n${rowsOf((i) => `${stamps(i)},${values[i]},${-values[i]}`)}`;

  it("rebuilds t = i * dt from a stated 'delta t', with a warning", () => {
    const capture = parseCapture(`waveform,V_S,V_C\nt0,${stamps(0)},${stamps(0)}\ndelta t,2.000000E-6,2.000000E-6\n\n${body}`);
    expect(capture.channels.map((c) => c.name)).toEqual(['V_S', 'V_C']);
    expect(capture.sampleInterval).toBe(2e-6);
    const { time } = capture.channels[0];
    for (let i = 0; i < N; i++) expect(time[i]).toBe(i * 2e-6);
    expect(capture.warnings.join('\n')).toMatch(/wall-clock time stamps; the time axis was rebuilt as t = 0 s \+ i × 2 µs/);
  });

  it('offsets the rebuilt axis by a numeric start time', () => {
    const capture = parseCapture(`Start Time,-1e-5\nSample Interval,1e-6\n${body}`);
    expect(capture.channels[0].time[0]).toBe(-1e-5);
    expect(capture.channels[0].time[10]).toBeCloseTo(0, 20);
  });

  it('uses the sampleInterval option', () => {
    const capture = parseCapture(body, { sampleInterval: 1e-6 });
    expect(capture.channels[1].time[5]).toBe(5 * 1e-6);
  });

  it("reads a logger's date column beside its time-of-day column as stamps too", () => {
    const clock = (i: number): string => `11:44:55.${String(465797 + 2 * i).padStart(6, '0')}`;
    for (const date of ['2021-05-26', '26.05.2021', '5/26/2021']) {
      const capture = parseCapture(`Date,Time,V_S\n${rowsOf((i) => `${date},${clock(i)},${values[i]}`)}`, { sampleInterval: 2e-6 });
      expect(capture.channels.map((c) => c.name)).toEqual(['V_S']);
      expect(capture.channels[0].time[5]).toBe(5 * 2e-6);
      expect(capture.channels[0].values[7]).toBe(values[7]);
    }
    expect(captureError(`Date,Time,V_S\n${rowsOf((i) => `2021-05-26,${clock(i)},${values[i]}`)}`).message).toMatch(/^line 2: column 'Time' holds wall-clock time stamps \('11:44:55.465797'\)/);
  });

  it("leaves stamps unread beside a time column of numbers (a data logger's Date/Time before its Elapsed (s))", () => {
    for (const header of ['Date/Time,Elapsed (s),V_S (V)', 'Elapsed (s),Date/Time,V_S (V)']) {
      const stampFirst = header.startsWith('Date');
      const text = `${header}\n${rowsOf((i) => (stampFirst ? `2026-12-05 10:00:0${i % 10},${times[i]},${values[i]}` : `${times[i]},2026-12-05 10:00:0${i % 10},${values[i]}`))}`;
      const capture = parseCapture(text);
      expectClose(capture.channels[0].time, times);
      expect(capture.importSummary.time).toMatchObject({ kind: 'column', column: 'Elapsed (s)' });
      expect(capture.warnings).toContain("wall-clock time stamps in 'Date/Time' were left unread: the time column 'Elapsed (s)' gives the time axis");
    }
  });

  it('reads stamps written without zero padding (10:0:0.5) as stamps', () => {
    const clock = (i: number): string => `10:${Math.floor(i / 120)}:${((i % 120) / 2).toFixed(1)}`;
    const capture = parseCapture(`Time,Level (V)\n${rowsOf((i) => `${clock(i)},${values[i]}`)}`, { sampleInterval: 0.5 });
    expect(capture.channels[0].time[3]).toBe(1.5);
    expect(captureError(`Time,Level (V)\n${rowsOf((i) => `${clock(i)},${values[i]}`)}`).message).toMatch(/^line 2: column 'Time' holds wall-clock time stamps \('10:0:0.0'\)/);
  });

  it('fails naming the first data line without a stated interval', () => {
    const error = captureError(`waveform,V_S,V_C\n\n${body}`);
    expect(error.line).toBe(4);
    expect(error.message).toMatch(/^line 4: column 'time' holds wall-clock time stamps/);
    expect(error.message).toContain('no sample interval');
  });
});

describe('missing and overrange cells', () => {
  it('drops them per channel and counts them, never reading them as zero', () => {
    const junk = new Map<number, string>([
      [2, 'NaN'],
      [4, ''],
      [6, 'inf'],
      [8, '9.9E37'],
      [10, '****'],
      [12, '-9.9E+37'],
      [14, '-inf'],
      [16, '\u221e'],
      [18, '-\u221e'],
    ]);
    const text = `Time (s),A (V),B (V)\n${rowsOf((i) => `${times[i]},${junk.get(i) ?? values[i]},${i === 20 ? 'nan' : values[i]}`)}`;
    const capture: Capture = parseCapture(text);
    const [a, b] = capture.channels;
    expect(a.dropped).toBe(junk.size);
    expect(b.dropped).toBe(1);
    expect(a.values.length).toBe(N - junk.size);
    expect(b.values.length).toBe(N - 1);
    const keptTimes = times.filter((_, i) => !junk.has(i));
    expectClose(a.time, keptTimes);
    expectClose(a.values, values.filter((_, i) => !junk.has(i)));
    expect(capture.warnings).toContain("channel 'A': 9 sample(s) dropped (empty, NaN, infinite or overrange cells)");
    expect(capture.layout.rows).toBe(N);
  });

  it('treats missing trailing cells as empty', () => {
    const text = `Time (s),A,B\n${rowsOf((i) => (i === 3 ? `${times[i]},${values[i]}` : `${times[i]},${values[i]},${values[i]}`))}`;
    const capture = parseCapture(text);
    expect(capture.channels[0].dropped).toBe(0);
    expect(capture.channels[1].dropped).toBe(1);
  });

  it('drops rows whose time cell is missing for every channel on that axis', () => {
    const text = `Time (s),A,B\n${rowsOf((i) => `${i === 5 ? 'NaN' : times[i]},${values[i]},${values[i]}`)}`;
    const capture = parseCapture(text);
    expect(capture.channels.map((c) => c.dropped)).toEqual([1, 1]);
    expect(capture.channels[0].time).toContain(times[6]);
    expect(Array.from(capture.channels[0].time)).not.toContain(times[5]);
  });
});
