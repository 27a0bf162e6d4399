// Registers every channel of the one list on ipcMain: sender checked, arguments guarded, result wrapped.

import type { IpcMain, IpcMainInvokeEvent } from 'electron';
import type { ApiResult } from '../../core/bench/benchApiTypes';
import type { ApiMethod } from '../api/apiMethods';
import { CHANNELS } from './channels';

type Dispatch = (method: string, args: unknown[]) => Promise<ApiResult<unknown>>;

/** True when the call comes from our own page (the bench:// origin), not from any other frame. */
export type SenderCheck = (event: IpcMainInvokeEvent) => boolean;

export function registerIpcHandlers(ipc: Pick<IpcMain, 'handle'>, dispatch: Dispatch, isTrustedSender: SenderCheck): void {
  for (const method of Object.keys(CHANNELS) as ApiMethod[]) {
    ipc.handle(CHANNELS[method], async (event, ...args: unknown[]): Promise<ApiResult<unknown>> => {
      if (!isTrustedSender(event)) return { ok: false, error: 'this call is answered only for the bench page', code: 'bad-argument' };
      // The dispatcher checks every argument with the guards before any handler touches a file.
      return dispatch(method, args);
    });
  }
}
