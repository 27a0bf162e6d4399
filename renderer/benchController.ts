// The window's actions: open a capture, fit it in the worker, derive components, check the design,
// evaluate the cautions, log the measurement, export; each ends by re-rendering the panels.

import { componentsFromResponse } from '../core/circuit/components';
import { parseDesign, serializeDesign } from '../core/circuit/design';
import { evaluateCautions } from '../core/safety/evaluateCautions';
import { cautionInputsFromCapture } from '../core/safety/cautionInputs';
import { plainMessage } from './plainMessage';
import { BenchError } from './benchError';
import type { BenchState, ComponentsInput, LoadedDesign } from './benchState';
import type { Bridge, NamedText, OpenedCapture, ReportFormat, SampleEntry } from './bridgeTypes';
import { FitCancelled, type FitClient } from './fitClient';
import type { FitPlot } from './plot/fitPlot';
import type { FitWindow } from './workerProtocol';
import { parsePositive, splitKnownOption } from './parseInputs';
import { parseTolerance } from '../core/workflow/userValues';
import { rememberCapture, recallCapture } from './lastCapture';
import { sha256Hex } from './sha256';
import { buildLogRequest, type LogForm } from './logRequest';
import { extractFromCaptures, type ExtractionRow, type ExtractionSettings } from './extraction';
import { alphaOmega0Correlation } from '../core/fit/correlation';

export type { ExtractionRow, ExtractionSettings } from './extraction';

export class BenchController {
  private fitGeneration = 0;
  private captureCount = 0;
  private busyCount = 0;

  constructor(
    readonly state: BenchState,
    private readonly bridge: Bridge,
    private readonly client: FitClient,
    private readonly plot: FitPlot,
    private readonly render: () => void,
  ) {}

  /** First start: the last capture again, else a bundled sample with its design, already fitted. */
  async start(): Promise<void> {
    await this.run('reading the sample list', async () => {
      this.state.samples = await this.bridge.listSamples();
      this.state.designs = await this.bridge.listDesigns();
    });
    void this.refreshLog();
    const forced = new URLSearchParams(location.search).get('sample');
    if (forced) return this.openSample(forced);
    const last = await recallCapture();
    if (last?.kind === 'file') return this.openCapture({ name: last.name, text: last.text, path: last.path, sampleId: null }, { channel: last.channel });
    if (last?.kind === 'sample' && this.state.samples.some((s) => s.id === last.id)) return this.openSample(last.id, last.channel);
    const first = this.state.samples.find((s) => s.designId !== null) ?? this.state.samples[0];
    if (first) return this.openSample(first.id);
  }

  async openSample(id: string, channel?: number): Promise<void> {
    const sample = await this.run('opening the sample capture', () => this.bridge.readSample(id));
    if (!sample) return;
    await this.openCapture(sample, { sample: sample.sample, design: sample.design, channel });
  }

  async pickCapture(): Promise<void> {
    const opened = await this.run('opening a capture', () => this.bridge.pickCapture());
    if (opened) await this.openCapture(opened, {});
  }

  async openDropped(file: File): Promise<void> {
    const opened = await this.run(`opening ${file.name}`, () => this.bridge.openDropped(file));
    if (opened) await this.openCapture(opened, {});
  }

