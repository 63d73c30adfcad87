/** The in-process runner the CLI tests share: `tauline <argv>` through `main`, with stdout and stderr captured. */
import { main } from '../src/main.js';

/** What a run printed and its exit status. */
export interface CliRun {
  status: number;
  out: string;
  err: string;
}

/**
 * Runs `tauline ...argv` in-process and returns its exit status and what it wrote.
 * @param isTty  Whether commands see stderr as a terminal (progress bars are drawn only then).
 * @param stdin  What a file named `-` reads: a text, or a generator of chunks (e.g. an endless one); default nothing.
 */
export async function runCli(
  argv: readonly string[],
  isTty = false,
  stdin?: string | (() => AsyncIterable<Uint8Array | string>),
): Promise<CliRun> {
  let out = '';
  let err = '';
  const input =
    typeof stdin === 'string'
      ? async function* text() {
          yield Buffer.from(stdin, 'utf8');
        }
      : stdin;
  const status = await main([...argv], {
    out: (t) => {
      out += t;
    },
    err: (t) => {
      err += t;
    },
    isTty,
    ...(input ? { stdin: input } : {}),
  });
  return { status, out, err };
}
