// The `kinsort` command: fit, assign, sql. Errors print one line to standard error, no stack
// trace, and exit with status 2.
import { KinsortError, didYouMean } from '../core/errors';
import { assignCommand, fitCommand, Io, sqlCommand } from './commands';
import { MAIN_HELP } from './help';

const COMMANDS: Record<string, (args: string[], io: Io) => number> = {
  fit: fitCommand,
  assign: assignCommand,
  sql: sqlCommand,
};

const processIo: Io = {
  out: (text) => process.stdout.write(text),
  err: (text) => process.stderr.write(text),
};

function oneLine(message: string): string {
  return message.replace(/\s*\n\s*/g, ' ').trim();
}

/** Run the command line; returns the exit status (0 ok, 2 on any error). */
export function run(argv: readonly string[], io: Io = processIo): number {
  const [command, ...rest] = argv;
  try {
    if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
      io.out(MAIN_HELP);
      return command === undefined ? 2 : 0;
    }
    const handler = COMMANDS[command];
    if (handler === undefined) {
      const names = Object.keys(COMMANDS);
      throw new KinsortError(`unknown command "${command}".${didYouMean(command, names)} Commands: ${names.join(', ')}.`, 'bad-argument');
    }
    return handler(rest, io);
  } catch (e) {
    if (e instanceof KinsortError) io.err(`kinsort: ${oneLine(e.message)}\n`);
    else io.err(`kinsort: internal error: ${oneLine(e instanceof Error ? e.message : String(e))} (please report this)\n`);
    return 2;
  }
}
