// CPU seconds of the response fit alone per corpus capture (import done beforehand), with each fit's numbers for comparing two versions.
//
// Usage: tsx bench/corpusCpu.ts [--count 30] [--seed 1] [--out results.jsonl]

import { writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { parseCapture } from '../core/capture/parseCapture';
import { selectChannel } from '../core/capture/selectChannel';
import { fitResponse } from '../core/fit/fitResponse';
import { corpusCapture, corpusSpec } from './corpusCapture';
import { judgeFit } from './corpusRun';

const { values: flags } = parseArgs({ options: { count: { type: 'string', default: '30' }, seed: { type: 'string', default: '1' }, out: { type: 'string' } } });
const count = Number(flags.count);
const seed = Number(flags.seed);

const lines: string[] = [];
let totalCpu = 0;
let successes = 0;
for (let index = 0; index < count; index++) {
  const capture = corpusCapture(corpusSpec(index, seed), seed);
  const channel = selectChannel(parseCapture(capture.text));
  const trace = { time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name };
  const before = process.cpuUsage();
  let summary: Record<string, unknown>;
  try {
    const fit = fitResponse(trace);
    const judged = judgeFit(fit, capture.truth);
    if (judged.reasons.length === 0) successes++;
    summary = { status: fit.status, regime: fit.regime, alpha: fit.alpha, omega0: fit.omega0, tau: fit.tau, warnings: fit.warnings, reasons: judged.reasons };
  } catch (error) {
    summary = { threw: String(error) };
  }
  const used = process.cpuUsage(before);
  const seconds = (used.user + used.system) / 1e6;
  totalCpu += seconds;
  lines.push(JSON.stringify({ index, samples: capture.spec.samples, zeta: capture.spec.zeta, cpuS: seconds, ...summary }));
}
if (flags.out) writeFileSync(flags.out, `${lines.join('\n')}\n`);
console.log(`${count} captures (seed ${seed}): ${(totalCpu / count).toFixed(3)} s CPU per fit, ${totalCpu.toFixed(1)} s in all; ${successes} within their stated uncertainty`);
