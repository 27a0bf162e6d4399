// Bad capture files: one CaptureError naming the 1-based line and what was wrong; footers and sorting as states.

import { describe, expect, it } from 'vitest';
import { parseCapture, parseCaptureFileBytes } from '../../core/capture/parseCapture';
import { CaptureError } from '../../core/capture/types';
import type { CaptureOptions } from '../../core/capture/types';
import { encodeText } from '../fixtures/exportHabits';

const N = 30;
const value = (i: number): number => Number((1.5 * Math.exp(-i / 25) * Math.sin(i / 2)).toFixed(5));
const row = (i: number): string => `${(i * 1e-8).toExponential(3)},${value(i)},${-value(i)}`;
const header = 'Time (s),Vsw (V),Vgate (V)';

/** Header on line 1, row i on line i + 2. */
function table(rows: string[]): string {
  return `${header}\n${rows.join('\n')}\n`;
}
const good = Array.from({ length: N }, (_, i) => row(i));

function captureError(text: string | Uint8Array, options: CaptureOptions = {}): CaptureError {
  try {
    if (typeof text === 'string') parseCapture(text, options);
    else parseCaptureFileBytes(text, options);
  } catch (error) {
    expect(error).toBeInstanceOf(CaptureError);
    expect((error as Error).name).toBe('CaptureError');
    return error as CaptureError;
  }
  throw new Error('expected a CaptureError');
}

function replaced(index: number, text: string): string[] {
  return good.map((r, i) => (i === index ? text : r));
}

describe('junk inside the table', () => {
  it.each([
    ['a word in a value column', 12, `${(12e-8).toExponential(3)},abc,0.1`, "line 14: expected 3 numeric columns, found 'abc' (column 2)"],
    ['a word in the time column', 20, 'later,0.1,0.2', "line 22: expected 3 numeric columns, found 'later' (column 1)"],
    ['a whole junk row', 15, 'x,y,z', "line 17: expected 3 numeric columns, found 'x' (column 1)"],
    ['a number with a unit', 25, `${(25e-8).toExponential(3)},1.2k,0`, "line 27: expected 3 numeric columns, found '1.2k' (column 2)"],
    ['too many cells', 8, `${(8e-8).toExponential(3)},0.1,0.2,0.3`, "line 10: expected 3 columns, found more ('0.3' in column 4)"],
    ['junk in the second data row', 1, 'oops,0.1,0.2', "line 3: expected 3 numeric columns, found 'oops,0.1,0.2'"],
  ])('%s', (_, index, text, message) => {
    const error = captureError(table(replaced(index, text)));
    expect(error.message).toBe(message);
    expect(error.line).toBe(Number(/^line (\d+)/.exec(message)![1]));
  });

  it('accepts a trailing footer after the data, with a warning', () => {
    const capture = parseCapture(`${table(good)}\nEnd of record\nTotal points,${N}\n\n`);
    expect(capture.layout.rows).toBe(N);
    expect(capture.warnings.at(-1)).toBe("2 line(s) after the last data row were ignored (from line 33: 'End of record')");
  });

  it('skips blank and comment lines between data rows, keeping line numbers right', () => {
    const rows = [...good.slice(0, 10), '', '# probe moved', ...good.slice(10, 20), `${(20e-8).toExponential(3)},0.1,bad`, ...good.slice(21)];
    const error = captureError(table(rows));
    expect(error.line).toBe(2 + 22);
  });
});

