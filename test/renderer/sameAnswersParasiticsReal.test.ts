// The window's extraction with real capacitors (its typed fields read by parasiticsAsk, answered by the worker's handler)
// gives the same JSON as `parasitics` with the same derating, DC-bias factor, switch Coss and turn-on edge.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from '../main/cliHarness';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import { parasiticsAsk, type ExtractionSettings } from '../../renderer/actions/extraction';
import { turnOnEdge, turnOnEdgeCsv } from '../core/turnOnEdgeCapture';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../sample-captures');
const SET = ['switch-node-before.csv', 'switch-node-after-470p.csv', 'switch-node-after-1n.csv'];
let folder: string;
let edgeText: string;

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-same-real-'));
  edgeText = turnOnEdgeCsv(turnOnEdge({ L: 7e-9, seed: 9 }));
  writeFileSync(path.join(folder, 'edge.csv'), edgeText);
});

afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('extraction with real capacitors, window and command line', () => {
  it('the same JSON for a per-part derating, a DC-bias factor, the switch Coss and a plateau-voltage edge', async () => {
    const cli = await runCliIn(folder, [
      'parasitics', ...SET.map((f) => path.join(SAMPLES, f)), '--added', 'C=470p@0.95,1n', '--added-tolerance', '0', '--dc-bias-factor', '0.9', '--derating-tolerance', '10',
      '--switch-coss', '100p,20', '--current-capture', 'edge.csv', '--current-column', 'I_D', '--plateau-voltage', '4.7,5', '--json',
    ]);
    expect(cli.err).toBe('');
    const rows = SET.map((file, i) => ({ name: file, content: { text: readFileSync(path.join(SAMPLES, file), 'utf8') }, addedText: ['', '470p', '1n'][i], deratingText: i === 1 ? '95%' : '' }));
    const settings: ExtractionSettings = {
      addedToleranceText: '0', probeText: '', probeToleranceText: '', bandwidthText: '', voltageText: '', switchingText: '',
      dcBiasText: '0.9', deratingToleranceText: '10', switchCText: '100p,20',
      edge: { file: { name: 'edge.csv', text: edgeText }, currentChannelText: 'I_D', voltageChannelText: '', plateauText: '4.7,5' },
    };
    const { value } = handleWorkerRequest({ type: 'parasitics', ...parasiticsAsk(rows, settings) }, () => undefined);
    expect(value.type).toBe('parasitics');
    expect(JSON.parse(JSON.stringify((value as { result: unknown }).result))).toEqual(JSON.parse(cli.out));
    expect(JSON.parse(cli.out).captures.map((c: { factorSource: string }) => c.factorSource)).toEqual(['none', 'derating', 'dc-bias']);
  });
});
