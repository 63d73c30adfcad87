/**
 * The public SDK surface, enumerated at run time: every export of every `@tauline/sdk` subpath
 * entry (the `exports` map of packages/sdk/package.json, resolved to the TypeScript sources), so a
 * newly exported function is covered without editing the test. Also the result check: a result's
 * numbers are all finite (walked deeply, typed arrays included), and an error is a TaulineError.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { TaulineError } from '../../src/errors.js';

const SDK_ROOT = fileURLToPath(new URL('../../', import.meta.url));

export type ExportKind = 'function' | 'async-function' | 'generator' | 'async-generator' | 'class' | 'value';
export interface PublicExport {
  readonly subpath: string;
  readonly name: string;
  readonly value: unknown;
  readonly kind: ExportKind;
}

function kindOf(value: unknown): ExportKind {
  if (typeof value !== 'function') return 'value';
  if (/^class\b/.test(Function.prototype.toString.call(value))) return 'class';
  switch (value.constructor.name) {
    case 'AsyncFunction':
      return 'async-function';
    case 'GeneratorFunction':
      return 'generator';
    case 'AsyncGeneratorFunction':
      return 'async-generator';
    default:
      return 'function';
  }
}

/** Source file of each subpath in the package's `exports` map (`./dist/x/index.js` → `src/x/index.ts`; the one-file bundle is skipped). */
export function subpathSources(): { subpath: string; file: string }[] {
  const pkg = JSON.parse(readFileSync(`${SDK_ROOT}package.json`, 'utf8')) as { exports: Record<string, unknown> };
  const out: { subpath: string; file: string }[] = [];
  for (const [subpath, target] of Object.entries(pkg.exports)) {
    if (typeof target !== 'object' || target === null) continue; // ./package.json
    const js = (target as { import: string }).import;
    // `./bundle` is the root entry built into one file (scripts/build-bundles.mjs): the same exports as `.`.
    if (js.startsWith('./dist/bundle/')) continue;
    out.push({ subpath, file: `${SDK_ROOT}${js.replace(/^\.\/dist\//, 'src/').replace(/\.js$/, '.ts')}` });
  }
  return out;
}

/** Every export of every subpath, each name once (the root `.` re-exports the subpaths). */
export async function publicExports(): Promise<PublicExport[]> {
  const seen = new Map<string, PublicExport>();
  for (const { subpath, file } of subpathSources()) {
    const mod = (await import(/* @vite-ignore */ file)) as Record<string, unknown>;
    for (const [name, value] of Object.entries(mod)) {
      const previous = seen.get(name);
      if (previous && previous.value !== value) throw new Error(`${name} is exported as two different values`);
      if (!previous || previous.subpath === '.') seen.set(name, { subpath, name, value, kind: kindOf(value) });
    }
  }
  return [...seen.values()];
}

/**
 * The first non-finite number inside `value`, as `path = value`, or undefined when all are finite.
 * `allowed` matches the `path = value` texts that a function documents (e.g. NaN for a missing sample).
 */
export function nonFinitePath(
  value: unknown,
  allowed?: RegExp,
  path = 'result',
  seen = new Set<object>(),
): string | undefined {
  if (typeof value === 'number') {
    const text = `${path} = ${value}`;
    return Number.isFinite(value) || allowed?.test(text) ? undefined : text;
  }
  if (value === null || typeof value !== 'object') return undefined;
  if (seen.has(value)) return undefined;
  seen.add(value);
  if (ArrayBuffer.isView(value)) {
    if (value instanceof DataView) return undefined;
    const arr = value as unknown as ArrayLike<number | bigint>;
    for (let i = 0; i < arr.length; i++) {
      const v = arr[i];
      if (typeof v === 'number' && !Number.isFinite(v) && !allowed?.test(`${path}[${i}] = ${v}`))
        return `${path}[${i}] = ${v}`;
    }
    return undefined;
  }
  const entries: [string, unknown][] =
    value instanceof Map
      ? [...value.entries()].map(([k, v]) => [String(k), v])
      : value instanceof Set
        ? [...value].map((v, i) => [String(i), v])
        : Object.entries(value);
  for (const [k, v] of entries) {
    const found = nonFinitePath(v, allowed, `${path}.${k}`, seen);
    if (found) return found;
  }
  return undefined;
}

/** Describes a thrown value that is not a TaulineError, or undefined when it is one. */
export function untypedError(error: unknown): string | undefined {
  if (error instanceof TaulineError) return undefined;
  if (error instanceof Error)
    return `${error.name}: ${error.message}\n${error.stack?.split('\n').slice(1, 4).join('\n')}`;
  return `non-Error thrown: ${String(error)}`;
}
