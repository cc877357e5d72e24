// The `kinsort` command: fit, assign, sql. Errors print one line to standard error, no stack
// trace, and exit with status 2.
import { KinsortError, didYouMean } from '../core/errors';
import { assignCommand, fitCommand, Io, sqlCommand } from './commands';
import { MAIN_HELP } from './help';
import { forTerminal } from '../core/terminal-text';

// A Map, so that "constructor", "toString" or "__proto__" are unknown commands like any other
// word, not properties every plain object inherits.
const COMMANDS: ReadonlyMap<string, (args: string[], io: Io) => number> = new Map([
  ['fit', fitCommand],
  ['assign', assignCommand],
  ['sql', sqlCommand],
]);

const processIo: Io = {
  out: (text) => process.stdout.write(text),
  err: (text) => process.stderr.write(text),
};

/** One line, with any control characters from the user's text (ids, names, paths) escaped. */
function oneLine(message: string): string {
  return forTerminal(message.replace(/\s*\n\s*/g, ' ').trim());
}

/** Run the command line; returns the exit status (0 ok, 2 on any error). */
export function run(argv: readonly string[], io: Io = processIo): number {
  const [command, ...rest] = argv;
  try {
    if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
      io.out(MAIN_HELP);
      return command === undefined ? 2 : 0;
    }
    const handler = COMMANDS.get(command);
    if (handler === undefined) {
      const names = [...COMMANDS.keys()];
      throw new KinsortError(`unknown command "${command}".${didYouMean(command, names)} Commands: ${names.join(', ')}.`, 'bad-argument');
    }
    return handler(rest, io);
  } catch (e) {
    if (e instanceof KinsortError) io.err(`kinsort: ${oneLine(e.message)}\n`);
    else io.err(`kinsort: internal error: ${oneLine(e instanceof Error ? e.message : String(e))} (please report this)\n`);
    return 2;
  }
}
