// The window names its own controls where a core message names a command-line option.
import { describe, expect, it } from 'vitest';
import { inWindowTerms } from '../../renderer/windowTerms';
import { plainMessage } from '../../renderer/plainMessage';
import { parseKnown, parseTopology } from '../../core/workflow/userValues';
import { implausibility } from '../../core/circuit/plausibility';

describe('inWindowTerms', () => {
  it.each([
    ["line 3: the unit 'us' of 'Sample Interval' is replaced by --time-unit ms", "line 3: the unit 'us' of 'Sample Interval' is replaced by the 'Time in' choice (ms)"],
    ["'Time (fortnights)': unit 'fortnights' is not recognised; state the time unit with --time-unit", "'Time (fortnights)': unit 'fortnights' is not recognised; state the time unit with the 'Time in' choice"],
    ['only the first 10 events are fitted (--event N fits another)', "only the first 10 events are fitted (the 'Event to fit' choice takes another)"],
    ['--event 7: the record holds 3 events', "'Event to fit' 7: the record holds 3 events"],
    [
      'the 3 events the record suggested are taken for one response (--event N fits one of the events)',
      "the 3 events the record suggested are taken for one response (set 'Window from' and 'to' around one to fit it alone)",
    ],
    ['a.csv holds 3 events: a design is checked against one; set the fit window (--from, --to) around it', "a.csv holds 3 events: a design is checked against one; set the fit window ('Window from' and 'to') around it"],
    ['per V^2 Hz (give --voltage and --switching-frequency)', "per V^2 Hz (give 'Snubber voltage swing' and 'Switching frequency')"],
    ['--mode 3: the fit found 2 ringing modes', 'the mode chosen for R, L and C 3: the fit found 2 ringing modes'],
    [
      'no time column and no sample interval stated in the file; give the sample interval (option sampleInterval)',
      "no time column and no sample interval stated in the file; give the sample interval (the 'Sample interval' field)",
    ],
    ["the sampleInterval option replaces the time stamps of column 'Time (s)': t = 0 s + i × 2 ns", "the 'Sample interval' field replaces the time stamps of column 'Time (s)': t = 0 s + i × 2 ns"],
    [
      "column 'Temp (degC)': unit 'degC' is not recognised; state the channel's unit with --value-unit, or choose another channel with --column ('CH1')",
      "column 'Temp (degC)': unit 'degC' is not recognised; state the channel's unit with the 'Values in' choice, or choose another channel with the 'Channel' choice ('CH1')",
    ],
    ["channel 'C' of this capture varies: choose the channel to fit (--column)", "channel 'C' of this capture varies: choose the channel to fit (the 'Channel' choice)"],
    ['the time unit is probably misread (state it with --time-unit or --sample-interval)', "the time unit is probably misread (state it with the 'Time in' choice or the 'Sample interval' field)"],
  ])('%s', (message, shown) => {
    expect(inWindowTerms(message)).toBe(shown);
  });

  it('leaves a message naming no option as it is, and an option the window lacks as the command line says it', () => {
    expect(inWindowTerms('the fit window starts at or after its end')).toBe('the fit window starts at or after its end');
    expect(inWindowTerms('times go backwards at line 12; give --sort-time')).toBe('times go backwards at line 12; give --sort-time');
  });

  it('bad input from the shared parsers reaches the window in its terms', () => {
    const caught = (run: () => unknown) => {
      try {
        run();
      } catch (error) {
        return plainMessage(error);
      }
      throw new Error('no error');
    };
    expect(caught(() => parseKnown('C=abc'))).toMatch(/^'Known part' 'C=abc'/);
    expect(caught(() => parseTopology('ladder'))).toMatch(/^'Topology' 'ladder'/);
    expect(implausibility({ f0: 1e15, recordSpan: 1e-3, components: undefined })).not.toBeNull();
    expect(inWindowTerms(implausibility({ f0: 1e15, recordSpan: 1e-3, components: undefined }) as string)).toMatch(/the 'Time in' choice/);
  });
});
