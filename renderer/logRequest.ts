// The bench-log requests of the window: the measurement on screen, laid out as the command line logs it, and
// the amendment or withdrawal of a logged one.

import type { BenchState } from './benchState';
import type { BenchLogRequest, LogCorrectionRequest } from './bridgeTypes';
import type { BenchRecord } from '../core/report/benchRecord';
import type { CorrectionAction, LabelChanges } from '../core/report/logCorrection';
import { fitSucceeded } from '../core/report/fitSummary';
import { BenchError } from './benchError';
import { segmentRead } from './traceData';

export interface LogForm {
  unit: string;
  operator: string;
  note: string;
}

export function buildLogRequest(state: BenchState, form: LogForm): BenchLogRequest {
  const { capture, summary, components, design, verdict, cautions, userWindow } = state;
  if (!capture || !summary) throw new BenchError('there is no fitted measurement to log: open a capture first');
  if (!fitSucceeded(summary)) throw new BenchError(`the fit did not converge (${summary.status}): there is no measurement to log`);
  if (form.unit.trim() === '') throw new BenchError('give the unit under test a name or serial number before logging');
  const refusal = state.setupChecks.find((check) => check.level === 'refusal');
  if (refusal) throw new BenchError(`a setup check refused the answer, so there is no measurement to log: ${refusal.message}`);
  const channel = capture.info.channels[capture.channel];
  const { units } = state.reading;
  const segment = segmentRead(capture.info);
  const probe = capture.probes?.[capture.channel];
  const input = state.componentsInput;
  const knownOption = components ? `${input.knownName}=${input.knownText.trim()}${input.toleranceText.trim() ? `,${input.toleranceText.trim().replace(/\s*%?$/, '%')}` : ''}` : null;
  const { advice: _advice, adviceSource: _source, deferral: _deferral, ...logged } = cautions ?? { fired: [], energies: {}, advice: [], adviceSource: '', deferral: '' };
  return {
    unit: form.unit.trim(),
    operator: form.operator.trim() || null,
    note: form.note.trim() || null,
    capture: { path: capture.opened.path ?? capture.opened.name, sha256: capture.sha256, bytes: capture.bytes, channel: channel.name },
    settings: {
      topology: components ? components.topology : null,
      known: knownOption,
      column: channel.name,
      sampleInterval: null,
      from: userWindow.start === undefined ? null : String(userWindow.start),
      to: userWindow.end === undefined ? null : String(userWindow.end),
      sortTime: false,
      ...(units.timeUnit ? { timeUnit: units.timeUnit } : {}),
      ...(units.valueUnit ? { valueUnit: units.valueUnit } : {}),
      ...(segment > 1 ? { segment: String(segment) } : {}),
      ...(probe?.ratioText ? { probeRatio: probe.ratioText } : {}),
      ...(probe?.invert ? { invert: true } : {}),
    },
    fit: components ? { ...summary, components: { topology: components.topology, known: components.known, R: components.R, L: components.L, C: components.C } } : summary,
    verdict,
    design: design ? { path: design.path, name: design.design.name, sha256: design.sha256, spec: design.design } : null,
    cautions: logged,
    ...(state.setupChecks.length ? { setupChecks: state.setupChecks } : {}),
  };
}

/** The labels as typed in the change form, and why. */
export interface CorrectionForm extends LogForm {
  reason: string;
}

/** An amendment of the labels that differ from the record's (a blank operator or note clears it), or a withdrawal; BenchError when nothing would change or no reason is given. */
export function buildCorrectionRequest(record: BenchRecord, form: CorrectionForm, action: CorrectionAction): LogCorrectionRequest {
  if (form.reason.trim() === '') throw new BenchError(`say why the measurement of ${record.unit} is ${action === 'amend' ? 'amended' : 'withdrawn'}: the reason is kept in the log`);
  const changes: LabelChanges = {};
  if (action === 'amend') {
    const unit = form.unit.trim();
    const operator = form.operator.trim() || null;
    const note = form.note.trim() || null;
    if (unit === '') throw new BenchError('the unit under test needs a name or serial number');
    if (unit !== record.unit) changes.unit = unit;
    if (operator !== record.operator) changes.operator = operator;
    if (note !== record.note) changes.note = note;
    if (!Object.keys(changes).length) throw new BenchError('change the unit, operator or note first: the amendment would change nothing');
  }
  return { target: record.id, action, changes, reason: form.reason.trim() };
}