  async openCapture(opened: OpenedCapture, options: { sample?: SampleEntry; design?: NamedText | null; channel?: number }): Promise<void> {
    const key = `capture-${++this.captureCount}`;
    // A long fit of the previous capture must not hold this one up.
    if (this.client.busy) this.client.cancelAll();
    const done = await this.run(`reading ${opened.name}`, async () => {
      const reply = await this.client
        .request({ type: 'open', captureId: key, name: opened.name, text: opened.text }, (stage) => this.progress(stage))
        .catch((error: unknown) => {
          throw error instanceof FitCancelled ? error : new BenchError(`${opened.name}: ${plainMessage(error)}`);
        });
      if (reply.type !== 'open') throw new BenchError('the fit worker gave an unexpected answer');
      const digest = await sha256Hex(opened.text);
      const sample = options.sample ?? null;
      const byName = sample?.options.column ? reply.info.channels.findIndex((c) => c.name === sample.options.column) : -1;
      const channel = options.channel ?? (byName >= 0 ? byName : 0);
      this.state.capture = { key, opened, info: reply.info, channel: Math.min(channel, reply.info.channels.length - 1), sample, ...digest };
      this.state.userWindow = {};
      this.state.eventTime = null;
      this.state.fit = null;
      this.state.summary = null;
      this.state.trace = null;
      this.state.verdict = null;
      if (sample) this.applySampleOptions(sample);
      return true;
    });
    if (!done) return;
    document.title = `${opened.name} — Ringbench`;
    if (options.design) await this.loadDesignText(options.design, `sample-captures/designs/${options.design.name}`, 'sample');
    else if (options.sample || this.state.design?.origin === 'sample') this.clearDesign();
    await this.loadTrace();
    await this.refit();
    const capture = this.state.capture;
    if (capture) {
      void rememberCapture(
        capture.opened.sampleId
          ? { kind: 'sample', id: capture.opened.sampleId, channel: capture.channel }
          : { kind: 'file', name: opened.name, path: opened.path, text: opened.text, channel: capture.channel },
      );
    }
  }

  async chooseChannel(index: number): Promise<void> {
    if (!this.state.capture) return;
    this.state.capture.channel = index;
    this.state.userWindow = {};
    this.state.eventTime = null;
    this.state.fit = null;
    this.state.summary = null;
    await this.loadTrace();
    await this.refit();
    const capture = this.state.capture;
    if (capture.opened.sampleId) void rememberCapture({ kind: 'sample', id: capture.opened.sampleId, channel: index });
  }

  /** A new fit window (from the plot or the fields); an empty one goes back to the automatic window. */
  async setWindow(window: FitWindow): Promise<void> {
    this.state.userWindow = window;
    await this.refit();
  }

  /** The channel's samples, drawn at once so the capture shows while its fit runs. */
  private async loadTrace(): Promise<void> {
    const capture = this.state.capture;
    if (!capture) return;
    const reply = await this.run('reading the channel', () => this.client.request({ type: 'trace', captureId: capture.key, channel: capture.channel }));
    if (capture !== this.state.capture) return;
    this.state.trace = reply?.type === 'trace' ? reply.trace : null;
    this.updateCautions();
    await this.drawPlot();
  }

  private async refit(): Promise<void> {
    const capture = this.state.capture;
    if (!capture || !this.state.trace) return;
    const generation = ++this.fitGeneration;
    const reply = await this.run('fitting', () =>
      this.client.request({ type: 'fit', captureId: capture.key, channel: capture.channel, window: this.state.userWindow }, (stage) => this.progress(stage)),
    );
    if (generation !== this.fitGeneration || !reply || reply.type !== 'fit') return this.render();
    const { fit, summary, fitError } = reply.result;
    if (fit && this.state.userWindow.start === undefined && fit.status !== 'failed') this.state.eventTime = fit.t0.value;
    this.state.fit = fit;
    this.state.summary = summary;
    this.state.fitError = fitError;
    this.state.fitCount++;
    this.updateComponents();
    await this.runCheck();
    await this.drawPlot();
  }

  setComponentsInput(change: Partial<ComponentsInput>): void {
    this.state.componentsInput = { ...this.state.componentsInput, ...change };
    this.updateComponents();
    this.render();
  }

  private applySampleOptions(sample: SampleEntry): void {
    const known = sample.options.known ? splitKnownOption(sample.options.known) : null;
    const topology = sample.options.topology === 'parallel' ? 'parallel' : 'series';
    if (known) this.state.componentsInput = { topology, knownName: known.name, knownText: known.text, toleranceText: '' };
  }

  private updateComponents(): void {
    const { fit } = this.state;
    const input = this.state.componentsInput;
    this.state.components = null;
    this.state.componentsError = null;
    if (fit && input.knownText.trim() !== '') {
      try {
        const unit = { R: 'ohm', L: 'H', C: 'F' }[input.knownName];
        const value = parsePositive(input.knownText, unit, `known ${input.knownName}`);
        const tolerance = parseTolerance(input.toleranceText, `known ${input.knownName}`);
        if (!(fit.alpha.value > 0 && fit.omega0.value > 0)) throw new BenchError('the fit gives no positive alpha and omega0, so no components follow from it');
        const known = { name: input.knownName, value, ...(tolerance > 0 ? { tolerance } : {}) };
        const values = componentsFromResponse(fit.alpha, fit.omega0, input.topology, known, alphaOmega0Correlation(fit.correlation));
        const knownText = `${known.name}=${known.value}${tolerance ? ` (±${tolerance * 100} %)` : ''}`;
        this.state.components = { ...values, known: knownText, topology: input.topology };
      } catch (error) {
        this.state.componentsError = plainMessage(error);
      }
    }
    this.updateCautions();
  }

