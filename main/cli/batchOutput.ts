// What `batch` prints: the table, the JSON array (in folder order), and one JSON Lines object per capture.

import { isMeasured, type BatchOutcome } from '../app/batchFile';
import { InputError, type FailureText } from '../../core/inputError';
import { escapeControls } from '../../core/report/escape';
import { briefValue, regimeTag } from '../../core/report/resultRows';
import { fitWarnings } from '../../core/report/fitSummary';
import { messageFor } from './errors';

/** The failure a worker sent as plain data, worded as every command words an error (errors.ts). */
function failureMessage({ input, text }: FailureText): string {
  return messageFor(input ? new InputError(text) : new Error(text));
}

/** One element of `--json`: the fit summary with its file, verdict, noVerdict, setupChecks and cautions; { file, error } for a capture not measured. */
export function batchJsonOf(outcome: BatchOutcome): object {
  if (!isMeasured(outcome)) return { file: outcome.file, error: failureMessage(outcome.failure) };
  const { summary, verdict, cautions, noVerdict, file, setupChecks } = outcome;
  return { ...summary, file, verdict, ...(noVerdict ? { noVerdict } : {}), setupChecks, cautions };
}

/** One line of `--jsonl`: as `--json`'s element; a capture not measured is { file, status: 'error', message }. */
export function batchJsonLine(outcome: BatchOutcome): string {
  const object = isMeasured(outcome) ? batchJsonOf(outcome) : { file: outcome.file, status: 'error', message: failureMessage(outcome.failure) };
  return `${JSON.stringify(object)}\n`;
}

export function formatBatchTable(outcomes: readonly BatchOutcome[]): string {
  const header = ['file', 'status', 'warnings', 'regime', 'f0', 'zeta', 'Q', 'verdict', 'cautions'];
  const rows = outcomes.map((outcome) => {
    // A file name is one cell: a line break in it is shown escaped, not laid out.
    if (!isMeasured(outcome)) return [escapeControls(outcome.file), `error: ${failureMessage(outcome.failure)}`];
    const { summary: s, verdict, cautions, noVerdict } = outcome;
    return [
      escapeControls(outcome.file),
      s.status,
      String(fitWarnings(s).length),
      regimeTag(s) ?? '-',
      briefValue(s, 'f0'),
      briefValue(s, 'zeta'),
      briefValue(s, 'Q'),
      noVerdict ? 'none' : verdict ? (verdict.pass ? 'pass' : 'FAIL') : '-',
      cautions.fired.length ? cautions.fired.map((c) => c.id).join(',') : cautions.peakNotWeighed ? 'not weighed' : '-',
    ];
  });
  const widths = header.map((h, c) => Math.max(h.length, ...rows.filter((r) => r.length > 2).map((r) => r[c].length)));
  const line = (cells: string[]) => (cells.length === 2 ? cells.join('  ') : cells.map((cell, c) => cell.padEnd(widths[c])).join('  ').trimEnd());
  // Why a file got no verdict, one line each below the table (a reason is too long for a column).
  const refusals = outcomes.flatMap((o) => (isMeasured(o) && o.noVerdict ? [`${escapeControls(o.file)}: no verdict: ${o.noVerdict}`] : []));
  // A setup check's refusal (the capture cannot support the answer), one line each below the table too.
  const setupRefusals = outcomes.flatMap((o) => (isMeasured(o) ? o.setupChecks.filter((c) => c.level === 'refusal').map((c) => `${escapeControls(o.file)}: setup refused: ${c.message}`) : []));
  // A peak not weighed for the cautions is said once below the table, with the first file's reason.
  const reasons = outcomes.flatMap((o) => (isMeasured(o) && o.cautions.peakNotWeighed ? [o.cautions.peakNotWeighed] : []));
  const notWeighed = reasons.length ? [`cautions not weighed for ${reasons.length} file(s): ${reasons[0]}`] : [];
  return [line(header), ...rows.map(line), ...refusals, ...setupRefusals, ...notWeighed].map((l) => `${l}\n`).join('');
}
