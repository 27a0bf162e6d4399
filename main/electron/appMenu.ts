// The window's native menu: open, recent captures, save report, export plot, theme, quit, with shortcuts.

import { Menu, type MenuItemConstructorOptions } from 'electron';
import { basename } from 'node:path';
import type { MenuCommand } from '../../core/bench/benchApiTypes';

export interface MenuActions {
  recent: string[];
  command(command: MenuCommand): void;
  /** Opens a recent capture; reads the file asynchronously. */
  openRecent(path: string): Promise<void>;
  clearRecent(): void;
}

export function buildAppMenu(actions: MenuActions, isMac: boolean): Menu {
  const item = (label: string, command: MenuCommand, accelerator?: string): MenuItemConstructorOptions => ({
    label,
    accelerator,
    click: () => actions.command(command),
  });
  const recent: MenuItemConstructorOptions[] = actions.recent.length
    ? [
        ...actions.recent.map((path) => ({ label: basename(path), sublabel: path, click: () => void actions.openRecent(path) })),
        { type: 'separator' as const },
        { label: 'Clear list', click: () => actions.clearRecent() },
      ]
    : [{ label: 'No recent captures', enabled: false }];
  const template: MenuItemConstructorOptions[] = [
    ...(isMac ? [{ role: 'appMenu' as const }] : []),
    {
      label: 'File',
      submenu: [
        item('Open capture…', 'open-capture', 'CmdOrCtrl+O'),
        { label: 'Open recent', submenu: recent },
        item('Open design…', 'open-design', 'CmdOrCtrl+Shift+O'),
        { type: 'separator' },
        item('Save report…', 'save-report', 'CmdOrCtrl+S'),
        item('Export plot as PNG…', 'export-png', 'CmdOrCtrl+E'),
        item('Export plot as SVG…', 'export-svg', 'CmdOrCtrl+Shift+E'),
        { type: 'separator' },
        isMac ? { role: 'close' } : { role: 'quit', accelerator: 'Ctrl+Q' },
      ],
    },
    { role: 'editMenu' },
    {
      label: 'View',
      submenu: [
        item('Switch light / dark theme', 'toggle-theme', 'CmdOrCtrl+Shift+L'),
        { type: 'separator' },
        { role: 'resetZoom' },
        { role: 'zoomIn' },
        { role: 'zoomOut' },
        { type: 'separator' },
        { role: 'togglefullscreen' },
      ],
    },
    { role: 'windowMenu' },
  ];
  return Menu.buildFromTemplate(template);
}