  private updateCautions(): void {
    const { trace, components, design } = this.state;
    if (!trace) {
      this.state.cautions = null;
      return;
    }
    // As `ringbench log add`: the design's parts when there is a design, else the derived ones.
    const C = design ? design.design.components.C.value : components?.C;
    const L = design ? design.design.components.L.value : components?.L;
    try {
      this.state.cautions = evaluateCautions(cautionInputsFromCapture(trace.values, trace.unit, { C, L }));
    } catch (error) {
      this.state.cautions = null;
      this.state.error = plainMessage(error);
    }
  }

  async loadDesignFromSamples(id: string): Promise<void> {
    const named = await this.run('reading the design', () => this.bridge.readDesign(id));
    if (named) await this.applyDesign(named, `sample-captures/designs/${named.name}`, 'user');
  }

  async pickDesign(): Promise<void> {
    const named = await this.run('opening a design', () => this.bridge.pickDesign());
    if (named) await this.applyDesign(named, named.name, 'user');
  }

  /** A design as edited in the panel's fields (values as typed; parseDesign reads the prefixes). */
  async useEditedDesign(fields: Record<string, unknown>): Promise<void> {
    const text = `${JSON.stringify(fields, null, 2)}\n`;
    const name = typeof fields.name === 'string' && fields.name.trim() ? fields.name.trim() : 'design';
    await this.applyDesign({ name: `${name.replace(/[^A-Za-z0-9._-]+/g, '-')}.json`, text }, 'edited in the window', 'user');
  }

  async saveDesign(): Promise<void> {
    const loaded = this.state.design;
    if (!loaded) return;
    const saved = await this.run('saving the design', () =>
      this.bridge.saveFile({ suggestedName: loaded.name.endsWith('.json') ? loaded.name : `${loaded.name}.json`, content: serializeDesign(loaded.design), encoding: 'utf8' }, 'application/json'),
    );
    if (saved) this.state.designError = null;
    this.render();
  }

  private async applyDesign(named: NamedText, path: string, origin: LoadedDesign['origin']): Promise<void> {
    await this.loadDesignText(named, path, origin);
    await this.runCheck();
    await this.drawPlot();
  }

  private async loadDesignText(named: NamedText, path: string, origin: LoadedDesign['origin']): Promise<void> {
    try {
      const design = parseDesign(named.text);
      const { sha256 } = await sha256Hex(named.text);
      const loaded: LoadedDesign = { design, name: named.name, path, text: named.text, sha256, origin };
      this.state.design = loaded;
      this.state.designError = null;
    } catch (error) {
      this.state.designError = plainMessage(error);
      this.state.verdict = null;
    }
    this.updateCautions();
    this.render();
  }

  clearDesign(): void {
    this.state.design = null;
    this.state.verdict = null;
    this.state.designError = null;
    this.updateCautions();
    void this.drawPlot();
  }

  async runCheck(): Promise<void> {
    const { capture, fit, design } = this.state;
    this.state.verdict = null;
    if (fit && fit.status === 'failed') return this.render();
    this.state.verdictError = null;
    if (!capture || !fit || !design) return this.render();
    const t0 = this.state.eventTime === null ? fit.t0 : { ...fit.t0, value: this.state.eventTime };
    const reply = await this.run('checking against the design', () =>
      this.client.request({ type: 'check', captureId: capture.key, channel: capture.channel, design: design.design, fit: { ...fit, t0 } }),
    );
    if (reply?.type === 'check') this.state.verdict = reply.verdict;
    else if (!reply) this.state.verdictError = this.state.error;
    this.render();
  }

