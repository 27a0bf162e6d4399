// The packaged window's Electron fuses, as electron-builder reads them from package.json's "build" section:
// no Node from the environment or the command line, encrypted cookies, and only the checked app archive loaded.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const build = JSON.parse(readFileSync(path.join(ROOT, 'package.json'), 'utf8')).build as Record<string, unknown>;
/** electron-builder's own schema of its configuration, which names every fuse it flips. */
const schema = JSON.parse(readFileSync(path.join(ROOT, 'node_modules', 'app-builder-lib', 'scheme.json'), 'utf8')) as {
  definitions: { FuseOptionsV1: { properties: Record<string, { type: string }> } };
};

describe('Electron fuses of the packaged window', () => {
  const fuses = build.electronFuses as Record<string, unknown>;

  it.each([
    // ELECTRON_RUN_AS_NODE would turn the signed app into a plain Node for any script.
    ['runAsNode', false],
    // NODE_OPTIONS could preload any code into the main process.
    ['enableNodeOptionsEnvironmentVariable', false],
    // --inspect and SIGUSR1 would open a debugger on the main process.
    ['enableNodeCliInspectArguments', false],
    ['enableCookieEncryption', true],
    ['enableEmbeddedAsarIntegrityValidation', true],
    // Only app.asar, so the integrity check cannot be walked around with an unpacked app folder.
    ['onlyLoadAppFromAsar', true],
    // The window loads bench://, never file://.
    ['grantFileProtocolExtraPrivileges', false],
  ])('%s is %s', (fuse, value) => {
    expect(fuses?.[fuse]).toBe(value);
  });

  it('names only fuses electron-builder knows, with values of their type', () => {
    const known = schema.definitions.FuseOptionsV1.properties;
    for (const [fuse, value] of Object.entries(fuses)) {
      expect(Object.keys(known)).toContain(fuse);
      expect(typeof value).toBe(known[fuse].type);
    }
  });

  it('packs the app into an archive (onlyLoadAppFromAsar needs one)', () => {
    expect(build.asar).not.toBe(false);
  });
});
