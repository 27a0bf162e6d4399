// The files the window may read: only those the user chose in a dialog, dropped, or opened before.

import { realpathSync } from 'node:fs';

export class GrantedPaths {
  private readonly paths = new Set<string>();

  /** Grant a path the user picked; returns its real path (links resolved), or null when it does not exist. */
  grant(path: string): string | null {
    const real = realPath(path);
    if (real !== null) this.paths.add(real);
    return real;
  }

  isGranted(path: string): boolean {
    const real = realPath(path);
    return real !== null && this.paths.has(real);
  }
}

function realPath(path: string): string | null {
  try {
    return realpathSync(path);
  } catch {
    return null;
  }
}
