// Picks the bridge for this page: the preload's API in the desktop window, loopback HTTP in a browser.

import { createDesktopBridge } from './desktopBridge';
import { createHttpBridge } from './httpBridge';
import { takeToken } from './benchToken';
import type { Bridge, PreloadApi } from './bridgeTypes';
import { BenchError } from './benchError';

export function createBridge(captureInput: HTMLInputElement, designInput: HTMLInputElement): Bridge {
  const preload = (window as unknown as { ringbench?: PreloadApi }).ringbench;
  if (preload) return createDesktopBridge(preload);
  const token = takeToken(location, sessionStorage, history);
  if (!token) throw new BenchError('this page needs the address `ringbench serve` printed, with its ?token=…');
  return createHttpBridge(token, captureInput, designInput);
}
