// The per-launch secret that every /api/ request of the local bench must carry.

import { randomBytes, timingSafeEqual } from 'node:crypto';

/** 32 random bytes as URL-safe text. */
export function createToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Constant-time comparison, false for a missing or differently sized token. */
export function tokensMatch(expected: string, given: string | null): boolean {
  if (given === null) return false;
  const a = Buffer.from(expected);
  const b = Buffer.from(given);
  return a.length === b.length && timingSafeEqual(a, b);
}
