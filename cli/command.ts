// The preamble every sub-command shares: read the options, answer --help on stdout, and turn bad
// input into one `error:` line on stderr (with the usage after bad options) and exit status 2.
import type { CliIo } from './io';

/** Bad input: the command prints its message (first line) on stderr and exits 2. */
export class UsageError extends Error {}

export interface CommandSpec<O> {
  /** Read argv into options, or 'help' for --help; any error it throws is bad options. */
  parse(argv: string[]): O | 'help';
  /** What --help prints on stdout. */
  help: string;
  /** Printed on stderr after a bad-options error (left out: the error line alone). */
  usage?: string;
  /** The command itself; its exit status. A UsageError it throws exits 2, anything else propagates. */
  run(options: O): Promise<number>;
}

const firstLine = (e: unknown) => (e instanceof Error ? e.message : String(e)).split('\n')[0];

export async function runCommand<O>(argv: string[], io: CliIo, spec: CommandSpec<O>): Promise<number> {
  let options: O | 'help';
  try {
    options = spec.parse(argv);
  } catch (e) {
    io.stderr(`error: ${firstLine(e)}\n${spec.usage !== undefined ? `${spec.usage}\n` : ''}`);
    return 2;
  }
  if (options === 'help') {
    io.stdout(spec.help);
    return 0;
  }
  try {
    return await spec.run(options);
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    io.stderr(`error: ${firstLine(e)}\n`);
    return 2;
  }
}