describe('time order', () => {
  const backwards = replaced(17, `${(3e-8).toExponential(3)},0.5,0.5`);
  const repeated = replaced(9, row(8));

  it('fails naming the line where time goes backwards', () => {
    const error = captureError(table(backwards));
    expect(error.line).toBe(19);
    expect(error.message).toMatch(/^line 19: time 30 ns is earlier than 160 ns on the row before/);
  });

  it('fails naming the line of a repeated time stamp', () => {
    const error = captureError(table(repeated));
    expect(error.line).toBe(11);
    expect(error.message).toContain('repeats the time stamp of the row before');
  });

  it('fails on time stamps written with too few digits, naming the sample interval as the way out', () => {
    // 2 significant digits for 1 ns steps: from 100 ns on each stamp stands for about 10 rows.
    const coarse = Array.from({ length: 200 }, (_, i) => `${(i * 1e-9).toExponential(1)},${value(i)},${-value(i)}`);
    const error = captureError(table(coarse));
    expect(error.line).toBe(103);
    expect(error.message).toContain('89 of the 200 time stamps repeat the one before and none decreases');
    expect(error.message).toContain('give the sample interval (option sampleInterval)');
    // A row written twice is no rounding: the advice stays sorting.
    expect(captureError(table(repeated)).message).toContain('time must increase (option sortTime sorts the rows)');
  });

  it('leaves out rows written twice whole, beside the row they copy, with a warning', () => {
    const twice = good.flatMap((r, i) => (i === 4 || i === 17 || i === 18 ? [r, r] : [r]));
    twice.splice(21, 0, good[18]);
    const capture = parseCapture(table(twice));
    const [vsw, vgate] = capture.channels;
    expect(vsw.values.length).toBe(N);
    for (let i = 0; i < N; i++) {
      expect(vsw.time[i]).toBe(Number((i * 1e-8).toExponential(3)));
      expect(vsw.values[i]).toBe(value(i));
      expect(vgate.values[i]).toBe(Number(String(-value(i))));
    }
    expect(capture.sampleInterval).toBeCloseTo(1e-8, 20);
    expect(capture.warnings).toContain("4 row(s) repeating the row before whole (time in column 'Time (s)' and every value) were left out (first on line 7)");
    expect(capture.importSummary.droppedRows).toEqual([{ reason: 'row repeated whole', count: 4, firstLine: 7 }]);
  });

  it('keeps refusing a repeated stamp whose values differ, or a copy written over a row (it leaves a gap)', () => {
    const differing = good.flatMap((r, i) => (i === 4 ? [r, r.replace(/,[^,]+$/, ',0.123')] : [r]));
    expect(captureError(table(differing)).message).toContain('repeats the time stamp of the row before');
    expect(captureError(table(differing)).line).toBe(7);
    expect(captureError(table(repeated)).message).toContain('repeats the time stamp of the row before');
  });

  it('builds the axis from the sampleInterval option over a time column, from its first stamp', () => {
    const coarse = Array.from({ length: 200 }, (_, i) => `${(5e-9 + i * 1e-9).toExponential(2)},${value(i)},${-value(i)}`);
    const capture = parseCapture(table(coarse), { sampleInterval: 1e-9 });
    const [channel] = capture.channels;
    expect(channel.time.length).toBe(200);
    for (const i of [0, 1, 150, 199]) expect(channel.time[i]).toBeCloseTo(5e-9 + i * 1e-9, 22);
    expect(capture.sampleInterval).toBe(1e-9);
    expect(capture.warnings).toContain("the sampleInterval option replaces the time stamps of column 'Time (s)': t = 5 ns + i × 1 ns");
    expect(capture.importSummary.time).toEqual({ kind: 'interval', interval: 1e-9, from: 'option', key: null, line: null });
  });

  it('sorts with sortTime, keeping the first of a repeated stamp, with warnings', () => {
    const shuffled = [...good.slice(15), ...good.slice(0, 15), good[4].replace(/,[^,]+,[^,]+$/, ',9,9')];
    const capture = parseCapture(table(shuffled), { sortTime: true });
    const [channel] = capture.channels;
    expect(channel.values.length).toBe(N);
    for (let i = 0; i < N; i++) {
      expect(channel.time[i]).toBe(Number((i * 1e-8).toExponential(3)));
      expect(channel.values[i]).toBe(value(i));
    }
    expect(capture.sampleInterval).toBeCloseTo(1e-8, 20);
    const warnings = capture.warnings.join('\n');
    expect(warnings).toContain("time in column 'Time (s)' does not increase from line 17 on; rows were sorted by time");
    expect(warnings).toContain('1 row(s) repeating an earlier time stamp were left out (first on line 32)');
  });
});

describe('too little data', () => {
  it('needs at least 20 rows', () => {
    const error = captureError(table(good.slice(0, 19)));
    expect(error.message).toContain('only 19 data row(s) from line 2; at least 20 samples are needed');
  });

  it('leaves out a channel with fewer than 20 usable samples, with a warning', () => {
    const rows = good.map((r, i) => (i < 12 ? r : r.replace(/,[^,]+$/, ',NaN')));
    const capture = parseCapture(table(rows));
    expect(capture.channels.map((c) => c.name)).toEqual(['Vsw']);
    expect(capture.warnings).toContain("channel 'Vgate' has only 12 usable sample(s) and was left out");
  });

  it('fails when no channel has 20 usable samples', () => {
    const rows = good.map((r, i) => (i < 12 ? r : r.replace(/,[^,]+,[^,]+$/, ',NaN,')));
    expect(captureError(table(rows)).message).toContain('no channel has at least 20 usable samples');
  });

  it('fails for text with no rows of numbers', () => {
    expect(captureError('# nothing here\nTime,CH1\n').message).toBe('no rows of numbers found in 2 line(s)');
    expect(captureError('').message).toBe('the file is empty: no rows of numbers');
  });
});

