// The known part typed in the components panel: read once, the other two parts derived by deriveComponents.

import { deriveComponents, type KnownPartRequest } from '../../core/workflow/measuredComponents';
import { parsePositiveValue, parseTolerance } from '../../core/workflow/userValues';
import type { BenchState, ComponentsInput } from '../benchState';
import type { SampleEntry } from '../bridgeTypes';
import { splitKnownOption } from '../parseInputs';
import { plainMessage } from '../plainMessage';
import { reweighCautions } from './cautions';
import type { ActionContext } from './context';

const UNIT_OF = { R: 'ohm', L: 'H', C: 'F' } as const;

/** The typed known part; null when no value is typed; bad text throws in plain words. */
export function knownPartOf(input: ComponentsInput): KnownPartRequest | null {
  if (input.knownText.trim() === '') return null;
  const value = parsePositiveValue(input.knownText.trim(), `known ${input.knownName}`, UNIT_OF[input.knownName]) as number;
  const tolerance = parseTolerance(input.toleranceText, `known ${input.knownName}`);
  return { topology: input.topology, known: { name: input.knownName, value, ...(tolerance > 0 ? { tolerance } : {}) } };
}

/** The known part for a request to the worker, or undefined with the reason shown in the components panel. */
export function knownPartForFit(state: BenchState): KnownPartRequest | undefined {
  try {
    state.componentsError = null;
    return knownPartOf(state.componentsInput) ?? undefined;
  } catch (error) {
    state.componentsError = plainMessage(error);
    return undefined;
  }
}

/** A changed topology or known part: the parts derived again from the fit on screen, no refit. */
export function setComponentsInput(ctx: ActionContext, change: Partial<ComponentsInput>): void {
  ctx.store.update((state) => {
    state.componentsInput = { ...state.componentsInput, ...change };
    // A topology alone leaves the part where it came from; a part typed or changed is the user's.
    if (state.componentsInput.knownText.trim() === '') state.knownPartFrom = null;
    else if (Object.keys(change).some((key) => key !== 'topology')) state.knownPartFrom = 'typed';
    state.components = null;
    const part = knownPartForFit(state);
    if (part && state.fit) {
      try {
        state.components = deriveComponents(state.fit, part, state.chosenMode ?? undefined);
      } catch (error) {
        state.componentsError = plainMessage(error);
      }
    }
    reweighCautions(state);
  });
}

/**
 * A new capture starts from the known part its sample entry states (as the command line gets it from the manifest),
 * or from none: a part typed for another capture never carries over into this one's R, L, C and cautions.
 */
export function startKnownPart(state: BenchState, sample: SampleEntry | null): void {
  const known = sample?.options.known ? splitKnownOption(sample.options.known) : null;
  const topology = sample ? (sample.options.topology === 'parallel' ? 'parallel' : 'series') : state.componentsInput.topology;
  state.componentsInput = known
    ? { topology, knownName: known.name, knownText: known.text, toleranceText: '' }
    : { ...state.componentsInput, topology, knownText: '', toleranceText: '' };
  state.knownPartFrom = known ? 'sample' : null;
  state.componentsError = null;
  state.components = null;
}
