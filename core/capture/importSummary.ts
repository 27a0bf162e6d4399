// What the importer inferred about a capture text, as one plain JSON object every face shows.

/** How the bytes became text: filled by the reader's decoder. */
export interface TextEncoding {
  /** 'UTF-8', 'UTF-16LE', 'UTF-16BE' or 'Windows-1252'. */
  name: string;
  /** True when the text started with a byte-order mark (dropped). */
  byteOrderMark: boolean;
  /** Why the encoding was chosen when the bytes had to tell ('not valid UTF-8 at line 3'); absent for plain UTF-8. */
  note?: string;
}

export type DelimiterName = 'comma' | 'semicolon' | 'tab' | 'whitespace' | 'none';
export type LineEnd = 'CRLF' | 'LF' | 'CR';

/** Where the time of the samples came from. */
export type TimeSource =
  | {
      kind: 'column';
      /** The header cell as written, or 'column N' without a header. */
      column: string;
      /** 1-based column. */
      index: number;
      /** The time unit the column is read in ('s', 'ns', 'µs'), or '' when it gave none (seconds assumed). */
      unit: string;
    }
  | {
      kind: 'interval';
      /** The sample interval the axis t = t0 + i * dt was built from, s. */
      interval: number;
      /** The file's preamble, or the sample interval given with the import (--sample-interval). */
      from: 'preamble' | 'option';
      /** The preamble key and its 1-based line; null for the option. */
      key: string | null;
      line: number | null;
    };

export interface ChannelImport {
  name: string;
  /** SI unit ('V', 'A', '' when unknown). */
  unit: string;
  samples: number;
  /** Samples dropped: empty, NaN, infinite or overrange cells, or no time on the row. */
  dropped: number;
  /** Samples at an ADC rail, left out of fits. */
  clipped: number;
}

/** Data rows left out of every channel, and why. */
export interface RowDrop {
  reason: string;
  count: number;
  /** 1-based line of the first such row, when known. */
  firstLine: number | null;
}

/** Lines of the text passed over as not part of the table. */
export interface IgnoredSection {
  firstLine: number;
  lastLine: number;
  reason: string;
}

/** One stretch of the record read as its own piece (a file of several acquisitions). */
export interface ImportSegment {
  firstLine: number;
  lastLine: number;
  rows: number;
  /** True for the one segment the capture holds (the first, or the one asked for). */
  read: boolean;
}

export interface ImportSummary {
  encoding: TextEncoding;
  delimiter: DelimiterName;
  decimalMark: '.' | ',';
  /** Null for a text of one line. */
  lineEnd: LineEnd | null;
  /** 1-based line of the header, or null when the file has none. */
  headerLine: number | null;
  firstDataLine: number;
  /** Data rows read (before per-channel dropping). */
  rows: number;
  /** The time of the first channel; every channel's when they share one axis. */
  time: TimeSource;
  /** The uniform sample interval, or the mean step of an uneven axis, s (of the first channel's axis). */
  sampleInterval: number;
  /** The spread (standard deviation) of the steps when the axis is not uniform, s; null when it is. */
  jitter: number | null;
  channels: ChannelImport[];
  droppedRows: RowDrop[];
  ignoredSections: IgnoredSection[];
  segments: ImportSegment[];
  warnings: string[];
}