  async drawPlot(): Promise<void> {
    const { capture, trace, fit, design } = this.state;
    this.render();
    if (!capture || !trace) return;
    await this.plot.show({
      key: `${capture.key}:${capture.channel}`,
      trace,
      params: fit && fit.status !== 'failed' ? fit.params : null,
      window: fit ? fit.window : null,
      design: design?.design ?? null,
      eventTime: this.state.eventTime ?? fit?.t0.value ?? 0,
    });
  }

  async refreshLog(): Promise<void> {
    try {
      this.state.log = await this.bridge.readBenchLog();
      this.state.logError = null;
    } catch (error) {
      this.state.logError = plainMessage(error);
    }
    this.render();
  }

  async logMeasurement(form: LogForm): Promise<boolean> {
    this.state.logMessage = null;
    const request = (() => {
      try {
        return buildLogRequest(this.state, form);
      } catch (error) {
        this.state.logError = plainMessage(error);
        this.render();
        return null;
      }
    })();
    if (!request) return false;
    const view = await this.run('adding to the bench log', () => this.bridge.appendBenchLog(request));
    if (!view) {
      this.state.logError = this.state.error;
      this.state.error = null;
      this.render();
      return false;
    }
    this.state.log = view;
    this.state.logError = null;
    this.state.logMessage = `Logged ${request.unit} (${view.records.length} measurement${view.records.length === 1 ? '' : 's'} in the log).`;
    this.render();
    return true;
  }

  async exportReport(format: ReportFormat): Promise<void> {
    const mime = { html: 'text/html', md: 'text/markdown', csv: 'text/csv' }[format];
    const report = await this.run('making the report', () => this.bridge.renderReport(format));
    if (!report) return;
    const saved = await this.run('saving the report', () => this.bridge.saveFile({ suggestedName: report.name, content: report.text, encoding: 'utf8' }, mime));
    this.state.logMessage = saved ? `Report saved to ${saved}.` : `Report ${report.name} made.`;
    this.render();
  }

  async exportPlot(format: 'png' | 'svg'): Promise<void> {
    if (!this.state.trace) return;
    const base = (this.state.capture?.opened.name ?? 'capture').replace(/\.[^.]+$/, '');
    const url = await this.run(`exporting the plot as ${format.toUpperCase()}`, () => this.plot.exportImage(format));
    if (!url) return;
    const comma = url.indexOf(',');
    const content = format === 'png' ? url.slice(comma + 1) : decodeURIComponent(url.slice(comma + 1));
    await this.run('saving the plot', () =>
      this.bridge.saveFile({ suggestedName: `${base}-fit.${format}`, content, encoding: format === 'png' ? 'base64' : 'utf8' }, format === 'png' ? 'image/png' : 'image/svg+xml'),
    );
  }

  /** A capture for the extraction list; it is not opened in the plot. */
  pickForExtraction(): Promise<OpenedCapture | null> {
    return this.run('opening a capture', () => this.bridge.pickCapture());
  }

  readSampleText(id: string): Promise<OpenedCapture | null> {
    return this.run('reading the sample capture', () => this.bridge.readSample(id));
  }

  async runExtraction(rows: ExtractionRow[], settings: ExtractionSettings): Promise<void> {
    this.state.extraction = null;
    this.state.extractionError = null;
    try {
      this.state.extraction = await extractFromCaptures(this.client, rows, settings, (stage) => this.progress(stage));
    } catch (error) {
      this.state.extractionError = error instanceof FitCancelled ? 'stopped: another capture was opened; extract again' : plainMessage(error);
    } finally {
      this.progress(null);
    }
    this.render();
  }

  dismissError(): void {
    this.state.error = null;
    this.render();
  }

  /** Run one step with a progress line; failures become the window's error message and null. */
  private async run<T>(label: string, step: () => Promise<T>): Promise<T | null> {
    this.busyCount++;
    this.progress(label);
    try {
      const value = await step();
      return value;
    } catch (error) {
      if (!(error instanceof FitCancelled)) this.state.error = plainMessage(error);
      return null;
    } finally {
      this.busyCount--;
      if (this.busyCount === 0) this.progress(null);
    }
  }

  private progress(stage: string | null): void {
    this.state.busy = stage === null && this.busyCount > 0 ? this.state.busy : stage;
    this.render();
  }
}

