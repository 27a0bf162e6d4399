// The shape of an imported capture: what every reader of scope exports produces.

import { InputError } from '../inputError';
import type { StatedUnit } from '../units/unitText';
import type { ImportSummary } from './importSummary';

export interface Channel {
  /** Column name as the file gives it without its unit ('CH1', 'V_C'), or 'channel N' when unnamed. */
  name: string;
  /** SI base unit after prefix scaling ('V', 'A', '' when unknown). */
  unit: string;
  /** Time axis of this channel, s, strictly increasing (shared between channels when the file has one). */
  time: Float64Array;
  /** Samples in SI base units, same length as time. */
  values: Float64Array;
  /** 1 where the sample sits in a run at an ADC rail (excluded from fits), else 0. */
  clipped: Uint8Array;
  /** Rows dropped for this channel: NaN, empty or overrange cells. */
  dropped: number;
  /** Set when the header's unit for this channel cannot be read: the channel has no unit, and is not fitted. */
  unreadUnit?: UnreadUnit;
}

/** Why a channel's unit could not be read, and the line of its header. */
export interface UnreadUnit {
  message: string;
  line: number | null;
}

export interface Capture {
  channels: Channel[];
  /** Uniform sample interval in s when the axis is uniform (or was rebuilt from one), else null. */
  sampleInterval: number | null;
  /** Key/value pairs found in the preamble, keys as written. */
  metadata: Record<string, string>;
  /** Plain-language notes about what the importer did (axis rebuilt, rows sorted, clipping found). */
  warnings: string[];
  /** How the text was read, for reports and error messages. */
  layout: {
    /** ',', ';', '\t', ' ' (runs of spaces and tabs), or '' for a single column. */
    delimiter: string;
    decimalComma: boolean;
    /** 1-based line of the header, or null when the file has none. */
    headerLine: number | null;
    /** 1-based line of the first data row. */
    firstDataLine: number;
    /** Data rows read (before per-channel dropping). */
    rows: number;
  };
  /** What the importer inferred (encoding, delimiter, line end, time source, drops...), for every face to show. */
  importSummary: ImportSummary;
}

export interface CaptureOptions {
  /**
   * Sample interval in s, used to build the time axis when the file has no numeric time column (values only,
   * or wall-clock time stamps). Replaces an interval the file states (with a warning when they differ).
   */
  sampleInterval?: number;
  /** Sort non-monotonic time stamps (with a warning) instead of failing. Default false. */
  sortTime?: boolean;
  /** Unit of the time column and of a preamble's stated interval and start, over the file's (a note when it differs). */
  timeUnit?: StatedUnit;
  /** Unit of the channels' values, over the file's (a note when it differs). */
  valueUnit?: StatedUnit;
  /**
   * Which segment of a file of repeated acquisitions to read, 1-based. Default: the first. A number naming no
   * segment is a CaptureError giving the count.
   */
  segment?: number;
}

/** Invalid capture text: the message says what was wrong; `line` is 1-based when known. */
export class CaptureError extends InputError {
  readonly line: number | null;
  constructor(message: string, line: number | null = null) {
    super(line === null ? message : `line ${line}: ${message}`, line === null ? null : `line ${line}`);
    this.name = 'CaptureError';
    this.line = line;
  }
}
