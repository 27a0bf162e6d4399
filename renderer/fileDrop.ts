// Drag and drop of a capture file anywhere on the window.

export function installFileDrop(target: HTMLElement, onFile: (file: File) => void): void {
  let depth = 0;
  const hasFiles = (event: DragEvent) => Array.from(event.dataTransfer?.types ?? []).includes('Files');
  target.addEventListener('dragenter', (event) => {
    if (!hasFiles(event)) return;
    depth++;
    target.classList.add('dropping');
  });
  target.addEventListener('dragleave', () => {
    depth = Math.max(0, depth - 1);
    if (depth === 0) target.classList.remove('dropping');
  });
  target.addEventListener('dragover', (event) => {
    if (!hasFiles(event)) return;
    event.preventDefault();
    if (event.dataTransfer) event.dataTransfer.dropEffect = 'copy';
  });
  target.addEventListener('drop', (event) => {
    event.preventDefault();
    depth = 0;
    target.classList.remove('dropping');
    const file = event.dataTransfer?.files[0];
    if (file) onFile(file);
  });
}
