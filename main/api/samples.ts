// The bundled sample captures and their designs, read from sample-captures/ for the bench API.

import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { DesignEntry, NamedText, SampleEntry } from '../../core/bench/benchApiTypes';
import { BenchApiError } from './apiError';

/** Largest sample or design file served, bytes. */
const MAX_FILE_BYTES = 64 * 1024 * 1024;

interface ManifestCapture {
  file: string;
  scenario?: string;
  channel?: string;
  topology?: string;
  known?: { option?: string };
  addedCapacitor?: { group: string; added: number };
}

/** The manifest's captures as the window lists them; id = the file name without '.csv'. */
export function listSampleEntries(sampleDir: string): SampleEntry[] {
  const manifestPath = join(sampleDir, 'manifest.json');
  let manifest: { captures?: ManifestCapture[] };
  try {
    manifest = JSON.parse(readFileSync(manifestPath, 'utf8')) as { captures?: ManifestCapture[] };
  } catch {
    throw new BenchApiError(`no readable sample manifest at '${manifestPath}'`);
  }
  if (!Array.isArray(manifest.captures)) throw new BenchApiError(`sample manifest '${manifestPath}' lists no captures`);
  const designs = new Set(listDesignIds(sampleDir));
  return manifest.captures
    .filter((c) => typeof c.file === 'string' && /^[A-Za-z0-9][A-Za-z0-9._-]*$/.test(c.file))
    .map((c) => {
      const id = c.file.replace(/\.[^.]+$/, '');
      return {
        id,
        title: humanTitle(id),
        description: c.scenario ?? '',
        file: c.file,
        designId: designs.has(id) ? id : null,
        options: {
          ...(c.channel ? { column: c.channel } : {}),
          ...(c.topology ? { topology: c.topology } : {}),
          ...(c.known?.option ? { known: c.known.option } : {}),
        },
        addedCapacitor: c.addedCapacitor ? { group: c.addedCapacitor.group, added: c.addedCapacitor.added } : null,
      };
    });
}

export function findSample(sampleDir: string, id: string): SampleEntry {
  const sample = listSampleEntries(sampleDir).find((entry) => entry.id === id);
  if (!sample) throw new BenchApiError(`no sample capture '${id}'`);
  return sample;
}

export function readSampleFile(sampleDir: string, file: string): string {
  return readLimited(join(sampleDir, file), `sample capture '${file}'`);
}

export function listDesignEntries(sampleDir: string): DesignEntry[] {
  return listDesignIds(sampleDir).map((id) => ({ id, name: designName(sampleDir, id) }));
}

export function readDesignFile(sampleDir: string, id: string): NamedText {
  const name = `${id}.json`;
  return { name, text: readLimited(join(sampleDir, 'designs', name), `design '${id}'`) };
}

function listDesignIds(sampleDir: string): string[] {
  const folder = join(sampleDir, 'designs');
  if (!existsSync(folder)) return [];
  return readdirSync(folder)
    .filter((name) => /^[A-Za-z0-9][A-Za-z0-9._-]*\.json$/.test(name))
    .map((name) => name.slice(0, -'.json'.length))
    .sort();
}

function designName(sampleDir: string, id: string): string {
  try {
    const parsed = JSON.parse(readDesignFile(sampleDir, id).text) as { name?: unknown };
    return typeof parsed.name === 'string' && parsed.name !== '' ? parsed.name : id;
  } catch {
    return id;
  }
}

/** 'switch-node-after-470p' -> 'Switch node after 470p'. */
function humanTitle(id: string): string {
  const words = id.replace(/[-_]+/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

function readLimited(path: string, what: string): string {
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch {
    throw new BenchApiError(`cannot read ${what}`);
  }
  if (bytes.length > MAX_FILE_BYTES) throw new BenchApiError(`${what} is larger than ${MAX_FILE_BYTES} bytes`);
  return bytes.toString('utf8');
}
