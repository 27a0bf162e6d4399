// How a capture is read by its measuring settings (the command's options, or a bench record's): kept apart
// from the fitting code so that the report writer, and the shells that load it, start light.

import type { CaptureOptions } from '../../core/capture/types';
import type { MeasurementSettings } from '../../core/report/benchRecord';
import { parseMeasureSettings, type MeasureSettings } from '../../core/workflow/measureSettings';

/** How the settings say a capture is read: the importer's options and the channel to take. */
export function readingOptionsOf(settings: MeasureSettings): CaptureOptions & { channel?: string | number } {
  const { channel, sampleInterval, sortTime, timeUnit, valueUnit, segment } = parseMeasureSettings(settings);
  return { channel, sampleInterval, sortTime, timeUnit, valueUnit, segment };
}

/** A bench record's settings (null where left to the default) as measuring settings. */
export function settingsOfRecord(s: MeasurementSettings): MeasureSettings {
  const given = (text: string | null) => text ?? undefined;
  return {
    topology: given(s.topology),
    known: given(s.known),
    column: given(s.column),
    sampleInterval: given(s.sampleInterval),
    from: given(s.from),
    to: given(s.to),
    sortTime: s.sortTime,
    timeUnit: s.timeUnit,
    valueUnit: s.valueUnit,
    segment: s.segment,
    probeRatio: s.probeRatio,
    invert: s.invert,
  };
}
