// Runs one bench API call by name: checks the method and every argument, then answers an ApiResult.

import { describeFailure } from '../../core/inputError';
import type { ApiResult } from '../../core/bench/benchApiTypes';
import type { ApiMethod } from './apiMethods';
import { argumentProblem, isApiMethod } from './guards';

export type ApiHandlers = Partial<Record<ApiMethod, (...args: never[]) => Promise<unknown>>>;


/** A dispatcher over `handlers`; a method without a handler is unknown here (e.g. dialogs over HTTP). */
export function createApiDispatch(handlers: ApiHandlers): (method: string, args: unknown[]) => Promise<ApiResult<unknown>> {
  return async (method, args) => {
    if (!isApiMethod(method) || handlers[method] === undefined) return { ok: false, error: `no bench call '${method.slice(0, 60)}'`, code: 'unknown-method' };
    const problem = argumentProblem(method, args);
    if (problem !== null) return { ok: false, error: problem, code: 'bad-argument' };
    try {
      const handler = handlers[method] as (...a: unknown[]) => Promise<unknown>;
      return { ok: true, value: await handler(...args) };
    } catch (error) {
      return { ok: false, error: messageOf(error), code: 'failed' };
    }
  };
}

function messageOf(error: unknown): string {
  const { input, text } = describeFailure(error);
  return input ? text : `the bench could not do this: ${text}`;
}
