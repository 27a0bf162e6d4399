// A fit as the window copies and captions it: the CSV header and row, and the exported plot's caption.

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fitCsv } from '../../core/report/fitCsv';
import { plotCaption } from '../../core/report/plotCaption';
import { measureCapture } from '../../core/workflow/measure';
import { parseCapture } from '../../core/capture/parseCapture';

const samples = resolve(__dirname, '../../sample-captures');

function measured(file: string, known?: { name: 'C'; value: number }) {
  const capture = parseCapture(readFileSync(resolve(samples, file), 'utf8'));
  return measureCapture({ channel: capture.channels[0], file, ...(known ? { knownPart: { topology: 'series', known } } : {}) }).summary;
}

describe('fitCsv', () => {
  it('writes one header and one row with the values in SI base units and the known part', () => {
    const summary = measured('input-filter-step.csv', { name: 'C', value: 47e-6 });
    const [header, row, end] = fitCsv(summary).split('\r\n');
    expect(end).toBe('');
    const cells = Object.fromEntries(header.split(',').map((name, k) => [name, row.split(',')[k]]));
    expect(cells.file).toBe('input-filter-step.csv');
    expect(Number(cells.omega0_rad_per_s)).toBe(summary.omega0.value);
    expect(Number(cells.omega0_rad_per_s_stderr)).toBe(summary.omega0.stderr);
    expect(Number(cells.C_f)).toBe(47e-6);
    expect(cells.tau_s).toBe('');
    // The last cell holds a comma, so it is quoted (the split above reads it in two).
    expect(header.endsWith(',known_part')).toBe(true);
    expect(row.endsWith(`,"series, C = 47 µF, taken as exact (no tolerance given: R and L carry the fit's uncertainty only)"`)).toBe(true);
  });
});

describe('plotCaption', () => {
  it('names the file and channel, and gives f0, zeta and Q with their uncertainties', () => {
    const summary = measured('input-filter-step.csv');
    const caption = plotCaption('input-filter-step.csv', 'CH1 (V)', summary);
    expect(caption.source).toBe('input-filter-step.csv · CH1 (V)');
    expect(caption.fit).toMatch(/^converged, underdamped · f0 = 8\.90\d* kHz ± [\d.]+ Hz · zeta = 0\.19\d* ± [\d.]+ · Q = 2\.5\d* ± [\d.]+$/);
  });

  it('says when there is no fit', () => {
    expect(plotCaption('a.csv', 'CH1 (V)', null).fit).toBe('not fitted');
  });
});
