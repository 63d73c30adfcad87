/** The command registry. Add a command: write `commands/<name>.ts` exporting a `Command`, then list it here. */
import type { Command } from '../framework.js';
import { broadcastCommand } from './broadcast.js';
import { clockCommand } from './clock.js';
import { fleetCommand } from './fleet.js';
import { periodicCommand } from './periodic.js';
import { planCommand } from './plan.js';
import { preciseCommand } from './precise.js';
import { propertimeCommand } from './propertime.js';
import { rateCommand } from './rate.js';
import { reviewCommand } from './review.js';
import { simulateCommand } from './simulate.js';
import { stabilityCommand } from './stability.js';

export const COMMANDS: Command[] = [
  planCommand,
  fleetCommand,
  simulateCommand,
  rateCommand,
  periodicCommand,
  propertimeCommand,
  broadcastCommand,
  preciseCommand,
  reviewCommand,
  stabilityCommand,
  clockCommand,
];
