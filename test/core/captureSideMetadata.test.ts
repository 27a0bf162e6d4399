// Metadata written beside the data (key/value cells in the first columns of the first rows): read as metadata, the rows as data.

import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { CaptureError } from '../../core/capture/types';

const N = 40;
const DT = 2e-7;
const T0 = -2e-6;
const valueAt = (i: number): number => Number((Math.exp(-i / 15) * Math.cos(i / 2)).toFixed(5));
const timeAt = (i: number): string => (T0 + i * DT).toExponential(6);

/** Rows 'key,value,unit,time,value,' with the metadata cells of `metadata[i]` (empty past its end). */
function besideRows(metadata: string[][], count = N): string {
  return Array.from({ length: count }, (_, i) => [...(metadata[i] ?? ['', '', '']), timeAt(i), valueAt(i), ''].join(',')).join('\n');
}

const METADATA = [
  ['Record Length', `${N}`, 'Points'],
  ['Sample Interval', `${DT}`, 's'],
  ['Trigger Point', '10', 'Samples'],
  ['', '', ''],
  ['', '', ''],
  ['', '', ''],
  ['Source', 'CH1', ''],
  ['Horizontal Units', 's', ''],
];

describe('metadata beside the data', () => {
  it('reads every row as data from the first, and the metadata cells as key/value pairs', () => {
    const capture = parseCapture(besideRows(METADATA));
    expect(capture.layout.firstDataLine).toBe(1);
    expect(capture.layout.rows).toBe(N);
    const [channel] = capture.channels;
    expect(capture.channels).toHaveLength(1);
    expect(channel.time[0]).toBeCloseTo(T0, 15);
    expect(capture.sampleInterval).toBeCloseTo(DT, 18);
    expect(Array.from(channel.values)).toEqual(Array.from({ length: N }, (_, i) => valueAt(i)));
    expect(capture.metadata).toMatchObject({ 'Record Length': `${N},Points`, Source: 'CH1', 'Sample Interval': `${DT},s` });
    expect(capture.warnings).toEqual([]);
  });

  it('reads as well when the first rows leave the metadata cells empty', () => {
    const capture = parseCapture(besideRows([['', '', ''], ['', '', ''], ['', '', ''], ...METADATA]));
    expect(capture.layout.rows).toBe(N);
    expect(capture.metadata.Source).toBe('CH1');
  });

  it('is refused, naming its line, when it comes after the rows the layout is decided on', () => {
    const late = [...Array.from({ length: 20 }, () => ['', '', '']), ['Source', 'CH1', '']];
    expect(() => parseCapture(besideRows(late))).toThrow(CaptureError);
    expect(() => parseCapture(besideRows(late))).toThrow(/^line 21: expected 5 numeric columns, found 'Source'/);
  });

  it('a key/value line above rows opening with an empty field stays in the preamble unless it fills their cells', () => {
    const rows = Array.from({ length: N }, (_, i) => `,${timeAt(i)},${valueAt(i)}`).join('\n');
    const capture = parseCapture(`Probe,10\nGain,1,\n${rows}`);
    expect(capture.layout.firstDataLine).toBe(3);
    expect(capture.metadata).toMatchObject({ Probe: '10', Gain: '1' });
    expect(capture.channels[0].time[0]).toBeCloseTo(T0, 15);
  });
});

describe('rows opening with empty fields and no metadata beside them', () => {
  it('are read as before when a line breaks them before the layout would wait for: the line is a footer, or junk', () => {
    const rows = (from: number, to: number): string => Array.from({ length: to - from }, (_, k) => `,${timeAt(from + k)},${valueAt(from + k)}`).join('\n');
    const footer = parseCapture(`${rows(0, 25)}\nEnd of data\n`);
    expect(footer.layout.rows).toBe(25);
    expect(footer.warnings).toEqual([
      'time column 2 states no unit and was read as seconds; state another unit with --time-unit',
      "1 line(s) after the last data row were ignored (from line 26: 'End of data')",
    ]);
    expect(() => parseCapture(`${rows(0, 8)}\nglitch\n${rows(9, 40)}`)).toThrow(/^line 9: expected 3 numeric columns, found 'glitch'/);
    expect(() => parseCapture(`${rows(0, 10)}\nEnd of data\n`)).toThrow(/^only 10 data row\(s\) from line 1; at least 20 samples are needed$/);
  });
});

describe('the channel named from the source the metadata states', () => {
  const rows = Array.from({ length: N }, (_, i) => `${timeAt(i)},${valueAt(i)}`).join('\n');

  it.each([
    ['beside the data', () => besideRows(METADATA)],
    ['in a key/value preamble', () => `Source,CH1\nRecord Length,${N}\n${rows}`],
    ['in a preamble, the one column holding values', () => `Source,CH3\nSample Interval,${DT}\n${Array.from({ length: N }, (_, i) => valueAt(i)).join('\n')}`],
  ])('%s: a column with no name of its own takes it', (_, text) => {
    expect(parseCapture(text()).channels.map((c) => c.name)).toEqual([text().includes('CH3') ? 'CH3' : 'CH1']);
  });

  it("a column's own name stays", () => {
    expect(parseCapture(`Source,CH1\nTime,Vout\n${rows}`).channels.map((c) => c.name)).toEqual(['Vout']);
  });

  it('several channels keep their generic names: one source names none of them for sure', () => {
    const two = Array.from({ length: N }, (_, i) => `${timeAt(i)},${valueAt(i)},${-valueAt(i)}`).join('\n');
    expect(parseCapture(`Source,CH1\nRecord Length,${N}\n${two}`).channels.map((c) => c.name)).toEqual(['channel 1', 'channel 2']);
  });
});
