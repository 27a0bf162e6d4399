// Keyboard shortcuts of the browser bench (the desktop window has them on its native menu).

import type { MenuCommand } from './bridgeTypes';

const KEYS: { key: string; shift: boolean; command: MenuCommand }[] = [
  { key: 'o', shift: false, command: 'open-capture' },
  { key: 'o', shift: true, command: 'open-design' },
  { key: 's', shift: false, command: 'save-report' },
  { key: 'e', shift: false, command: 'export-png' },
  { key: 'e', shift: true, command: 'export-svg' },
  { key: 'l', shift: true, command: 'toggle-theme' },
];

export function installShortcuts(commands: Record<MenuCommand, () => void>): void {
  document.addEventListener('keydown', (event) => {
    if (!(event.ctrlKey || event.metaKey) || event.altKey) return;
    const match = KEYS.find((k) => k.key === event.key.toLowerCase() && k.shift === event.shiftKey);
    if (!match) return;
    event.preventDefault();
    commands[match.command]();
  });
}
