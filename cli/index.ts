// The runner's entry: one sub-command per module, so `run` and `bridge` sit beside `model`.
// Exit status: 0 pass, 1 fail, 2 error (bad input, bad configuration), 130 a run stopped by Ctrl-C.
import { runModelCommand } from './model';
import { runRunCommand } from './run';
import { runBridgeCommand } from './bridge';
import { runStationCommand } from './station';
import { runExplainCommand } from './explain';
import type { CliIo } from './io';
import { nodeIo } from './io';
import { packageVersion } from './version';

type Command = (argv: string[], io: CliIo) => Promise<number>;

const COMMANDS: Record<string, { run: Command; summary: string }> = {
  model: { run: runModelCommand, summary: 'evaluate the reference model for given angle codes and print JSON' },
  run: { run: (argv, io) => runRunCommand(argv, io), summary: 'run a bench plan against a board, print the verdict (exit 0 pass, 1 fail, 2 error)' },
  bridge: {
    // With --server the bridge dials the team server as a station; without, it listens itself.
    run: (argv, io) => (argv.some((a) => a === '--server' || a.startsWith('--server=')) ? runStationCommand(argv, io) : runBridgeCommand(argv, io)),
    summary: 'offer one serial port over WebSocket: listening, guarded by a token, or with --server as a station of the team server',
  },
  explain: { run: (argv, io) => runExplainCommand(argv, io), summary: 'find the configuration deviation or defect that reproduces a core\'s answers (exit 0 found, 1 not, 2 error)' },
};

function usage(): string {
  const lines = Object.entries(COMMANDS).map(([name, c]) => `  ${name.padEnd(8)} ${c.summary}`);
  return [
    'usage: anglebench <command> [options]   (from a checkout: npm run --silent cli -- <command> [options])',
    '       anglebench --version | --help',
    '',
    'commands:',
    ...lines,
    '',
    '<command> --help describes its options.',
    '',
  ].join('\n');
}

async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === '--help' || name === '-h') {
    nodeIo.stdout(usage());
    return 0;
  }
  if (name === '--version') {
    nodeIo.stdout(`${packageVersion()}\n`);
    return 0;
  }
  // Wrong arguments: the usage goes to stderr, so stdout stays empty for a pipe.
  if (name === undefined) {
    nodeIo.stderr(usage());
    return 2;
  }
  const command = COMMANDS[name];
  if (!command) {
    nodeIo.stderr(`error: unknown command "${name}" (known: ${Object.keys(COMMANDS).join(', ')})\n${usage()}`);
    return 2;
  }
  return command.run(rest, nodeIo);
}

// exitCode rather than exit(): a large JSON answer must finish flushing to a pipe first.
main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    nodeIo.stderr(`error: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exitCode = 2;
  },
);
