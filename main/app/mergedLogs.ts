// Several bench logs read as one: records in time order, a record id found twice reported with both
// files and counted once, each log's own notes (a cut-off last line) kept.

import { resolve } from 'node:path';
import type { BenchRecord } from '../../core/report/benchRecord';
import { UsageError } from '../../core/inputError';

/** A log to read: `path` resolved, `shown` as the user gave it (for messages). */
export interface LogSource {
  path: string;
  shown: string;
}

/** One log as the caller reads it alone: its records in log order and its notes for the terminal. */
export interface ReadLog {
  records: BenchRecord[];
  notes: string[];
}

export interface DuplicateRecord {
  id: string;
  /** The log whose copy is kept (the first given) and the log whose copy is dropped, as given. */
  kept: string;
  dropped: string;
  /** The two copies are the same record (a log copied, a shard run twice). */
  identical: boolean;
}

export interface MergedLogs {
  /** Every record once; in the log's order for one log, by logged time (stably) for several. */
  records: BenchRecord[];
  duplicates: DuplicateRecord[];
  /** Each log's own notes, then one line per duplicate, for the terminal and the report. */
  notes: string[];
}

/**
 * Read each log with `read` and merge them. A log given twice is bad input (UsageError naming it); a
 * missing or bad log fails as it does alone.
 */
export function readMergedLogs(sources: readonly LogSource[], read: (source: LogSource) => ReadLog): MergedLogs {
  if (!sources.length) throw new UsageError('no bench log given: name one with --log FILE (repeat it, or list the logs, for several)');
  const given = new Map<string, string>();
  for (const source of sources) {
    const earlier = given.get(resolve(source.path));
    if (earlier !== undefined) throw new UsageError(`bench log '${source.shown}' is given twice (also as '${earlier}')`, source.shown);
    given.set(resolve(source.path), source.shown);
  }
  const merged: MergedLogs = { records: [], duplicates: [], notes: [] };
  const firstSeen = new Map<string, { log: string; record: BenchRecord }>();
  const duplicateNotes: string[] = [];
  for (const source of sources) {
    const log = read(source);
    merged.notes.push(...log.notes);
    for (const record of log.records) {
      const kept = firstSeen.get(record.id);
      if (!kept) {
        firstSeen.set(record.id, { log: source.shown, record });
        merged.records.push(record);
        continue;
      }
      const identical = JSON.stringify(kept.record) === JSON.stringify(record);
      merged.duplicates.push({ id: record.id, kept: kept.log, dropped: source.shown, identical });
      const where = kept.log === source.shown ? `twice in ${kept.log}` : `in both ${kept.log} and ${source.shown}`;
      duplicateNotes.push(`record ${record.id} (unit ${record.unit}) is ${where}${identical ? '' : ', with different contents'}: counted once, as first read from ${kept.log}`);
    }
  }
  merged.notes.push(...duplicateNotes);
  if (sources.length > 1) merged.records.sort((a, b) => Date.parse(a.time) - Date.parse(b.time));
  return merged;
}
