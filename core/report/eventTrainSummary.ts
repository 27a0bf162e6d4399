// Several events in one record: what a fit summary's `events` field carries about each, and their combination.

import type { Quantity } from '../quantity';

/** One event of the record; times in s. */
export interface EventEntry {
  /** 1-based, in time order: what --event takes. */
  index: number;
  /** Where the event clears the noise (the record's start for one already under way when the record begins). */
  onset: number;
  /** The fit window of its natural response (the plot marks [onset, end]). */
  start: number;
  end: number;
  /** Whether its onset lies inside the record. */
  hasOnset: boolean;
  /** Seen from its onset until its ring died into the noise or three time constants passed; only complete events are combined. */
  complete: boolean;
  /** The fit's status, or 'not fitted' (too few samples in its window, or beyond the first 16 events); `message` says why. */
  status: string;
  message: string;
  alpha: Quantity | null;
  omega0: Quantity | null;
  zeta: Quantity | null;
  Q: Quantity | null;
}

/** How far the events' estimates of one quantity spread against their stated errors. */
export interface SpreadTest {
  chiSquare: number;
  dof: number;
  /** P(chi^2 >= chiSquare) if the stated errors are right. */
  pValue: number;
  /** Factor the combined standard error was scaled by (sqrt(chi^2 / dof), at least 1). */
  scale: number;
}

/** The inverse-variance weighted mean over the complete, converged events. */
export interface CombinedEstimate {
  /** 'converged', or 'inconsistent' when the spread fails the consistency test (then the estimate is no answer). */
  status: 'converged' | 'inconsistent';
  message: string;
  /** The events combined, by index. */
  events: number[];
  alpha: Quantity;
  omega0: Quantity;
  zeta: Quantity;
  Q: Quantity;
  consistency: { alpha: SpreadTest; omega0: SpreadTest; pLimit: number };
}

export interface EventTrainSummary {
  /** The event the summary's fit is of (1-based). */
  chosen: number;
  /** Whether --event chose it (else it is the first complete event that converged). */
  chosenBy: 'default' | 'request';
  list: EventEntry[];
  /** Null when fewer than two complete events converged; `combinedNote` says so. */
  combined: CombinedEstimate | null;
  combinedNote: string;
}
