// Captures chosen for a use case over several captures (extraction rows, before / after): read, not opened in the plot.

import type { OpenedCapture, OpenedFile } from '../bridgeTypes';
import { runStep, type ActionContext } from './context';

export function pickCaptureFile(ctx: ActionContext): Promise<OpenedFile | null> {
  return runStep(ctx, 'opening a capture', () => ctx.bridge.pickCapture());
}

export function readSampleText(ctx: ActionContext, id: string): Promise<OpenedCapture | null> {
  return runStep(ctx, 'reading the sample capture', () => ctx.bridge.readSample(id));
}
