// The window's extraction fields refuse a value whose tolerance is missing, as the command line does: the switch Coss,
// the plateau voltage and the probe capacitance each set what is derived from them.
import { describe, expect, it } from 'vitest';
import { parasiticsAsk, type ExtractionRow, type ExtractionSettings } from '../../renderer/actions/extraction';

const ROWS: ExtractionRow[] = [
  { name: 'bare.csv', content: { text: 't,v\n0,1\n' }, addedText: '', deratingText: '' },
  { name: 'with.csv', content: { text: 't,v\n0,1\n' }, addedText: '470p', deratingText: '' },
];
const SETTINGS: ExtractionSettings = {
  addedToleranceText: '5', probeText: '', probeToleranceText: '', bandwidthText: '', voltageText: '', switchingText: '',
  dcBiasText: '', deratingToleranceText: '', switchCText: '',
  edge: { file: null, currentChannelText: '', voltageChannelText: '', plateauText: '' },
};
const EDGE = { file: { name: 'edge.csv', text: 't,i\n0,0\n' }, currentChannelText: '', voltageChannelText: '' };

describe('extraction fields that need a tolerance', () => {
  it.each([
    [{ switchCText: '180p' }, /^switch Coss '180p': give its tolerance in % after a comma, e\.g\. 180p,10/],
    [{ probeText: '12p' }, /^probe C tolerance: give the probe capacitance's tolerance in %/],
    [{ edge: { ...EDGE, plateauText: '9.5' } }, /^plateau voltage '9\.5': give its tolerance in % after a comma/],
  ])('%j is refused, naming the field', (typed, message) => {
    expect(() => parasiticsAsk(ROWS, { ...SETTINGS, ...typed })).toThrow(message);
  });

  it('each is read with its tolerance, 0 taking the value as exact', () => {
    const ask = parasiticsAsk(ROWS, { ...SETTINGS, switchCText: '180p,20', probeText: '12p', probeToleranceText: '0', edge: { ...EDGE, plateauText: '9.5,10' } });
    expect(ask.switchC).toEqual({ value: 180e-12, tolerance: 0.2 });
    expect(ask.probeC).toBeCloseTo(12e-12, 20);
    expect(ask.probeCTolerance).toBe(0);
    expect(ask.edge?.plateau?.value).toBe(9.5);
    expect(ask.edge?.plateau?.stderr).toBeGreaterThan(0);
  });
});
