// The caption an exported plot carries: the file, the channel and the fit in one line each.

import { formatWithUncertainty } from '../units/format';
import { fitSucceeded, type FitSummary } from './fitSummary';
import { fitStateText, hertz } from './resultRows';

export interface PlotCaption {
  /** 'switch-node-before.csv · CH1 (V)'. */
  source: string;
  /** 'converged, underdamped · f0 = 8.902 kHz ± 5 Hz · zeta = 0.1972 ± 0.0011 · Q = 2.536 ± 0.014', or why there is no fit. */
  fit: string;
}

/** The caption for a plot of `channel` of `file`, with its fit when there is one. */
export function plotCaption(file: string, channel: string, fit: FitSummary | null): PlotCaption {
  const source = `${file} · ${channel}`;
  if (!fit) return { source, fit: 'not fitted' };
  if (!fitSucceeded(fit)) return { source, fit: `fit ${fitStateText(fit)}: not a measurement` };
  const parts = fit.tau
    ? [`tau = ${formatWithUncertainty(fit.tau)}`]
    : [`f0 = ${formatWithUncertainty(hertz(fit.omega0))}`, `zeta = ${formatWithUncertainty(fit.zeta)}`, `Q = ${formatWithUncertainty(fit.Q)}`];
  return { source, fit: [fitStateText(fit), ...parts].join(' · ') };
}
