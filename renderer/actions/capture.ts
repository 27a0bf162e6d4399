// The capture panel's actions: the first start, opening a sample, a file or a dropped file, and choosing the channel.

import { BenchError } from '../benchError';
import type { NamedText, OpenedFile, SampleEntry } from '../bridgeTypes';
import { FitCancelled } from '../fitClient';
import { rememberCapture, recallCapture, type RecentCapture, type RememberedCapture } from '../captureMemory';
import { plainMessage } from '../plainMessage';
import { sha256Hex } from '../sha256';
import { reweighCautions } from './cautions';
import { startKnownPart } from './components';
import { runStep, showProgress, type ActionContext } from './context';
import { clearDesign, loadDesignText, openDroppedDesign } from './design';
import { measure } from './fitWindow';
import { drawPlot } from './plotView';
import { refreshLog } from './benchLog';
import { contentOf, FILE_UNITS, type CaptureReading, type StatedUnits } from '../workerProtocol';
import { segmentRead } from '../traceData';

/** First start: the sample the page asks for, else the last capture again, else a bundled sample with its design. */
export function start(ctx: ActionContext, requestedSample: string | null): Promise<void> {
  return opening(ctx, (ticket) => startWith(ctx, requestedSample, ticket));
}

async function startWith(ctx: ActionContext, requestedSample: string | null, ticket: number): Promise<void> {
  const lists = await runStep(ctx, 'reading the sample list', async () => ({ samples: await ctx.bridge.listSamples(), designs: await ctx.bridge.listDesigns() }));
  const state = ctx.store.state;
  if (lists) ctx.store.update((s) => Object.assign(s, lists));
  void refreshLog(ctx);
  // Read even when a sample is asked for: it also brings the recent list.
  const last = await recallCapture();
  if (requestedSample) return openSample(ctx, requestedSample, undefined, ticket);
  if (last?.kind === 'file') return openCapture(ctx, { name: last.name, path: last.path, sampleId: null, ...contentOf(last) }, { channel: last.channel, reading: last.reading, ticket });
  if (last?.kind === 'sample' && state.samples.some((s) => s.id === last.id)) return openSample(ctx, last.id, last.channel, ticket);
  const first = state.samples.find((s) => s.designId !== null) ?? state.samples[0];
  if (first) return openSample(ctx, first.id, undefined, ticket);
}

/**
 * Run one open of a capture, numbered as the user starts it: the newest open wins, whichever finishes reading first (a
 * large file opened just before a small one must not land last and replace it). An open that ends showing nothing (a
 * dismissed dialog, a file that could not be read) no longer holds back older ones still running.
 */
export async function opening(ctx: ActionContext, run: (ticket: number) => Promise<void>): Promise<void> {
  const ticket = ++ctx.opens.started;
  ctx.opens.running.add(ticket);
  try {
    await run(ticket);
  } finally {
    ctx.opens.running.delete(ticket);
  }
}

/** Whether a newer open has shown its capture, or is still running. */
function superseded(ctx: ActionContext, ticket: number): boolean {
  return ticket < ctx.opens.shown || [...ctx.opens.running].some((other) => other > ticket);
}

/** The open is about to show its capture (or its refusal): every older one is superseded for good. */
function shows(ctx: ActionContext, ticket: number): void {
  ctx.opens.shown = Math.max(ctx.opens.shown, ticket);
}

/** Open a bundled sample; `ticket` is the open it belongs to (the start's), else it is an open of its own. */
export async function openSample(ctx: ActionContext, id: string, channel?: number, ticket?: number): Promise<void> {
  if (ticket === undefined) return opening(ctx, (own) => openSample(ctx, id, channel, own));
  const sample = await runStep(ctx, 'opening the sample capture', () => ctx.bridge.readSample(id));
  if (sample) await openCapture(ctx, sample, { sample: sample.sample, design: sample.design, channel, ticket });
}

export function pickCapture(ctx: ActionContext): Promise<void> {
  return opening(ctx, async (ticket) => {
    const opened = await runStep(ctx, 'opening a capture', () => ctx.bridge.pickCapture());
    if (opened) await openCapture(ctx, opened, { ticket });
  });
}