describe('options', () => {
  it.each([0, -1e-9, Number.NaN, Number.POSITIVE_INFINITY])('rejects sampleInterval %d naming the option', (interval) => {
    const values = Array.from({ length: N }, (_, i) => `${value(i)}`).join('\n');
    expect(captureError(`CH1\n${values}`, { sampleInterval: interval }).message).toMatch(/^option sampleInterval must be a positive number/);
  });
});

describe('a number written with a thousands separator', () => {
  /** Time in ns and a value in mV, 40 rows (row i on line i + 2); `value` writes row i's value, its mark included. */
  const grouped = (delimiter: string, value: (i: number) => string, time = (i: number) => `${i * 50}`): string =>
    `Time (ns)${delimiter}CH1 (mV)\n${Array.from({ length: 40 }, (_, i) => `${time(i)}${delimiter}${value(i)}`).join('\n')}\n`;
  const mV = (i: number, mark = '.'): string => (i * 10.5).toFixed(1).replace('.', mark);
  const cause = (separator: string) => `a number written with a thousands separator (${separator}); export the numbers without digit grouping`;

  it.each([
    ["'1,234.5' in a ';' table", grouped(';', (i) => (i === 20 ? '1,234.5' : mV(i))), 22, "'1,234.5' (column 2)", 'a comma'],
    ["'1.234,5' in a table of decimal commas", grouped(';', (i) => (i === 20 ? '1.234,5' : mV(i, ','))), 22, "'1.234,5' (column 2)", 'a point'],
    ["'1 234,5'", grouped(';', (i) => (i === 20 ? '1 234,5' : mV(i, ','))), 22, "'1 234,5' (column 2)", 'a space'],
    ["'1\u00a0234,5' (a no-break space)", grouped(';', (i) => (i === 20 ? '1\u00a0234,5' : mV(i, ','))), 22, "'1\u00a0234,5' (column 2)", 'a no-break space'],
    ["a quoted '1,234.5' in a ',' table", grouped(',', (i) => (i === 20 ? '"1,234.5"' : mV(i))), 22, "'1,234.5' (column 2)", 'a comma'],
  ])('%s: refused at its line and cell, naming the cause', (_, text, line, cell, separator) => {
    const error = captureError(text);
    expect(error.message).toBe(`line ${line}: expected 2 numeric columns, found ${cell}: ${cause(separator)}`);
    expect(error.line).toBe(line);
  });

  it('a time column grouped from 1.000 on is refused there, not cut short as if a later section began', () => {
    const text = grouped('\t', (i) => mV(i, ','), (i) => (i < 20 ? `${i * 50}` : `${Math.floor((i * 50) / 1000)}.${String((i * 50) % 1000).padStart(3, '0')},0`));
    const error = captureError(text);
    expect(error.message).toBe(`line 22: expected 2 numeric columns, found '1.000,0' (column 1): ${cause('a point')}`);
  });

  it('a grouped row among the first rows: the line and the cell', () => {
    const error = captureError(grouped(';', (i) => (i === 2 ? '1,234.5' : mV(i))));
    expect(error.message).toBe(`line 4: expected 2 numeric columns, found '100;1,234.5': '1,234.5' is ${cause('a comma')}`);
  });

  it('every row grouped: no table, and the first such line named', () => {
    const error = captureError(grouped(';', (i) => `1.${String(i * 25).padStart(3, '0')},5`));
    expect(error.message).toBe(`no rows of numbers found in 41 line(s); line 2 holds '1.000,5': ${cause('a point')}`);
  });

  it('every cell written with its unit after the number: no table, and the first such line named', () => {
    const rows = Array.from({ length: 40 }, (_, i) => `${(i * 0.004).toFixed(4)}us,${(i % 7) * 10}.5mV`).join('\n');
    expect(captureError(`Time,CH1\n${rows}\n`).message).toBe(
      "no rows of numbers found in 41 line(s); line 2 holds '0.0000us': a unit written after each number is not read; export the values as plain numbers, with the units in the column headers ('Time (us)')",
    );
    // A word after a number that is no unit is not taken for one.
    expect(captureError('Item,Count\nbolts,12 apples\n').message).toBe('no rows of numbers found in 2 line(s)');
  });

  it('every number in a form not read (a Fortran D exponent, a stray letter): no table, and the first such cell named', () => {
    const rows = Array.from({ length: 40 }, (_, i) => `${(i * 1e-9 - 2e-8).toExponential(6).replace('e', 'D')},${(i % 7) * 0.5}`).join('\n');
    expect(captureError(`Time (s),CH1 (V)\n${rows}\n`).message).toBe(
      "no rows of numbers found in 41 line(s); line 2 holds '-2.000000D-8', which does not read as a number; export plain decimal numbers (such as -1.5e-06)",
    );
    expect(captureError('t,v\n1.0x,2\n2.0x,3\n').message).toContain("line 2 holds '1.0x', which does not read as a number");
    // A heading that opens with a digit is no number meant (no more than half its cells open as numbers).
    expect(captureError('2nd probe,time,volts\nx,y,z\n').message).toBe('no rows of numbers found in 2 line(s)');
  });

  it('a footer of settings after the table is still left out, whatever its numbers', () => {
    const capture = parseCapture(`${grouped(';', (i) => mV(i))}Points;10,000.0\n`);
    expect(capture.channels[0].values.length).toBe(40);
    expect(capture.warnings.at(-1)).toBe("1 line(s) after the last data row were ignored (from line 42: 'Points;10,000.0')");
  });
});

