// Files in the browser bench: choosing one through a file input, saving one as a download.

import type { NamedText } from './bridgeTypes';
import type { CaptureFile } from './workerProtocol';

/** Let the user choose one file; resolves null when the dialog is dismissed without a choice. */
export function chooseFile(input: HTMLInputElement): Promise<File | null> {
  return new Promise((resolve) => {
    input.value = '';
    const done = () => {
      input.removeEventListener('change', onChange);
      input.removeEventListener('cancel', onCancel);
    };
    const onChange = () => {
      done();
      resolve(input.files?.[0] ?? null);
    };
    const onCancel = () => {
      done();
      resolve(null);
    };
    input.addEventListener('change', onChange);
    input.addEventListener('cancel', onCancel);
    input.click();
  });
}

export async function readFileText(file: File): Promise<NamedText> {
  return { name: file.name, text: await file.text() };
}

/** A capture file's bytes as written: the importer finds their encoding (UTF-8, UTF-16, Windows-1252). */
export async function readFileBytes(file: File): Promise<CaptureFile> {
  return { name: file.name, bytes: await file.arrayBuffer() };
}

/** Start a download of `content` (text, or base64 for binary) named `name`. */
export function downloadFile(name: string, content: string, encoding: 'utf8' | 'base64', mime: string): void {
  const data = encoding === 'base64' ? Uint8Array.from(atob(content), (c) => c.charCodeAt(0)) : content;
  const url = URL.createObjectURL(new Blob([data], { type: mime }));
  const link = document.createElement('a');
  link.href = url;
  link.download = name;
  link.rel = 'noopener';
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
