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
 */
export async function runCli(argv: readonly string[], isTty = false): Promise<CliRun> {
  let out = '';
  let err = '';
  const status = await main([...argv], { out: (t) => { out += t; }, err: (t) => { err += t; }, isTty });
  return { status, out, err };
}
