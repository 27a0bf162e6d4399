// Plain-text tables and goal lines for the benchmark printouts.

/** Columns padded to their widest cell; the first column left-aligned, the rest right-aligned. */
export function formatTable(headers: string[], rows: string[][]): string {
  const widths = headers.map((h, j) => Math.max(h.length, ...rows.map((r) => (r[j] ?? '').length)));
  const line = (cells: string[]) =>
    cells.map((c, j) => (j === 0 ? c.padEnd(widths[j]) : c.padStart(widths[j]))).join('  ').trimEnd();
  return [line(headers), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/** One goal with its measured figure: 'PASS  goal: measured' or 'MISS  ...'. */
export function goalLine(met: boolean, goal: string, measured: string): string {
  return `${met ? 'PASS' : 'MISS'}  ${goal}: ${measured}`;
}

/** A number at `digits` significant digits, or '-' when absent. */
export function fixed(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '-';
  return value.toPrecision(digits);
}

/** 10000 -> '1e4' (the size labels of the benchmark). */
export function sizeLabel(samples: number): string {
  return samples.toExponential(0).replace('+', '');
}

/** Where the benchmarks run, for the record. */
export function machineLine(cpus: { model: string }[], node: string, date: Date): string {
  return `${date.toISOString().slice(0, 10)}, ${cpus.length} x ${cpus[0]?.model ?? 'unknown CPU'}, Node ${node}`;
}