describe('a whole number the other decimal mark may group in threes: two readings, a factor of 1000 apart', () => {
  /** Time in ns and a value in mV written with decimal commas, 40 rows (row i on line i + 2), row 20's value replaced. */
  const commaTable = (cell: string, time = (i: number) => `${i * 50}`): string =>
    `Time (ns);CH1 (mV)\n${Array.from({ length: 40 }, (_, i) => `${time(i)};${i === 20 ? cell : (i * 10.5).toFixed(1).replace('.', ',')}`).join('\n')}\n`;
  const advice = 'export the numbers with one decimal mark and no digit grouping';

  it.each([
    ['1.234', '1.234', '1234 (points grouping thousands) or 1.234 (a decimal point from another export)'],
    ['-12.345.678', '-12.345.678', '-12345678 (points grouping thousands)'],
    ['"1.234"', '1.234', '1234 (points grouping thousands) or 1.234 (a decimal point from another export)'],
  ])("'%s' reads two ways, a factor of 1000 apart: refused at its line with both readings", (cell, shown, readings) => {
    const error = captureError(commaTable(cell));
    expect(error.message).toBe(
      `line 22: expected 2 numeric columns, found '${shown}' (column 2): in a table whose decimal mark is the comma this reads as ${readings}; ${advice}`,
    );
    expect(error.line).toBe(22);
  });

  it.each([
    ['on a later row', 20, 22],
    ['on the first row, where the table is recognised', 0, 2],
  ])("a quoted '1,234' in a ',' table of decimal points %s: both readings, at its line", (_, at, line) => {
    const rows = Array.from({ length: 40 }, (_, i) => `${(i * 5e-8).toExponential(3)},${i === at ? '"1,234"' : (1500 + i * 10.5).toFixed(1)}`);
    const error = captureError(`Time (s),CH1 (V)\n${rows.join('\n')}\n`);
    expect(error.message).toBe(
      `line ${line}: expected 2 numeric columns, found '1,234' (column 2): in a table whose decimal mark is the point this reads as 1234 (commas grouping thousands) or 1.234 (a decimal comma from another export); ${advice}`,
    );
  });

  it("a ';' table written with three decimals ('0,000;1,000') is still one of decimal commas", () => {
    const capture = parseCapture(`Zeit (ms);CH1 (V)\n${Array.from({ length: 40 }, (_, i) => `${(i * 0.01).toFixed(3)};${(1 + i / 8).toFixed(3)}`.replaceAll('.', ',')).join('\n')}\n`);
    expect(capture.channels[0].values[8]).toBe(2);
    expect(capture.channels[0].time[1]).toBeCloseTo(1e-5, 18);
  });

  it.each([
    ['0.905', 0.905e-3],
    ['-0.125', -0.125e-3],
    ['"0.500"', 0.5e-3],
  ])("'%s' cannot group thousands (no digit group starts with a zero): read with the point as a decimal mark", (cell, volts) => {
    const capture = parseCapture(commaTable(cell));
    expect(capture.channels[0].values[20]).toBeCloseTo(volts, 15);
    expect(capture.channels[0].values[21]).toBeCloseTo(0.2205, 15);
  });

  it("exponent-written times beside values with three decimal commas ('1.000E-08;0,998'): a table of decimal commas", () => {
    const rows = Array.from({ length: 40 }, (_, i) => `${(i * 1e-8).toExponential(3).toUpperCase()};${(0.5 + i / 1000).toFixed(3).replace('.', ',')}`);
    const capture = parseCapture(`Time (s);CH1 (V)\n${rows.join('\n')}\n`);
    expect(capture.channels[0].values[0]).toBe(0.5);
    expect(capture.channels[0].values[39]).toBeCloseTo(0.539, 15);
    expect(capture.channels[0].time[39]).toBeCloseTo(3.9e-7, 21);
  });

  it('a point no grouping explains can only mark decimals: 1.5 and an exponent-written time column are read', () => {
    const capture = parseCapture(commaTable('1.5', (i) => `${(i * 50).toExponential(3)}`));
    // Millivolts, read in volts.
    expect(capture.channels[0].values[20]).toBeCloseTo(1.5e-3, 15);
    expect(capture.channels[0].values[21]).toBeCloseTo(0.2205, 15);
    expect(capture.channels[0].time[39]).toBeCloseTo(1950e-9, 21);
  });
});

