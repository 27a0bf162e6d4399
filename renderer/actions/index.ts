// Every action of the window bound to one context: what the panels and the page entry call.

import type { SetupOptions } from '../../core/circuit/setupTypes';
import type { ComponentsInput } from '../benchState';
import type { OpenedFile, ReportFormat } from '../bridgeTypes';
import type { CorrectionForm, LogForm } from '../logRequest';
import type { BenchRecord } from '../../core/report/benchRecord';
import type { CorrectionAction } from '../../core/report/logCorrection';
import type { CaptureFile, FitWindow, StatedUnits } from '../workerProtocol';
import { correctLogEntry, logMeasurement, refreshLog } from './benchLog';
import { chooseChannel, chooseSegment, openCapture, openDropped, openSample, pickCapture, start, stateInterval, stateUnits } from './capture';
import { runComparison, type CompareSettings } from './compare';
import { setComponentsInput } from './components';
import type { ActionContext } from './context';
import { clearDesign, loadDesignFromSamples, pickDesign, saveDesign, useEditedDesign } from './design';
import { copyPlot, copyResults, exportPlot, exportReport } from './export';
import { runExtraction, type ExtractionRow, type ExtractionSettings } from './extraction';
import { chooseEvent, chooseMode, setModes, setSetup, setWindow } from './fitWindow';
import { pickCaptureFile, readSampleText } from './pickCaptures';
import { stopWork } from './stopWork';
import { setProbe } from './probe';
import { openRecent, restoreSession } from './session';
import type { SessionMemory } from '../benchMemory';

export type BenchActions = ReturnType<typeof bindActions>;

export function bindActions(ctx: ActionContext) {
  return {
    start: (requestedSample: string | null) => start(ctx, requestedSample),
    openSample: (id: string) => openSample(ctx, id),
    pickCapture: () => pickCapture(ctx),
    openDropped: (file: File) => openDropped(ctx, file),
    openCapture: (opened: OpenedFile) => openCapture(ctx, opened, {}),
    chooseChannel: (index: number) => chooseChannel(ctx, index),
    stateUnits: (units: StatedUnits) => stateUnits(ctx, units),
    stateInterval: (sampleInterval: string) => stateInterval(ctx, sampleInterval),
    chooseSegment: (segment: number) => chooseSegment(ctx, segment),
    setWindow: (window: FitWindow) => setWindow(ctx, window),
    chooseEvent: (event: number) => chooseEvent(ctx, event),
    setModes: (modes: number | null) => setModes(ctx, modes),
    setSetup: (setup: SetupOptions) => setSetup(ctx, setup),
    chooseMode: (mode: number) => chooseMode(ctx, mode),
    setComponentsInput: (change: Partial<ComponentsInput>) => setComponentsInput(ctx, change),
    loadDesignFromSamples: (id: string) => loadDesignFromSamples(ctx, id),
    pickDesign: () => pickDesign(ctx),
    useEditedDesign: (fields: Record<string, unknown>) => useEditedDesign(ctx, fields),
    saveDesign: () => saveDesign(ctx),
    clearDesign: () => clearDesign(ctx),
    refreshLog: () => refreshLog(ctx),
    logMeasurement: (form: LogForm) => logMeasurement(ctx, form),
    correctLogEntry: (record: BenchRecord, form: CorrectionForm, action: CorrectionAction) => correctLogEntry(ctx, record, form, action),
    exportReport: (format: ReportFormat) => exportReport(ctx, format),
    exportPlot: (format: 'png' | 'svg') => exportPlot(ctx, format),
    copyResults: (form: 'text' | 'csv') => copyResults(ctx, form),
    copyPlot: () => copyPlot(ctx),
    pickCaptureFile: () => pickCaptureFile(ctx),
    readSampleText: (id: string) => readSampleText(ctx, id),
    runExtraction: (rows: readonly ExtractionRow[], settings: ExtractionSettings) => runExtraction(ctx, rows, settings),
    runComparison: (before: CaptureFile | null, after: CaptureFile | null, settings: CompareSettings) => runComparison(ctx, before, after, settings),
    dismissError: () => ctx.store.update((s) => (s.error = null)),
    stopWork: () => stopWork(ctx),
    setProbe: (ratioText: string, invert: boolean) => setProbe(ctx, ratioText, invert),
    openRecent: (id: string) => openRecent(ctx, id),
    restoreSession: (saved: SessionMemory | null) => restoreSession(ctx, saved),
  };
}
