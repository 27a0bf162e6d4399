// parseDesign / serializeDesign: the design file layout, prefixes, defaults and field-path errors.
import { describe, expect, it } from 'vitest';
import { DesignError, parseDesign, serializeDesign } from '../../core/circuit/design';

const FILTER = {
  format: 'ringbench-design',
  version: 1,
  name: '48 V rail LC input filter',
  topology: 'series',
  components: { R: { value: '200m', tolerance: 0.1 }, L: { value: '10uH', tolerance: 0.2 }, C: { value: '22u', tolerance: 0.1 } },
  source: { kind: 'step', amplitude: '48V' },
  probe: 'capacitor-voltage',
};

function withChange(change: (d: any) => void): string {
  const d = structuredClone(FILTER) as any;
  change(d);
  return JSON.stringify(d);
}

describe('parseDesign', () => {
  it('reads values with SI prefixes into SI base units and fills defaults', () => {
    const d = parseDesign(JSON.stringify(FILTER));
    expect(d.components.R.value).toBeCloseTo(0.2, 15);
    expect(d.components.L.value).toBeCloseTo(10e-6, 20);
    expect(d.components.C.value).toBeCloseTo(22e-6, 20);
    expect(d.components.L.tolerance).toBe(0.2);
    expect(d.source).toEqual({ kind: 'step', amplitude: 48, initialLevel: 0 });
    expect(d.topology).toBe('series');
    expect(d.probe).toBe('capacitor-voltage');
  });

  it('reads the source level tolerance of either kind, and writes it back', () => {
    const step = parseDesign(withChange((d) => (d.source.levelTolerance = 0.05)));
    expect(step.source).toEqual({ kind: 'step', amplitude: 48, initialLevel: 0, levelTolerance: 0.05 });
    expect(parseDesign(serializeDesign(step))).toEqual(step);
    const natural = parseDesign(withChange((d) => (d.source = { kind: 'natural', capacitorVoltage: 20, levelTolerance: 0.02 })));
    expect(natural.source.levelTolerance).toBe(0.02);
  });

  it('reads a natural source, a missing tolerance as 0, and resistor markings such as 4k7', () => {
    const d = parseDesign(
      withChange((x) => {
        x.topology = 'parallel';
        x.components.R = { value: '4k7' };
        x.source = { kind: 'natural', capacitorVoltage: 20 };
        x.probe = 'inductor-current';
        x.notes = 'wireless-power test coil';
      }),
    );
    expect(d.components.R).toEqual({ value: 4700, tolerance: 0 });
    expect(d.source).toEqual({ kind: 'natural', capacitorVoltage: 20, inductorCurrent: 0 });
    expect(d.notes).toBe('wireless-power test coil');
  });

  it('serializes to text that reads back to the same design', () => {
    const d = parseDesign(JSON.stringify(FILTER));
    const text = serializeDesign(d);
    expect(parseDesign(text)).toEqual(d);
    expect(JSON.parse(text).components.L.value).toBeCloseTo(10e-6, 20);
  });

  const faults: { label: string; text: string; path: string; message: RegExp }[] = [
    { label: 'not JSON', text: '{ "format": ', path: '', message: /not valid JSON/ },
    { label: 'an array', text: '[]', path: '', message: /JSON object/ },
    { label: 'another format', text: withChange((d) => (d.format = 'something-else')), path: 'format', message: /ringbench-design/ },
    { label: 'a later version', text: withChange((d) => (d.version = 2)), path: 'version', message: /must be 1/ },
    { label: 'an empty name', text: withChange((d) => (d.name = ' ')), path: 'name', message: /non-empty/ },
    { label: 'a bad topology', text: withChange((d) => (d.topology = 'bridge')), path: 'topology', message: /"series", "parallel"/ },
    { label: 'a bad probe', text: withChange((d) => (d.probe = 'gate')), path: 'probe', message: /capacitor-voltage/ },
    { label: 'a missing component', text: withChange((d) => delete d.components.C), path: 'components.C', message: /missing/ },
    { label: 'an extra component', text: withChange((d) => (d.components.X = { value: 1 })), path: 'components.X', message: /unknown field/ },
    { label: 'a tolerance above 1', text: withChange((d) => (d.components.L.tolerance = 1.5)), path: 'components.L.tolerance', message: /must be a number between 0 and 1/ },
    { label: 'a text tolerance', text: withChange((d) => (d.components.R.tolerance = '5%')), path: 'components.R.tolerance', message: /between 0 and 1/ },
    { label: 'a negative value', text: withChange((d) => (d.components.C.value = -1e-6)), path: 'components.C.value', message: /positive/ },
    { label: 'an unreadable value', text: withChange((d) => (d.components.L.value = '10 furlongs')), path: 'components.L.value', message: /could not read/ },
    { label: 'a value in the wrong unit', text: withChange((d) => (d.components.L.value = '10uF')), path: 'components.L.value', message: /could not read/ },
    { label: 'a missing value', text: withChange((d) => delete d.components.R.value), path: 'components.R.value', message: /missing/ },
    { label: 'a bad source kind', text: withChange((d) => (d.source.kind = 'pulse')), path: 'source.kind', message: /"step", "natural"/ },
    { label: 'a zero step', text: withChange((d) => (d.source.amplitude = 0)), path: 'source.amplitude', message: /not be zero/ },
    { label: 'a natural source at rest', text: withChange((d) => (d.source = { kind: 'natural' })), path: 'source', message: /needs/ },
    { label: 'a step field on a natural source', text: withChange((d) => (d.source = { kind: 'natural', capacitorVoltage: 5, amplitude: 3 })), path: 'source.amplitude', message: /unknown field/ },
    { label: 'a level tolerance of 100 %', text: withChange((d) => (d.source.levelTolerance = 1)), path: 'source.levelTolerance', message: /between 0 and 1/ },
    { label: 'an unknown top-level field', text: withChange((d) => (d.colour = 'red')), path: 'colour', message: /unknown field/ },
    // JSON.parse keeps the last of two equal keys: a second tolerance pasted in would silently replace the first.
    {
      label: 'a key given twice',
      text: JSON.stringify(FILTER, null, 2).replace('"tolerance": 0.2', '"tolerance": 0.2, "tolerance": 0.5'),
      path: 'components.L.tolerance',
      message: /given twice \(line 13\); JSON keeps only the last/,
    },
    { label: 'a comment', text: `// filter of rev B\n${JSON.stringify(FILTER, null, 2)}`, path: '', message: /line 1, column 1: JSON has no comments/ },
    { label: 'a trailing comma', text: JSON.stringify(FILTER, null, 2).replace('"capacitor-voltage"', '"capacitor-voltage",'), path: '', message: /not valid JSON at line 25, column 1 \([^()]*\)$/ },
    { label: 'UTF-16 text read as UTF-8', text: '\ufffd\ufffd{\u0000"\u0000f\u0000', path: '', message: /zero bytes.*UTF-16.*save it as UTF-8/ },
    // A value off by orders of magnitude from any bench part: a lost prefix or exponent (1e-320 F).
    { label: 'text far larger than a design', text: withChange((d) => (d.notes = 'x'.repeat(1 << 20))), path: '', message: /over 1 MiB: a design file is a few kilobytes/ },
    { label: 'a capacitance no bench circuit holds', text: withChange((d) => (d.components.C.value = 1e-320)), path: 'components.C.value', message: /outside what a bench circuit holds/ },
    { label: 'an inductance no bench circuit holds', text: withChange((d) => (d.components.L.value = '10k')), path: 'components.L.value', message: /1\.00e\+4 H is outside.*\(1e-15 to 1000 H\)/ },
    // A long value is quoted by its first 60 characters: the message stays one short line.
    {
      label: 'a value of 200 000 digits',
      text: withChange((d) => (d.components.L.value = `${'1'.repeat(200_000)}x`)),
      path: 'components.L.value',
      message: new RegExp(`^design components\\.L\\.value: could not read '1{60}\\.\\.\\.' as a value in H \\('1{60}\\.\\.\\.' is not a valid value: expected .{50,200}\\)$`),
    },
  ];
  it.each(faults)('throws DesignError at "$path" for $label', ({ text, path, message }) => {
    let caught: unknown;
    try {
      parseDesign(text);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(DesignError);
    expect((caught as DesignError).path).toBe(path);
    expect((caught as DesignError).message).toMatch(message);
    if (path !== '') expect((caught as DesignError).message).toContain(`${path}:`);
  });
});
