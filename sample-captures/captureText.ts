// Writes one sample capture's text in its layout (see SampleLayout in scenarios.ts).

import type { SampleLayout } from './scenarios';

export interface TextChannel {
  name: string;
  /** SI unit of `values` ('V', 'A'). */
  unit: string;
  values: Float64Array;
  /** Written in milli-units (mV, mA) by the layouts with bracketed units. */
  milli?: boolean;
}

export interface CaptureTextInput {
  layout: SampleLayout;
  title: string;
  sampleInterval: number;
  /** File time axis, s (ignored by the interval-only layout, whose axis starts at 0). */
  time: Float64Array;
  channels: TextChannel[];
}

/** Scope-style exponent notation with a two-digit exponent: -1.000000E-07. */
function scientific(x: number): string {
  return x
    .toExponential(6)
    .toUpperCase()
    .replace(/E([+-])(\d)$/, 'E$10$2');
}

/** Shortest spelling of x at `digits` significant digits. */
function compact(x: number, digits: number): string {
  return String(Number(x.toPrecision(digits)));
}

function rows(columns: string[][], delimiter: string): string[] {
  const out: string[] = [];
  for (let i = 0; i < columns[0].length; i++) out.push(columns.map((c) => c[i]).join(delimiter));
  return out;
}

function formatted(values: ArrayLike<number>, format: (x: number) => string): string[] {
  return Array.from(values, format);
}

export function captureText(input: CaptureTextInput): string {
  const { layout, title, sampleInterval, time, channels } = input;
  const value = (x: number) => compact(x, 7);
  const valueColumns = channels.map((c) => formatted(c.values, value));
  let lines: string[];
  switch (layout) {
    case 'plain':
      lines = [
        ['Time (s)', ...channels.map((c) => `${c.name} (${c.unit})`)].join(','),
        ...rows([formatted(time, scientific), ...valueColumns], ','),
      ];
      break;
    case 'preamble-comma':
      lines = [
        `Title,${title}`,
        'Instrument,simulated 8-bit bench scope',
        `Sample Interval,${scientific(sampleInterval)}`,
        `Record Length,${time.length}`,
        '',
        ['Time (s)', ...channels.map((c) => `${c.name} (${c.unit})`)].join(','),
        ...rows([formatted(time, scientific), ...valueColumns], ','),
      ];
      break;
    case 'semicolon-decimal-comma': {
      const comma = (s: string) => s.replace('.', ',');
      const scale = (c: TextChannel) => (c.milli ? 1e3 : 1);
      lines = [
        `Title;${title}`,
        'Instrument;simulated 8-bit bench scope',
        `Sample interval;${comma(scientific(sampleInterval))}`,
        `Record length;${time.length}`,
        '',
        ['Time [ns]', ...channels.map((c) => `${c.name} [${c.milli ? 'm' : ''}${c.unit}]`)].join(';'),
        ...rows(
          [
            formatted(time, (t) => comma(compact(t * 1e9, 9))),
            ...channels.map((c) => formatted(c.values, (x) => comma(compact(x * scale(c), 7)))),
          ],
          ';',
        ),
      ];
      break;
    }
    case 'interval-only':
      lines = [
        `# ${title}: simulated 8-bit bench scope, no time column`,
        `Sample Interval,${scientific(sampleInterval)}`,
        `Record Length,${time.length}`,
        channels.map((c) => `${c.name} (${c.unit})`).join(','),
        ...rows(valueColumns, ','),
      ];
      break;
    case 'tab-microseconds':
      lines = [
        ['Time [us]', ...channels.map((c) => `${c.name} [${c.unit}]`)].join('\t'),
        ...rows([formatted(time, (t) => compact(t * 1e6, 9)), ...valueColumns], '\t'),
      ];
      break;
  }
  return lines.join('\n') + '\n';
}
