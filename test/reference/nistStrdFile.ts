// Test-only reader for the NIST StRD nonlinear regression .dat files (header, certified values, data).

export type NistDifficulty = 'lower' | 'average' | 'higher';

export interface NistParameter {
  name: string;
  start1: number;
  start2: number;
  certified: number;
  certifiedStdDev: number;
}

export interface NistDataset {
  name: string;
  difficulty: NistDifficulty;
  /** The model as the header writes it, continuation lines joined. */
  model: string;
  parameters: NistParameter[];
  residualSumOfSquares: number;
  residualStdDev: number;
  /** As the header states it (Rat43's header says 9 where 15 observations and 4 parameters leave 11). */
  degreesOfFreedom: number;
  x: number[];
  y: number[];
}

const NUMBER = '[-+]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][-+]?\\d+)?';
const PARAMETER_LINE = new RegExp(`^\\s*(b\\d+)\\s*=\\s*(${NUMBER})\\s+(${NUMBER})\\s+(${NUMBER})\\s+(${NUMBER})\\s*$`);

/** Parse one .dat file; throws naming the file and line when a section is missing or malformed. */
export function parseNistStrd(text: string, name: string): NistDataset {
  const lines = text.split(/\r?\n/);
  const fail = (what: string, line?: number): never => {
    throw new Error(`${name}.dat${line === undefined ? '' : ` line ${line + 1}`}: ${what}`);
  };
  const find = (pattern: RegExp, from = 0): number => {
    for (let i = from; i < lines.length; i++) if (pattern.test(lines[i])) return i;
    return fail(`no line matching ${pattern}`);
  };

  const difficultyLine = lines[find(/Level of Difficulty/i)];
  const difficulty = /lower/i.test(difficultyLine)
    ? 'lower'
    : /average/i.test(difficultyLine)
      ? 'average'
      : /higher/i.test(difficultyLine)
        ? 'higher'
        : fail('unknown difficulty');

  const modelStart = find(/^\s*(y|log\[y\])\s*=/, find(/^Model:/));
  const modelLines: string[] = [];
  for (let i = modelStart; i < lines.length && lines[i].trim() !== ''; i++) modelLines.push(lines[i].trim());
  const model = modelLines.join(' ').replace(/\s+/g, ' ');

  const parameters: NistParameter[] = [];
  for (let i = find(/Start 1\s+Start 2/i) + 1; i < lines.length; i++) {
    const m = PARAMETER_LINE.exec(lines[i]);
    if (m === null) break;
    parameters.push({ name: m[1], start1: +m[2], start2: +m[3], certified: +m[4], certifiedStdDev: +m[5] });
  }
  if (parameters.length === 0) fail('no parameter lines after the starting-values header');

  const numberAfter = (label: RegExp): number => {
    const i = find(label);
    const m = new RegExp(`(${NUMBER})\\s*$`).exec(lines[i]);
    return m === null ? fail('no number at the end of the line', i) : +m[1];
  };
  const residualSumOfSquares = numberAfter(/^Residual Sum of Squares:/);
  const residualStdDev = numberAfter(/^Residual Standard Deviation:/);
  const degreesOfFreedom = numberAfter(/^Degrees of Freedom:/);
  const observations = numberAfter(/^Number of Observations:/);

  const header = find(/^Data:\s+y\s+/, find(/^Model:/));
  const columns = lines[header].replace(/^Data:/, '').trim().split(/\s+/);
  if (columns.length !== 2 || columns[1] !== 'x') fail(`only one predictor is supported, found ${columns.join(', ')}`, header);
  const x: number[] = [];
  const y: number[] = [];
  for (let i = header + 1; i < lines.length; i++) {
    const cells = lines[i].trim().split(/\s+/);
    if (cells.length === 1 && cells[0] === '') continue;
    const [yi, xi] = cells.map(Number);
    if (cells.length !== 2 || !Number.isFinite(yi) || !Number.isFinite(xi)) fail('expected two numbers', i);
    y.push(yi);
    x.push(xi);
  }
  if (x.length !== observations) fail(`read ${x.length} observations, header says ${observations}`);

  return { name, difficulty, model, parameters, residualSumOfSquares, residualStdDev, degreesOfFreedom, x, y };
}
