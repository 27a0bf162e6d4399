// The window's keys and gestures, one table: what each does, where it acts, and the list the `?` key shows.

import type { MenuCommand } from './bridgeTypes';

/** What the plot does on a key (the page entry binds each to the plot). */
export type PlotCommand =
  | 'pan-earlier'
  | 'pan-later'
  | 'zoom-in-time'
  | 'zoom-out-time'
  | 'zoom-in-level'
  | 'zoom-out-level'
  | 'whole-capture'
  | 'toggle-cursors'
  | 'toggle-markers';
export type ShortcutCommand = MenuCommand | PlotCommand | 'show-shortcuts';

export interface Shortcut {
  /** The keys or the gesture as the list shows them. */
  shown: string;
  does: string;
  /**
   * 'menu': with Ctrl (⌘ on a Mac); on the desktop window's menu, handled here in the browser bench. 'bench': a plain key,
   * acting anywhere but in a text field. 'pointer': a gesture on the plot, listed only.
   */
  zone: 'menu' | 'bench' | 'pointer';
  /** KeyboardEvent.key values (letters in lower case); none for a gesture. */
  keys: string[];
  /** Shift held (true), not held (false), or either (null: '?' and '+' need it on some layouts). */
  shift: boolean | null;
  command: ShortcutCommand | null;
}

const menu = (shown: string, key: string, shift: boolean, command: MenuCommand, does: string): Shortcut => ({ shown, does, zone: 'menu', keys: [key], shift, command });
const bench = (shown: string, keys: string[], shift: boolean | null, command: ShortcutCommand, does: string): Shortcut => ({ shown, does, zone: 'bench', keys, shift, command });
const gesture = (shown: string, does: string): Shortcut => ({ shown, does, zone: 'pointer', keys: [], shift: null, command: null });

export const SHORTCUTS: readonly Shortcut[] = [
  gesture('Drag on the plot', 'zoom to the box dragged (a flat box zooms time only)'),
  gesture('Drag a fit-window edge', 'move that edge and refit (only the edge handles move the window)'),
  gesture('Wheel', 'zoom time about the pointer'),
  gesture('Shift + wheel, or wheel over the level axis', 'zoom the level about the pointer'),
  gesture('Double-click the plot', 'show the whole capture'),
  gesture('Drag a cursor', 'move it; the readouts follow'),
  bench('←', ['arrowleft'], false, 'pan-earlier', 'move the view earlier in time by a tenth'),
  bench('→', ['arrowright'], false, 'pan-later', 'move the view later in time by a tenth'),
  bench('+', ['+', '='], null, 'zoom-in-time', 'zoom in on time about the middle'),
  bench('−', ['-', '_'], null, 'zoom-out-time', 'zoom out in time'),
  bench('Shift + ↑', ['arrowup'], true, 'zoom-in-level', 'zoom in on the level (vertical)'),
  bench('Shift + ↓', ['arrowdown'], true, 'zoom-out-level', 'zoom out on the level (vertical)'),
  bench('0 or Home', ['0', 'home'], false, 'whole-capture', 'show the whole capture'),
  bench('C', ['c'], false, 'toggle-cursors', 'show or hide the measurement cursors'),
  bench('M', ['m'], false, 'toggle-markers', 'show or hide the overshoot and settling markers'),
  bench('?', ['?'], null, 'show-shortcuts', 'this list'),
  menu('Ctrl + O', 'o', false, 'open-capture', 'open a capture'),
  menu('Ctrl + Shift + O', 'o', true, 'open-design', 'open a design'),
  menu('Ctrl + S', 's', false, 'save-report', 'save the report'),
  menu('Ctrl + E', 'e', false, 'export-png', 'export the plot as PNG'),
  menu('Ctrl + Shift + E', 'e', true, 'export-svg', 'export the plot as SVG'),
  menu('Ctrl + Shift + L', 'l', true, 'toggle-theme', 'switch the light and dark theme'),
];

/**
 * Listen for the table's keys: the plain ones everywhere, the Ctrl ones only where `menuKeys` (the browser bench; the
 * desktop window's menu has them).
 */
export function installShortcuts(commands: Record<ShortcutCommand, () => void>, menuKeys: boolean): void {
  document.addEventListener('keydown', (event) => {
    const ctrl = event.ctrlKey || event.metaKey;
    if (event.altKey || event.defaultPrevented) return;
    if (!ctrl && typingInto(event.target)) return;
    const key = event.key.toLowerCase();
    const match = SHORTCUTS.find(
      (s) => (s.zone === 'menu' ? ctrl && menuKeys : s.zone === 'bench' && !ctrl) && s.keys.includes(key) && (s.shift === null || s.shift === event.shiftKey),
    );
    if (!match?.command) return;
    event.preventDefault();
    commands[match.command]();
  });
}

/** A key pressed in a field that takes text (or a list that takes arrows) is the field's. */
function typingInto(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target.isContentEditable || target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement) return true;
  return target instanceof HTMLInputElement && !['button', 'checkbox', 'radio', 'submit', 'reset', 'file'].includes(target.type);
}
