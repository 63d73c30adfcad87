/**
 * Flags, their help snippets and the input files they name, shared by several commands. A command imports
 * these from here, never from another command (checked by test/commands/imports.test.ts).
 */
import { type ConstantSet, constantSet } from '@tauline/sdk/constants';
import { InvalidArgumentError } from '@tauline/sdk/errors';
import type { SteeringMethod } from '@tauline/sdk/steering';
import { createTimeScales, type LeapSecondTable, parseLeapSecondsList, type TimeScales } from '@tauline/sdk/time';
import { readJsonFile, readTextFile, sourceLabel } from './files.js';
import {
  type FlagSpec,
  formatFlag,
  optionalFlag,
  type ParsedArgs,
  TABLE_JSON_CSV,
  withFlagNames,
} from './framework.js';

/** The `--constants` flag spec (the set of GM, L_G, J2, … the command computes with). */
export const CONSTANTS_FLAG: FlagSpec = {
  type: 'string',
  value: '<name>',
  description: 'Constant set: iers-2010 (default), gps-icd, galileo-icd, beidou-icd.',
};

/** Reads `--constants` (default iers-2010), naming the flag when the set is unknown. */
export function constantsFlag(args: ParsedArgs): ConstantSet {
  const name = optionalFlag(args, 'constants') ?? 'iers-2010';
  return withFlagNames({ constants: '--constants' }, () => constantSet(name));
}

/** The planners `--strategy` names (plus `all` where a command compares them). */
const METHODS: readonly SteeringMethod[] = ['deadband', 'optimal', 'none'];

/** Reads a scenario file; an empty file or a JSON syntax error becomes a ParseError with line and column. */
export async function readScenarioFile(path: string): Promise<unknown> {
  return readJsonFile(path, 'a steering scenario');
}

/**
 * Reads `--leap-seconds <file>`: an IERS/NIST `leap-seconds.list` turned into the time scales
 * the scenario's UTC stamps are read with. Undefined (flag absent) keeps the SDK's bundled
 * table (valid until 2027-06-28).
 * @throws {ParseError} with file and line for a malformed list (from `parseLeapSecondsList`).
 * @throws {InvalidArgumentError} naming --leap-seconds when the list's entries break the table rules.
 */
export async function leapSecondsFlag(args: ParsedArgs): Promise<TimeScales | undefined> {
  const table = await leapSecondsTableFlag(args);
  return table === undefined ? undefined : createTimeScales(table);
}

/**
 * Reads `--leap-seconds <file>` as a checked leap-second table (plain data, e.g. for a worker thread):
 * the table `leapSecondsFlag` builds its time scales from. Undefined when the flag is absent.
 * @throws {ParseError} with file and line for a malformed list.
 * @throws {InvalidArgumentError} naming --leap-seconds when the list's entries break the table rules.
 */
export async function leapSecondsTableFlag(args: ParsedArgs): Promise<LeapSecondTable | undefined> {
  const path = optionalFlag(args, 'leap-seconds');
  if (path === undefined) return undefined;
  const text = await readTextFile(path, 'an IERS/NIST leap-seconds.list');
  try {
    const table = parseLeapSecondsList(text, sourceLabel(path));
    createTimeScales(table); // checks the table rules here, where the error can name the flag
    return table;
  } catch (error) {
    if (error instanceof InvalidArgumentError) {
      throw new InvalidArgumentError(
        '--leap-seconds',
        path,
        'an IERS/NIST leap-seconds.list with a valid table',
        error.message,
      );
    }
    throw error;
  }
}

/** The `--leap-seconds` flag spec, shared by `plan`, `simulate` and `fleet`. */
export const LEAP_SECONDS_FLAG: FlagSpec = {
  type: 'string',
  value: '<file>',
  description:
    'IERS/NIST leap-seconds.list to read UTC stamps with (default: the bundled table, valid until 2027-06-28).',
};

/** Help text on leap seconds, shared by `plan`, `simulate` and `fleet`. */
export const LEAP_SECONDS_HELP = `
Times: UTC stamps are read with a leap-second table and intervals are elapsed SI seconds, so a
leap second inside the horizon is counted. The bundled table is valid until 2027-06-28; for later
dates pass a current IERS/NIST leap-seconds.list with --leap-seconds <file>.`;

/** Reads the --strategy flag; undefined keeps the scenario's own. */
export function strategyFlag(value: string | undefined, allowAll: boolean): SteeringMethod | 'all' | undefined {
  if (value === undefined) return undefined;
  if ((METHODS as readonly string[]).includes(value) || (allowAll && value === 'all'))
    return value as SteeringMethod | 'all';
  throw new InvalidArgumentError(
    '--strategy',
    value,
    `one of ${[...METHODS, ...(allowAll ? ['all'] : [])].join(', ')}`,
  );
}

/** Parses `--satellite G01,E11,...` into a set, or undefined for all. */
export function satelliteFlag(args: ParsedArgs): Set<string> | undefined {
  const text = optionalFlag(args, 'satellite');
  if (text === undefined) return undefined;
  const ids = text
    .split(',')
    .map((s) => s.trim().toUpperCase())
    .filter((s) => s !== '');
  for (const id of ids) {
    if (!/^[GRECJIS]\d\d$/.test(id)) {
      throw new InvalidArgumentError(
        '--satellite',
        id,
        'satellite identifiers: system letter and two digits, comma-separated (e.g. G05,E11,C08)',
      );
    }
  }
  if (ids.length === 0)
    throw new InvalidArgumentError('--satellite', text, 'at least one satellite identifier (e.g. G05)');
  return new Set(ids);
}

/** Reads `--format table|json|csv` or its shorthands `--json` / `--csv` (mutually exclusive). */
export function outputFormat(args: ParsedArgs): 'json' | 'csv' | 'table' {
  return formatFlag(args, TABLE_JSON_CSV, 'table');
}
