/**
 * Entry point of the `tauline` command. `main(argv, io)` returns the exit status instead
 * of exiting, so tests can drive it in-process as well as through the binary.
 */
import { COMMANDS } from './commands/index.js';
import { setStandardInput } from './files.js';
import {
  commandHelp,
  describeFailure,
  escapeControlCharacters,
  fileErrorReason,
  type Io,
  parseCommandArgs,
} from './framework.js';
import { TABLE_WIDTH, wrapText } from './layout.js';
import { clearProgress } from './progress.js';
import { didYouMean } from './suggest.js';

const VERSION = '0.1.0';

function overview(): string {
  const w = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    `tauline ${VERSION}: satellite clock relativity, stability and steering`,
    '',
    'Usage: tauline <command> [flags]     (details: tauline help <command>, or tauline <command> --help)',
    '',
    'Commands:',
    ...COMMANDS.flatMap((c) => wrapText(`  ${c.name.padEnd(w)}  ${c.summary}`, TABLE_WIDTH, ' '.repeat(w + 4))),
    '',
    'All quantities are SI (metres, seconds, hertz, radians) unless a flag name says otherwise.',
    'Wherever a file is read, - reads standard input.',
    '',
  ].join('\n');
}

const processIo: Io = {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
  isTty: Boolean(process.stderr.isTTY),
  stdin: () => process.stdin,
};

/** Standard input of a run whose Io gives none: empty. */
async function* noInput(): AsyncGenerator<string> {}

let closedPipeHandled = false;

/**
 * `tauline … | head` closes stdout before the command has written everything: end quietly, as
 * Unix filters do, instead of dying on the unhandled EPIPE with a stack trace.
 */
function endQuietlyOnClosedStdout(): void {
  if (closedPipeHandled) return;
  closedPipeHandled = true;
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE') process.exit(0);
    // Standard output cannot be written (a full disk, `> /dev/full`): one line and exit 2, not a stack trace.
    process.stderr.write(
      `tauline: cannot write standard output: ${fileErrorReason(error) ?? error.code ?? error.message}\n`,
    );
    process.exit(2);
  });
}

/** Says a command name is unknown, with the closest names when there are any; exit status 2. */
function unknownCommand(name: string, io: Io): number {
  const names = COMMANDS.map((c) => c.name);
  io.err(
    `tauline: unknown command ${JSON.stringify(name)}${didYouMean(name, names)} (known commands: ${names.join(', ')})\n`,
  );
  return 2;
}

/** `tauline help <command>`: that command's help (exit 0), or the unknown-command line (exit 2). */
function helpOf(name: string, extra: readonly string[], io: Io): number {
  const rest = [name, ...extra];
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) return unknownCommand(name, io);
  if (extra.length > 0) {
    io.err(
      `tauline help: give one command name (received ${rest.map((r) => JSON.stringify(r)).join(' ')}); see \`tauline help ${command.name}\`\n`,
    );
    return 2;
  }
  io.out(commandHelp(command));
  return 0;
}

export async function main(argv: string[], io: Io = processIo): Promise<number> {
  if (io === processIo) endQuietlyOnClosedStdout();
  const [name, ...rest] = argv;
  const [helpName, ...helpExtra] = rest;
  // `tauline help <command>` = `tauline <command> --help`
  if (name === 'help' && helpName !== undefined) return helpOf(helpName, helpExtra, io);
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.out(overview());
    return name === undefined ? 2 : 0;
  }
  if (name === '--version') {
    io.out(`${VERSION}\n`);
    return 0;
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) return unknownCommand(name, io);
  const previousInput = setStandardInput(io.stdin ?? noInput);
  // Whatever a command prints may quote its input files: control characters reach the terminal escaped
  // (a progress bar's carriage return is kept on stderr).
  const safeIo: Io = {
    ...io,
    out: (text) => io.out(escapeControlCharacters(text, '\n')),
    err: (text) => io.err(escapeControlCharacters(text, '\n\r')),
  };
  try {
    const args = parseCommandArgs(command, rest);
    if (args.values.help) {
      io.out(commandHelp(command));
      return 0;
    }
    return await command.run(args, safeIo);
  } catch (error) {
    const { line, status } = describeFailure(error);
    clearProgress(io); // a progress bar left mid-line by the failure
    io.err(`tauline ${command.name}: ${escapeControlCharacters(line)}\n`);
    return status;
  } finally {
    setStandardInput(previousInput);
  }
}