describe('a file that is not text', () => {
  const bytes = (...parts: (string | number[])[]): Uint8Array =>
    Uint8Array.from(parts.flatMap((p) => (typeof p === 'string' ? [...new TextEncoder().encode(p)] : p)));
  const advice = 'export the capture as CSV or text';
  /** The first 16 bytes of a PNG image: its signature, then the length and name of its first chunk. */
  const png = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52];

  it.each([
    ['a PNG image', bytes(png, [0, 0, 2, 0]), 'its first bytes are those of a PNG image'],
    ['an .xlsx workbook (a zip archive)', bytes([0x50, 0x4b, 3, 4, 20, 0, 6, 0], '[Content_Types].xml'), 'its first bytes are those of a zip archive (as an .xlsx workbook is)'],
    ['a PDF (no NUL byte)', bytes('%PDF-1.7\n%\u00e2\u00e3\n1 0 obj\n'), 'its first bytes are those of a PDF document'],
    ['a NUL byte inside the table', bytes(table(good).replace(good[5], `${good[5]}\u0000`)), `a NUL byte at byte offset ${table(good).indexOf(good[5]) + good[5].length}`],
    ['a binary waveform after a text preamble', bytes(':WFMPRE:BYT_NR 2;ENCDG BIN;\n:CURVE #3500', [1, 0, 255, 127, 10, 0, 3]), 'a NUL byte at byte offset 41'],
    ['NUL bytes only', new Uint8Array(4096), 'all 4096 bytes are NUL'],
  ])('%s: one CaptureError saying so, with the telltale', (_, file, telltale) => {
    const error = captureError(file);
    expect(error.message).toBe(`the file is not text but binary content: ${telltale}; ${advice}`);
    expect(error.line).toBeNull();
  });

  it('UTF-16 without a byte-order mark that starts beyond ASCII (not told as UTF-16): says what it looks like', () => {
    const error = captureError(encodeText(`\u00b5s,V\n${good.join('\n')}`, 'UTF-16LE without BOM'));
    expect(error.message).toBe(
      'the file is not text as read: a NUL byte at byte offset 1 and at every other byte from the start, as UTF-16 text without a ' +
        'byte-order mark has; save it as UTF-8, or as UTF-16 with a byte-order mark',
    );
  });

  it('still reads UTF-16 (whose bytes hold NULs), and a capture padded with NUL bytes to its end', () => {
    for (const encoding of ['UTF-16LE', 'UTF-16BE', 'UTF-16LE without BOM'] as const) {
      expect(parseCaptureFileBytes(encodeText(table(good), encoding)).channels[0].values.length).toBe(N);
    }
    const padded = parseCaptureFileBytes(bytes(table(good), new Array<number>(512).fill(0)));
    expect(padded.channels[0].values.length).toBe(N);
    expect(padded.warnings.at(-1)).toMatch(/^1 line\(s\) after the last data row were ignored \(from line 32: '\u0000/);
  });
});

describe("rows of the table's shape after a line of text", () => {
  it('refuses a line of text where the rows resume a few steps on; leaves out rows of the shape far beyond the time', () => {
    const gap = [...good.slice(0, 12), 'Marker', ...good.slice(15)];
    expect(captureError(table(gap)).message).toBe("line 14: expected 3 numeric columns, found 'Marker' (column 1)");
    const totals = parseCapture(`${table(good)}Totals\n${N},1.5,1.5\n0,-1.5,-1.5\n`);
    expect(totals.layout.rows).toBe(N);
    expect(totals.warnings.at(-1)).toBe("3 line(s) after the last data row were ignored (from line 32: 'Totals')");
  });
});