/** A design file's extension: a dropped .json is a design, anything else a capture. */
const DESIGN_FILE = /\.json$/i;

export async function openDropped(ctx: ActionContext, file: File): Promise<void> {
  if (DESIGN_FILE.test(file.name)) return openDroppedDesign(ctx, file);
  return opening(ctx, async (ticket) => {
    const opened = await runStep(ctx, `opening ${file.name}`, () => ctx.bridge.openDropped(file));
    if (opened) await openCapture(ctx, opened, { ticket });
  });
}

export async function openCapture(
  ctx: ActionContext,
  opened: OpenedFile,
  options: { sample?: SampleEntry; design?: NamedText | null; channel?: number; reading?: CaptureReading; ticket?: number },
): Promise<void> {
  const ticket = options.ticket;
  if (ticket === undefined) return opening(ctx, (own) => openCapture(ctx, opened, { ...options, ticket: own }));
  if (superseded(ctx, ticket)) return;
  const read = await readCapture(ctx, ticket, opened, options.sample ?? null, options.reading ?? { units: FILE_UNITS }, options.channel);
  if (read === 'failed' || read === 'superseded') return;
  ctx.store.update((s) => startKnownPart(s, options.sample ?? null));
  ctx.page.showCaptureName(opened.name);
  if (options.design) await loadDesignText(ctx, options.design, `sample-captures/designs/${options.design.name}`, 'sample');
  else if (options.sample || ctx.store.state.design?.origin === 'sample') clearDesign(ctx);
  if (read === 'read' && !superseded(ctx, ticket)) await showAndMeasure(ctx);
}

/** Read the capture shown (or refused) again with the units the user states, in the same segment. */
export function stateUnits(ctx: ActionContext, units: StatedUnits): Promise<void> {
  return readRestated(ctx, { units });
}

/** Read the capture shown (or refused) again with the sample interval the user states ('' for the file's own axis). */
export function stateInterval(ctx: ActionContext, sampleInterval: string): Promise<void> {
  const text = sampleInterval.trim();
  return readRestated(ctx, { sampleInterval: text === '' ? undefined : text });
}

/** Read the capture shown (or refused) again with `change` to how it is read, in the same segment. */
function readRestated(ctx: ActionContext, change: Partial<CaptureReading>): Promise<void> {
  const capture = ctx.store.state.capture;
  return readAgain(ctx, { ...ctx.store.state.reading, ...change, segment: capture ? segmentRead(capture.info) : undefined });
}

/** Read another segment of a file of repeated acquisitions, in the units and interval stated. */
export function chooseSegment(ctx: ActionContext, segment: number): Promise<void> {
  return readAgain(ctx, { ...ctx.store.state.reading, segment });
}

/** Read the capture shown (or refused) again another way; its design and known part stay. */
async function readAgain(ctx: ActionContext, reading: CaptureReading): Promise<void> {
  const { capture, refused } = ctx.store.state;
  const opened = capture?.opened ?? refused?.opened;
  if (!opened) return;
  await opening(ctx, async (ticket) => {
    const read = await readCapture(ctx, ticket, opened, capture?.sample ?? refused?.sample ?? null, reading, capture?.channel);
    if (read === 'read') await showAndMeasure(ctx);
  });
}

/**
 * Read a capture in the worker into the state: 'read', 'refused' for a unit the user can state (the capture panel
 * then says why and offers the units), 'failed' with the reason in the window's message, or 'superseded' (nothing
 * stored or shown) when an open started after `ticket` meanwhile.
 */
