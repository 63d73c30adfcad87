/**
 * Commands share flags, help snippets and input readers through modules outside `src/commands/`
 * (`flags.ts`, `navigation.ts`, `steering-output.ts`, …), never by importing one another: a change to
 * one command then cannot change another's behaviour. Only the registry, `commands/index.ts`, imports
 * command files.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const COMMANDS_DIR = fileURLToPath(new URL('../../src/commands/', import.meta.url));
const REGISTRY = 'index.ts';

/** Every module specifier of a TypeScript file: static `import`/`export … from` and dynamic `import('…')`. */
function moduleSpecifiers(source: string): string[] {
  const found: string[] = [];
  for (const match of source.matchAll(/\b(?:from|import)\s*\(?\s*['"]([^'"]+)['"]/g)) {
    const [, specifier] = match;
    if (specifier !== undefined) found.push(specifier);
  }
  return found;
}

/** The command files (as paths relative to src/commands/) that `file` imports. */
function importedCommandFiles(file: string): string[] {
  const source = readFileSync(join(COMMANDS_DIR, file), 'utf8');
  return moduleSpecifiers(source)
    .filter((s) => s.startsWith('.'))
    .map((s) => resolve(dirname(join(COMMANDS_DIR, file)), s))
    .filter((target) => !relative(COMMANDS_DIR, target).startsWith('..'))
    .map((target) => relative(COMMANDS_DIR, target));
}

const commandFiles = readdirSync(COMMANDS_DIR, { recursive: true, encoding: 'utf8' })
  .filter((f) => f.endsWith('.ts') && f !== REGISTRY)
  .sort();

describe('command module boundaries', () => {
  it('moduleSpecifiers(source) finds static, re-export, type-only and dynamic imports', () => {
    const source = [
      "import { a } from './plan.js';",
      'import type { B } from "../flags.js";',
      "export { c } from './rate.js';",
      "const d = await import('./stability.js');",
      "import './side-effect.js';",
    ].join('\n');
    expect(moduleSpecifiers(source)).toEqual([
      './plan.js',
      '../flags.js',
      './rate.js',
      './stability.js',
      './side-effect.js',
    ]);
  });

  it('the commands/ folder holds the registry and at least the eleven documented commands', () => {
    expect(readdirSync(COMMANDS_DIR)).toContain(REGISTRY);
    expect(commandFiles.length).toBeGreaterThanOrEqual(11);
  });

  it.each(commandFiles)('commands/%s imports no other command file (shared code lives outside commands/)', (file) => {
    expect(importedCommandFiles(file)).toEqual([]);
  });

  it('commands/index.ts (the registry) imports every command file and nothing else from commands/', () => {
    const imported = importedCommandFiles(REGISTRY)
      .map((f) => f.replace(/\.js$/, '.ts'))
      .sort();
    expect(imported).toEqual(commandFiles);
  });
});
