/** The command registry. Add a command: write `commands/<name>.ts` exporting a `Command`, then list it here. */
import type { Command } from '../framework.js';

export const COMMANDS: Command[] = [
];
