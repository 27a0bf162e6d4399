// The capture panel: open a file, a sample or a recent capture, choose the channel, and what the importer found.

import { button, card, field, h, replaceChildren, select, textInput } from '../dom';
import { showValue } from '../show';
import { importRows } from '../../core/report/importText';
import type { BenchState } from '../benchState';
import type { CaptureInfo, StatedUnits, UnitRefusal } from '../workerProtocol';
import { segmentRead } from '../traceData';
import { recentCaptures } from '../captureMemory';
import type { BenchActions } from '../actions';
import { inWindowTerms } from '../windowTerms';

export function createCapturePanel(actions: BenchActions) {
  const { root, body } = card('Capture', 'capture-panel');
  const sampleSelect = h('select', { id: 'sample-select', attrs: { 'aria-label': 'Sample captures' } });
  sampleSelect.addEventListener('change', () => {
    if (sampleSelect.value) void actions.openSample(sampleSelect.value);
  });
  const recentSelect = h('select', { id: 'recent-select', attrs: { 'aria-label': 'Recent captures' } });
  recentSelect.addEventListener('change', () => {
    if (recentSelect.value) void actions.openRecent(recentSelect.value);
  });
  const buttons = h(
    'div',
    { class: 'actions' },
    button('Open capture…', () => void actions.pickCapture(), { id: 'open-capture', class: 'primary', title: 'Open a scope export (Ctrl+O), or drop it on the window' }),
    field('Sample', sampleSelect),
    field('Recent', recentSelect),
  );
  // The probe of the channel shown: built once, so typing is not undone by a redraw.
  const probeRatio = textInput('', { id: 'probe-ratio', attrs: { placeholder: '1', 'aria-label': 'Probe ratio: the channel\'s values are multiplied by it' } });
  const probeInvert = h('input', { id: 'probe-invert', attrs: { type: 'checkbox', 'aria-label': 'Probe connected reversed: the values change sign' } });
  const applyProbe = () => void actions.setProbe(probeRatio.value, probeInvert.checked);
  probeRatio.addEventListener('keydown', (e) => e.key === 'Enter' && applyProbe());
  probeInvert.addEventListener('change', applyProbe);
  const probeRow = h(
    'div',
    { class: 'probe-row', id: 'probe-row' },
    field('Probe ratio', probeRatio, "values × ratio, e.g. 10 for 10:1 read as 1:1"),
    h('label', { class: 'probe-invert' }, probeInvert, h('span', {}, 'inverted')),
    button('Apply', applyProbe, { id: 'apply-probe', title: 'Scale the channel by the probe ratio (and turn it over) and fit again, as --probe-ratio and --invert do' }),
  );
  // The sample interval stated, built once for the same reason; Enter (or leaving it) reads the file again with it.
  const intervalInput = textInput('', {
    id: 'sample-interval',
    attrs: { placeholder: 'as in the file', 'aria-label': "Sample interval: builds the time axis (e.g. 2n), over the file's own time column" },
  });
  intervalInput.addEventListener('change', () => void actions.stateInterval(intervalInput.value));
  // Whose probe the controls show: they are filled from the stored settings only when another capture or channel is
  // shown, never while the user's own change is being applied (a redraw would undo the click it answers).
  let probeOwner = '';
  const details = h('div', { class: 'details' });
  body.append(buttons, probeRow, details);
  let samplesShown = '';
  let recentShown = '';

  function render(state: BenchState): void {
    // The stated interval shows, unless the user is typing one.
    if (document.activeElement !== intervalInput) intervalInput.value = state.reading.sampleInterval ?? '';
    const list = state.samples.map((s) => s.id).join(',');
    if (list !== samplesShown) {
      samplesShown = list;
      replaceChildren(sampleSelect, h('option', { attrs: { value: '' } }, 'choose a sample…'), ...state.samples.map((s) => h('option', { attrs: { value: s.id }, title: s.description }, s.title)));
    }
    sampleSelect.value = state.capture?.opened.sampleId ?? '';
    const recent = recentCaptures();
    const recentList = recent.map((r) => r.id).join(',');
    if (recentList !== recentShown) {
      recentShown = recentList;
      replaceChildren(
        recentSelect,
        h('option', { attrs: { value: '' } }, recent.length ? 'open again…' : 'none yet'),
        ...recent.map((r) => h('option', { attrs: { value: r.id }, title: `${r.path ?? r.name}, opened ${r.openedAt.slice(0, 16).replace('T', ' ')}` }, r.name)),
      );
    }
    recentSelect.value = '';
    recentSelect.disabled = recent.length === 0;
    const capture = state.capture;
    const refused = state.refused;
    probeRow.hidden = !capture;
    const probe = capture?.probes?.[capture.channel];
    const owner = capture ? `${capture.key}:${capture.channel}` : '';
    if (owner !== probeOwner) {
      probeOwner = owner;
      probeRatio.value = probe?.ratioText ?? '';
      probeInvert.checked = probe?.invert ?? false;
    }
    if (!capture && refused) {
      replaceChildren(
        details,
        h(
          'dl',
          { class: 'facts' },
          h('dt', {}, 'File'),
          h('dd', { id: 'capture-name', title: refused.opened.path ?? refused.opened.name }, refused.opened.name),
          h('dt', {}, 'Not read'),
          h('dd', { class: 'error-text', id: 'capture-refusal', data: { unit: refused.refusal.unit } }, refused.refusal.message),
          h('dt', {}, 'Units'),
          h('dd', {}, unitChoices(state, refused.refusal.unit)),
        ),
      );
      return;
    }
    if (!capture) {
      replaceChildren(details, h('p', { class: 'muted' }, 'No capture open. Open a file, pick a sample, or drop a capture on the window.'));
      return;
    }
    const { info } = capture;
    const channel = info.channels[capture.channel];
    const channelControl =
      info.channels.length > 1
        ? select(
            info.channels.map((c, i) => ({ value: String(i), label: `${c.name}${c.unit ? ` (${c.unit})` : ''}` })),
            String(capture.channel),
            (value) => void actions.chooseChannel(Number(value)),
            { id: 'channel-select', attrs: { 'aria-label': 'Channel' } },
          )
        : h('span', { id: 'channel-name' }, `${channel.name}${channel.unit ? ` (${channel.unit})` : ''}`);
    const dt = info.sampleInterval;
    replaceChildren(
      details,
      h(
        'dl',
        { class: 'facts' },
        h('dt', {}, 'File'),
        h('dd', { id: 'capture-name', title: capture.opened.path ?? capture.opened.name }, capture.opened.name),
        capture.sample ? h('dt', {}, 'Scenario') : null,
        capture.sample ? h('dd', { class: 'scenario' }, capture.sample.description) : null,
        h('dt', {}, 'Channel'),
        h('dd', {}, channelControl),
        h('dt', {}, 'Units'),
        h('dd', {}, unitChoices(state, null)),
        info.import.segments.length > 1 ? h('dt', {}, 'Segment') : null,
        info.import.segments.length > 1 ? h('dd', {}, segmentChoice(info)) : null,
        h('dt', {}, 'Samples'),
        h('dd', { id: 'capture-samples' }, channel.samples.toLocaleString('en')),
        h('dt', {}, 'Sample rate'),
        h('dd', {}, dt ? `${showValue(1 / dt, 'Sa/s')} (every ${showValue(dt, 's')})` : 'uneven time axis'),
        h('dt', {}, 'Used in the fit'),
        h('dd', { id: 'samples-used' }, state.fit ? state.fit.samplesUsed.toLocaleString('en') : '—'),
        h('dt', {}, 'Clipped'),
        h('dd', { class: channel.clipped ? 'attention' : '' }, channel.clipped ? `${channel.clipped.toLocaleString('en')} samples at a rail (left out of the fit)` : 'none'),
        h('dt', {}, 'Dropped rows'),
        h('dd', { class: channel.dropped ? 'attention' : '' }, channel.dropped ? `${channel.dropped.toLocaleString('en')} (empty or unreadable cells)` : 'none'),
      ),
      // What the importer inferred, in the words the command line and the reports use (an option as the window's control).
      h('h3', {}, 'How the file was read'),
      h(
        'dl',
        { class: 'facts', id: 'capture-import' },
        ...importRows(info.import).flatMap((row) => [h('dt', {}, capitalized(row.label)), h('dd', { id: `import-${row.label.replace(/ /g, '-')}` }, inWindowTerms(row.text))]),
      ),
      info.warnings.length ? h('ul', { class: 'warnings', id: 'capture-warnings' }, ...info.warnings.map((w) => h('li', {}, inWindowTerms(w)))) : null,
    );
  }

  /** Which of the file's repeated acquisitions is read and fitted. */
  function segmentChoice(info: CaptureInfo): HTMLSelectElement {
    const { segments } = info.import;
    return select(
      segments.map((segment, i) => ({ value: String(i + 1), label: `${i + 1} of ${segments.length}: lines ${segment.firstLine}–${segment.lastLine}, ${segment.rows.toLocaleString('en')} rows` })),
      String(segmentRead(info)),
      (value) => void actions.chooseSegment(Number(value)),
      { id: 'segment-select', attrs: { 'aria-label': 'Segment (one of the repeated acquisitions in the file)' } },
    );
  }

  /** The time and value unit choices and the sample interval; the one a refusal names is marked. Choosing one reads the file again. */
  function unitChoices(state: BenchState, refusedUnit: UnitRefusal['unit'] | null): HTMLElement {
    const { units } = state.reading;
    const choice = (unit: UnitRefusal['unit'], label: string, options: readonly (readonly [string, string])[], value: string, change: (text: string) => StatedUnits) =>
      h(
        'label',
        { class: `unit-choice${refusedUnit === unit ? ' attention' : ''}` },
        h('span', {}, label),
        select(
          [{ value: '', label: 'as in the file' }, ...options.map(([text, shown]) => ({ value: text, label: shown }))],
          value,
          (text) => void actions.stateUnits(change(text)),
          { id: `${unit}-unit`, attrs: { 'aria-label': `${label} (the unit of the ${unit === 'time' ? 'time column or stated interval' : 'values, every channel'})` } },
        ),
      );
    return h(
      'div',
      { class: 'unit-choices' },
      choice('time', 'Time in', TIME_UNITS, units.timeUnit, (timeUnit) => ({ ...units, timeUnit })),
      choice('value', 'Values in', VALUE_UNITS, units.valueUnit, (valueUnit) => ({ ...units, valueUnit })),
      h('label', { class: `unit-choice${refusedUnit === 'interval' ? ' attention' : ''}` }, h('span', {}, 'Sample interval'), intervalInput),
    );
  }

  return { root, render };
}

/** The units a person can state, as the importer reads them and as shown; the same spellings as --time-unit and --value-unit take. */
const TIME_UNITS = [
  ['h', 'h'],
  ['min', 'min'],
  ['s', 's'],
  ['ms', 'ms'],
  ['us', 'µs'],
  ['ns', 'ns'],
  ['ps', 'ps'],
] as const;
const VALUE_UNITS = [
  ['V', 'V'],
  ['mV', 'mV'],
  ['uV', 'µV'],
  ['kV', 'kV'],
  ['A', 'A'],
  ['mA', 'mA'],
  ['uA', 'µA'],
] as const;

function capitalized(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
