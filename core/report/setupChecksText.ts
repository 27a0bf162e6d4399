// The setup checks as the plain text the command line prints after a fit: a "setup" block, refusals first.

import type { SetupCheck } from '../circuit/setupTypes';

const MARK = { refusal: 'REFUSED', warning: 'warning', note: 'note' } as const;

/** 'setup: nothing to report' or one line per check; the block the fit, check and batch faces print. */
export function formatSetupChecksText(checks: readonly SetupCheck[]): string {
  if (!checks.length) return 'setup: nothing to report\n';
  return `setup (${checks.length})\n${checks.map((c) => `  ${MARK[c.level]}: ${c.message}\n`).join('')}`;
}