async function readCapture(
  ctx: ActionContext,
  ticket: number,
  opened: OpenedFile,
  sample: SampleEntry | null,
  reading: CaptureReading,
  channel?: number,
): Promise<'read' | 'refused' | 'failed' | 'superseded'> {
  const key = `capture-${++ctx.counters.captures}`;
  // A long fit of the previous capture must not hold this one up.
  if (ctx.client.busy) ctx.client.cancelAll();
  const read = await runStep(ctx, `reading ${opened.name}`, async () => {
    const reply = await ctx.client.request({ type: 'open', captureId: key, name: opened.name, content: contentOf(opened), reading }, (stage) => showProgress(ctx, stage)).catch((error: unknown) => {
      throw error instanceof FitCancelled ? error : new BenchError(`${opened.name}: ${plainMessage(error)}`);
    });
    if (superseded(ctx, ticket)) return 'superseded' as const;
    if (reply.refusal) {
      const refusal = reply.refusal;
      shows(ctx, ticket);
      ctx.store.update((s) => {
        s.capture = null;
        s.refused = { opened, refusal, sample };
        s.reading = reading;
        forgetMeasurement(s);
      });
      ctx.plot.clear();
      return 'refused' as const;
    }
    const { info } = reply;
    const byName = sample?.options.column ? info.channels.findIndex((c) => c.name === sample.options.column) : -1;
    const chosen = Math.min(channel ?? (byName >= 0 ? byName : 0), info.channels.length - 1);
    const digest = await sha256Hex(opened);
    if (superseded(ctx, ticket)) return 'superseded' as const;
    // Remembered and listed before it shows as opened: a reload from the moment the user sees it reopens this capture.
    await rememberCapture(remembered(opened, digest.sha256, chosen, reading), recentEntry(opened, digest.sha256));
    // A newer open that started during the write is remembered after it, and shown instead.
    if (superseded(ctx, ticket)) return 'superseded' as const;
    shows(ctx, ticket);
    ctx.store.update((s) => {
      s.capture = { key, opened, info, channel: chosen, sample, ...digest };
      s.refused = null;
      s.reading = reading;
      forgetMeasurement(s);
    });
    return 'read' as const;
  });
  return read ?? 'failed';
}

/** Draw the channel read and fit it. */
async function showAndMeasure(ctx: ActionContext): Promise<void> {
  await loadTrace(ctx);
  await measure(ctx);
}

/** A capture, its channel and how it was read, as the next start reopens it (a sample by id, a file by its content). */
function remembered(opened: OpenedFile, sha256: string, channel: number, reading: CaptureReading): RememberedCapture {
  return opened.sampleId
    ? { kind: 'sample', id: opened.sampleId, channel }
    : { kind: 'file', name: opened.name, path: opened.path, ...contentOf(opened), channel, reading, sha256 };
}

/** The capture's entry in the recent list, opened now. */
function recentEntry(opened: OpenedFile, sha256: string): RecentCapture {
  return { id: sha256, name: opened.name, sampleId: opened.sampleId, path: opened.path, openedAt: new Date().toISOString() };
}

export async function chooseChannel(ctx: ActionContext, index: number): Promise<void> {
  const capture = ctx.store.state.capture;
  if (!capture) return;
  // Remembered before it shows: a reload from then on, during the fit too, comes back to this channel.
  await rememberCapture(remembered(capture.opened, capture.sha256, index, ctx.store.state.reading), null);
  // Another capture opened meanwhile is the one shown (and remembered after this one).
  if (capture !== ctx.store.state.capture) return;
  ctx.store.update((s) => {
    capture.channel = index;
    forgetMeasurement(s);
  });
  await loadTrace(ctx);
  await measure(ctx);
}

/** Another capture or channel: nothing measured on the previous one stays. */
function forgetMeasurement(state: ActionContext['store']['state']): void {
  state.userWindow = {};
  state.chosenEvent = null;
  state.eventTime = null;
  state.fit = null;
  state.summary = null;
  state.trace = null;
  state.verdict = null;
  state.components = null;
  state.cautions = null;
  state.copied = null;
}

/** The channel's samples, drawn at once so the capture shows while its fit runs. */
async function loadTrace(ctx: ActionContext): Promise<void> {
  const capture = ctx.store.state.capture;
  if (!capture) return;
  const reply = await runStep(ctx, 'reading the channel', () => ctx.client.request({ type: 'trace', captureId: capture.key, channel: capture.channel }));
  if (capture !== ctx.store.state.capture) return;
  ctx.store.update((s) => {
    s.trace = reply?.trace ?? null;
    reweighCautions(s);
  });
  await drawPlot(ctx);
}
