// The command line imports only the module of the command it runs: what each command line reaches, and that a
// command alone behaves as it does among all the others.
import { Command } from 'commander';
import { describe, expect, it } from 'vitest';
import { COMMANDS, commandsFor } from '../../main/cli/program';
import { VERSION } from '../../main/version';
import { runCliIn } from './cliHarness';

const names = (commands: typeof COMMANDS) => commands.map(([name]) => name);
const ALL = names(COMMANDS);

describe('the commands a command line loads', () => {
  it('is the one named first, none for the version, and all otherwise', () => {
    expect(names(commandsFor(['fit', 'capture.csv', '--json']))).toEqual(['fit']);
    expect(names(commandsFor(['log', 'list', '--log', 'bench.jsonl']))).toEqual(['log']);
    expect(names(commandsFor(['--version']))).toEqual([]);
    expect(names(commandsFor(['-V', 'fit']))).toEqual([]);
    for (const argv of [[], ['--help'], ['help', 'fit'], ['fitt', 'capture.csv'], ['--json', 'fit']]) expect(names(commandsFor(argv))).toEqual(ALL);
  });

  it('each module registers the command it is listed under, and only it', async () => {
    for (const [name, load] of COMMANDS) {
      const program = new Command('ringbench');
      (await load())(program, { io: { out: () => {}, err: () => {}, cwd: '.', interactive: false }, setExitCode: () => {} });
      expect(program.commands.map((command) => command.name())).toEqual([name]);
    }
  });

  it("a command's help and its errors read the same loaded alone as among all the commands", async () => {
    for (const name of ALL) {
      const alone = await runCliIn('.', [name, '--help']);
      const amongAll = await runCliIn('.', ['help', name]);
      expect(alone).toEqual(amongAll);
    }
    const help = await runCliIn('.', ['--help']);
    expect(help.out.match(/^ {2}[a-z]+(?= )/gm)?.map((line) => line.trim())).toEqual([...ALL, 'help']);
    expect(await runCliIn('.', ['fit'])).toEqual({ code: 2, out: '', err: "error: missing required argument 'file'\n" });
  });

  it('prints the version with no command loaded', async () => {
    expect(await runCliIn('.', ['--version'])).toEqual({ code: 0, out: `${VERSION}\n`, err: '' });
  });
});
