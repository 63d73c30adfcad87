/** The command registry. Add a command: write `commands/<name>.ts` exporting a `Command`, then list it here. */
import type { Command } from '../framework.js';
import { stabilityCommand } from './stability.js';
import { reviewCommand } from './review.js';
import { rateCommand } from './rate.js';
import { periodicCommand } from './periodic.js';
import { propertimeCommand } from './propertime.js';

export const COMMANDS: Command[] = [
  rateCommand,
  periodicCommand,
  propertimeCommand,
  reviewCommand,
  stabilityCommand,
];
