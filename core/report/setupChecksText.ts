// The setup checks as text: the command line's "setup" block, and a logged measurement's in the Markdown and HTML reports.

import type { SetupCheck } from '../circuit/setupTypes';
import { escapeHtml, escapeMarkdown } from './escape';

const MARK = { refusal: 'REFUSED', warning: 'warning', note: 'note' } as const;

/** 'setup: nothing to report' or one line per check; the block the fit, check and batch faces print. */
export function formatSetupChecksText(checks: readonly SetupCheck[]): string {
  if (!checks.length) return 'setup: nothing to report\n';
  return `setup (${checks.length})\n${checks.map((c) => `  ${MARK[c.level]}: ${c.message}\n`).join('')}`;
}

/** The report's Markdown lines for a logged measurement's setup checks (none for a record without any, or logged before they were kept). */
export function setupChecksMarkdown(checks: readonly SetupCheck[] | undefined): string[] {
  return (checks ?? []).flatMap((c) => ['', `Setup ${c.level === 'refusal' ? '**refused**' : c.level}: ${escapeMarkdown(c.message)}`]);
}

/** The report's HTML block for a logged measurement's setup checks; '' without any. */
export function setupChecksHtml(checks: readonly SetupCheck[] | undefined): string {
  if (!checks?.length) return '';
  const items = checks.map((c) => `<li class="${c.level === 'note' ? 'note' : 'warning'}"><strong>${MARK[c.level]}</strong> ${escapeHtml(c.message)}</li>`).join('');
  return `<div class="block setup-checks"><h4>Setup checks</h4><ul>${items}</ul></div>`;
}
