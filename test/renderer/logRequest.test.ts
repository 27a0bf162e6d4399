// The window's bench-log request for a real fitted sample passes main's guards and becomes a valid record.

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseCapture } from '../../core/capture/parseCapture';
import { fitResponse } from '../../core/fit/fitResponse';
import { summarizeFit } from '../../core/report/fitSummary';
import { componentsFromResponse } from '../../core/circuit/components';
import { evaluateCautions } from '../../core/safety/evaluateCautions';
import { parseDesign } from '../../core/circuit/design';
import { buildLogRequest } from '../../renderer/logRequest';
import { initialState, type BenchState } from '../../renderer/benchState';
import { benchLogRequestProblem } from '../../main/api/guards';
import { recordFromRequest } from '../../main/api/logCalls';

const samples = resolve(dirname(fileURLToPath(import.meta.url)), '../../sample-captures');

function fittedState(): BenchState {
  const text = readFileSync(join(samples, 'input-filter-step.csv'), 'utf8');
  const capture = parseCapture(text);
  const channel = capture.channels[0];
  const fit = fitResponse({ time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name });
  const state = initialState('browser');
  state.capture = {
    key: 'capture-1',
    opened: { name: 'input-filter-step.csv', text, path: null, sampleId: null },
    info: { channels: [{ name: channel.name, unit: channel.unit, samples: channel.values.length, dropped: 0, clipped: 0 }], sampleInterval: capture.sampleInterval, warnings: [], rows: 0, import: capture.importSummary },
    channel: 0,
    sample: null,
    sha256: 'b'.repeat(64),
    bytes: text.length,
  };
  state.fit = fit;
  state.summary = summarizeFit('input-filter-step.csv', channel.name, fit, undefined, capture.warnings);
  state.componentsInput = { topology: 'series', knownName: 'C', knownText: '47u', toleranceText: '5' };
  const values = componentsFromResponse(fit.alpha, fit.omega0, 'series', { name: 'C', value: 47e-6, tolerance: 0.05 });
  state.components = { ...values, known: 'C=0.000047 (±5 %)', topology: 'series' };
  state.cautions = evaluateCautions({ peakVoltage: 74, capacitance: 47e-6 });
  state.userWindow = { start: -1e-4, end: 6e-4 };
  return state;
}

describe('buildLogRequest', () => {
  it('makes a request main accepts and logs as a valid record', () => {
    const state = fittedState();
    const request = buildLogRequest(state, { unit: ' FILTER-1 ', operator: '', note: 'first article' });
    expect(benchLogRequestProblem(JSON.parse(JSON.stringify(request)))).toBeNull();
    expect(request.settings).toEqual({ topology: 'series', known: 'C=47u,5%', column: 'CH1', sampleInterval: null, from: '-0.0001', to: '0.0006', sortTime: false });
    expect(request.fit.components?.known).toBe('C=0.000047 (±5 %)');
    expect(request.cautions).not.toHaveProperty('advice');
    const record = recordFromRequest(request, new Date('2030-05-06T07:08:09Z'), '0123456789ab');
    expect(record).toMatchObject({ unit: 'FILTER-1', operator: null, note: 'first article', capture: { path: 'input-filter-step.csv' } });
  });

  it('logs the units stated in the window, which main accepts and the report reads the capture with', () => {
    const state = fittedState();
    state.reading = { units: { timeUnit: 'us', valueUnit: '' } };
    const request = buildLogRequest(state, { unit: 'F3', operator: '', note: '' });
    expect(request.settings).toMatchObject({ timeUnit: 'us' });
    expect(request.settings).not.toHaveProperty('valueUnit');
    expect(benchLogRequestProblem(JSON.parse(JSON.stringify(request)))).toBeNull();
  });

  it.each([
    ['a line break', 'A\nB', /unit must not contain line breaks/],
    ['more than 100 characters', 'x'.repeat(101), /unit must be at most 100 characters/],
  ])('main refuses a unit with %s, as the command line does', (_name, unit, message) => {
    const request = buildLogRequest(fittedState(), { unit: 'ok', operator: '', note: '' });
    expect(() => recordFromRequest({ ...request, unit }, new Date())).toThrow(message);
  });

  it('carries the design and its verdict', () => {
    const state = fittedState();
    const text = readFileSync(join(samples, 'designs', 'input-filter-step.json'), 'utf8');
    state.design = { design: parseDesign(text), name: 'input-filter-step.json', path: 'sample-captures/designs/input-filter-step.json', text, sha256: 'c'.repeat(64), origin: 'sample' };
    const request = buildLogRequest(state, { unit: 'F2', operator: 'me', note: '' });
    expect(request.design?.spec.name).toBe(state.design.design.name);
    expect(benchLogRequestProblem(JSON.parse(JSON.stringify(request)))).toBeNull();
  });

  it.each([
    ['no unit', { unit: '  ', operator: '', note: '' }, /unit under test/],
  ])('refuses %s', (_name, form, message) => {
    expect(() => buildLogRequest(fittedState(), form)).toThrow(message);
  });

  it('refuses a fit that did not converge, as log add does', () => {
    const state = fittedState();
    state.summary = { ...state.summary!, status: 'max-iterations' };
    expect(() => buildLogRequest(state, { unit: 'X', operator: '', note: '' })).toThrow(/did not converge \(max-iterations\)/);
  });

  it('carries the setup checks into the record, and refuses an answer a setup check refused, as log add does (window and main)', () => {
    const state = fittedState();
    const warning = { id: 'acquisition-mode' as const, level: 'warning' as const, message: 'averaged record' };
    state.setupChecks = [warning];
    const request = buildLogRequest(state, { unit: 'X', operator: '', note: '' });
    expect(benchLogRequestProblem(JSON.parse(JSON.stringify(request)))).toBeNull();
    expect(recordFromRequest(request, new Date(), '0123456789ab').setupChecks).toEqual([warning]);
    const refusal = { id: 'sustained-oscillation' as const, level: 'refusal' as const, message: 'the ring does not decay' };
    state.setupChecks = [refusal];
    expect(() => buildLogRequest(state, { unit: 'X', operator: '', note: '' })).toThrow(/setup check refused the answer.*does not decay/);
    expect(() => recordFromRequest({ ...request, setupChecks: [refusal] }, new Date())).toThrow(/setup check refused the answer, nothing was logged/);
  });

  it('refuses when nothing is fitted', () => {
    expect(() => buildLogRequest(initialState('browser'), { unit: 'X', operator: '', note: '' })).toThrow(/no fitted measurement/);
  });
});
