// A fit summary as the readable table the command line prints.

import { formatEngineering, formatTimeRange } from '../units/format';
import { escapeControls } from './escape';
import { fitWarnings, type FitSummary } from './fitSummary';
import { formatEventsText } from './eventsText';
import { importRows } from './importText';
import { componentModeText, fitResultRows, fitTransitionRows, modelOrderText, regimeTag, transitionNote } from './resultRows';

/** Width of the label column: the longest label ('residual rms', 'samples used') and a space. */
const LABEL_WIDTH = 16;

function line(label: string, text: string): string {
  return `  ${label.padEnd(LABEL_WIDTH)} ${text}\n`;
}

export function formatFitText(s: FitSummary): string {
  // The file and channel names come from outside (a file system, a capture header): shown with controls escaped.
  let text = `${escapeControls(s.file)} (${escapeControls(s.channel)})\n`;
  // What the importer inferred comes first: a misread file explains any result below it.
  for (const row of s.import ? importRows(s.import) : []) text += line(row.label, row.text);
  text += line('status', `${s.status}${s.status === 'converged' ? '' : `: ${s.message}`}`);
  if (regimeTag(s) !== null) text += line('regime', `${s.regime} (${s.regimeEvidence})`);
  const order = modelOrderText(s);
  if (order) text += line('order', order);
  for (const row of fitResultRows(s)) {
    // The components' basis heads their rows.
    if (row.name === 'components.R' && s.components) text += line('components', [`${s.components.topology}, known ${s.components.known}`, componentModeText(s.components)].filter(Boolean).join(', '));
    text += line(row.symbol, row.text);
  }
  const note = transitionNote(s);
  if (note) text += line('transitions', note);
  for (const row of fitTransitionRows(s)) text += line(row.symbol, `${row.modelText}, measured ${row.measuredText}`);
  text += line('residual rms', `${formatEngineering(s.rmsResidual, s.finalValue.unit)} (noise ${formatEngineering(s.noiseRms, s.finalValue.unit)})`);
  text += line('samples used', `${s.samplesUsed}${s.decimation ? ` (${s.decimation.note})` : ''}`);
  text += line('fit window', formatTimeRange(s.window.start, s.window.end));
  if (s.events) text += formatEventsText(s.events);
  for (const w of fitWarnings(s)) text += `  warning: ${w}\n`;
  return text;
}

