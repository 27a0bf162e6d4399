// The trust table: every everyday corner of a bench capture ends right (within 3 reported sigma) or declared failed.

import { describe, expect, it } from 'vitest';
import { trustViolation, type TrustCase } from './trust/trustCase';
import { handSetWindowCases } from './trust/cases/handSetWindow';
import { noResponseCases } from './trust/cases/noResponse';
import { firstOrderCases } from './trust/cases/firstOrder';
import { inProgressCases } from './trust/cases/inProgress';
import { overdampedCases } from './trust/cases/overdamped';
import { jumpStartCases } from './trust/cases/jumpStart';
import { railStartCases } from './trust/cases/railStart';
import { severalEventsCases } from './trust/cases/severalEvents';
import { bandLimitedNoiseCases } from './trust/cases/bandLimitedNoise';
import { singularStepsCases } from './trust/cases/singularSteps';
import { benchJobsCases } from './trust/cases/benchJobs';
import { finiteEdgeCases } from './trust/cases/finiteEdge';

const TABLE: TrustCase[] = [
  ...handSetWindowCases,
  ...noResponseCases,
  ...firstOrderCases,
  ...inProgressCases,
  ...overdampedCases,
  ...jumpStartCases,
  ...railStartCases,
  ...severalEventsCases,
  ...bandLimitedNoiseCases,
  ...singularStepsCases,
  ...benchJobsCases,
  ...finiteEdgeCases,
];

describe('never confidently wrong', () => {
  it.each(TABLE.map((c) => [`case ${c.issueCase}: ${c.name}`, c] as const))('%s', (_label, c) => {
    expect(trustViolation(c, c.run())).toBeNull();
  });
});

describe('the trust table', () => {
  it('holds a row for every numbered case and for the bench jobs on top', () => {
    const covered = new Set(TABLE.map((c) => c.issueCase));
    expect([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10].filter((n) => !covered.has(n))).toEqual([]);
  });
});
