// Trust table rows: see trustCase.ts.

import type { TrustCase } from '../trustCase';

export const jumpStartCases: TrustCase[] = [];
