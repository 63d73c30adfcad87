/**
 * Does a JSON Schema accept exactly the documents an SDK validator accepts? A generic, seeded harness:
 * from valid seed documents it builds many documents by targeted mutations at every path (wrong type,
 * boundary and out-of-range numbers, missing field, unknown or misspelt key, empty and shortened arrays,
 * other enum values, damaged date-time stamps, and in-range values that keep a document valid), then asks
 * ajv (an independent JSON Schema implementation) and the validator, and reports every document on which
 * they disagree. The validator may refuse more than the schema only for the cross-field rules a schema
 * cannot express, each listed with its reason (`validatorOnly`); the schema never refuses a document the
 * validator accepts.
 *
 * A format plugs in with one call: `findSchemaDisagreements({ name, schema, seeds, validate, ... })`.
 */
import Ajv from 'ajv';
import Ajv2020 from 'ajv/dist/2020.js';
import fc from 'fast-check';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type Path = readonly (string | number)[];
type Schema = Record<string, unknown>;

/** A refusal only the validator can make (a rule across fields, or against the leap-second table). */
export interface ValidatorOnlyRule {
  /** Matches the error's field path (`InvalidArgumentError.argument`). */
  readonly path: RegExp;
  /** Matches the error message. */
  readonly message: RegExp;
  /** Why the schema cannot say it. */
  readonly why: string;
}

export interface SchemaAgreementSpec {
  readonly name: string;
  /** The JSON Schema (draft-07, or 2020-12 when its `$schema` says so). */
  readonly schema: object;
  /** Valid documents to mutate (each must pass both sides; checked). */
  readonly seeds: readonly unknown[];
  /** The SDK validator: returns for an accepted document, throws for a refused one. */
  readonly validate: (document: unknown) => unknown;
  readonly validatorOnly?: readonly ValidatorOnlyRule[];
  /** Documents to generate (default 1500). */
  readonly runs?: number;
  /** fast-check seed, so a failure replays. */
  readonly seed: number;
}

export interface Disagreement {
  readonly mutations: readonly string[];
  readonly schemaAccepts: boolean;
  readonly schemaErrors: string;
  readonly validatorError: string | null;
}

export interface AgreementResult {
  readonly documents: number;
  readonly bothAccept: number;
  readonly bothReject: number;
  /** Refused by the validator under a listed cross-field rule only. */
  readonly validatorOnly: number;
  readonly disagreements: readonly Disagreement[];
}

function compile(schema: object): (doc: unknown) => { ok: boolean; errors: string } {
  // `format: date-time` is declared known (the schemas' own `pattern` checks stamps) so ajv does not log.
  const options = { allErrors: false, strict: false, formats: { 'date-time': true } } as const;
  const draft2020 = String((schema as Schema).$schema ?? '').includes('2020-12');
  const ajv = draft2020 ? new Ajv2020(options) : new Ajv(options);
  const check = ajv.compile(schema);
  return (doc) => {
    const ok = check(doc) as boolean;
    return { ok, errors: ok ? '' : JSON.stringify(check.errors?.slice(0, 2)) };
  };
}

function resolveRef(root: Schema, s: Schema): Schema {
  const ref = s.$ref;
  if (typeof ref !== 'string' || !ref.startsWith('#/')) return s;
  let node: unknown = root;
  for (const part of ref.slice(2).split('/')) node = (node as Schema)[part];
  return resolveRef(root, node as Schema);
}

/** A schema with its $ref resolved and its oneOf/anyOf/allOf/if-then-else branches, flattened. */
function expand(root: Schema, s: Schema): Schema[] {
  const r = resolveRef(root, s);
  const out: Schema[] = [r];
  for (const key of ['oneOf', 'anyOf', 'allOf']) {
    const list = r[key];
    if (Array.isArray(list)) for (const b of list) out.push(...expand(root, b as Schema));
  }
  for (const key of ['then', 'else']) {
    const branch = r[key];
    if (typeof branch === 'object' && branch !== null) out.push(...expand(root, branch as Schema));
  }
  return out;
}

/** Every subschema that may apply at `path`. */
function subschemas(root: Schema, path: Path): Schema[] {
  let current = expand(root, root);
  for (const step of path) {
    const next: Schema[] = [];
    for (const s of current) {
      const child = typeof step === 'number' ? s.items : (s.properties as Schema | undefined)?.[step];
      if (typeof child === 'object' && child !== null && !Array.isArray(child)) {
        next.push(...expand(root, child as Schema));
      }
    }
    current = next;
  }
  return current;
}

function pathsOf(doc: Json, prefix: Path = []): Path[] {
  const out: Path[] = [prefix];
  if (Array.isArray(doc)) doc.forEach((v, i) => out.push(...pathsOf(v, [...prefix, i])));
  else if (doc !== null && typeof doc === 'object') {
    for (const [k, v] of Object.entries(doc)) out.push(...pathsOf(v, [...prefix, k]));
  }
  return out;
}

function getAt(doc: Json, path: Path): Json {
  let node: Json = doc;
  for (const step of path) node = (node as Record<string | number, Json>)[step] as Json;
  return node;
}

function label(path: Path): string {
  return path.map((p, i) => (typeof p === 'number' ? `[${p}]` : i === 0 ? p : `.${p}`)).join('') || '(root)';
}

/** Numbers worth trying at a numeric field: the schema's bounds, just inside and outside, and far away. */
function numberCandidates(schemas: readonly Schema[], value: number): number[] {
  const out = [0, -1, 1, -value, value * 1000, value / 1000, value + 0.5, 1e300, -1e300, 5e-324];
  for (const s of schemas) {
    for (const key of ['minimum', 'maximum', 'exclusiveMinimum', 'exclusiveMaximum']) {
      const b = s[key];
      if (typeof b !== 'number') continue;
      const ulp = Math.max(Math.abs(b) * 2 ** -52, 5e-324);
      out.push(b, b - ulp, b + ulp, b * (1 - 1e-9) - 1e-300, b * (1 + 1e-9) + 1e-300);
    }
  }
  return out;
}

/** A value inside the schema's numeric range (keeps a document valid where no other field depends on it). */
function inRange(schemas: readonly Schema[], value: number, u: number): number | undefined {
  let lo = -Infinity;
  let hi = Infinity;
  for (const s of schemas) {
    if (typeof s.minimum === 'number') lo = Math.max(lo, s.minimum);
    if (typeof s.exclusiveMinimum === 'number') lo = Math.max(lo, s.exclusiveMinimum);
    if (typeof s.maximum === 'number') hi = Math.min(hi, s.maximum);
    if (typeof s.exclusiveMaximum === 'number') hi = Math.min(hi, s.exclusiveMaximum);
  }
  if (schemas.some((s) => s.type === 'integer')) return undefined;
  // Scale the current value (same order of magnitude) and keep it strictly inside the bounds.
  const v = value === 0 ? u - 0.5 : value * (0.5 + u);
  return v > lo && v < hi ? v : undefined;
}

const STAMP_EDITS: readonly ((s: string) => string)[] = [
  (s) => s.replace(/Z$/, ''),
  (s) => s.replace(/Z$/, '+01:00'),
  (s) => s.replace(/:(\d\d)Z$/, ':60Z'),
  (s) => s.replace(/Z$/, '.123456789Z'),
  (s) => s.replace(/Z$/, '.1234567891Z'),
  (s) => s.replace('T', ' '),
  (s) => s.replace(/^(\d{4})-(\d\d)/, '$1-13'),
  (s) => s.replace(/-(\d\d)T/, '-32T'),
  (s) => s.replace(/T(\d\d)/, 'T24'),
  (s) => `${s.slice(0, 16)}Z`,
  (s) => s.replace(/^\d{4}/, '2030'),
  (s) => s.replace(/^\d{4}/, '1969'),
  (s) => s.replace(/T.*/, ''),
  (s) => s.replace(/Z$/, 'z'),
];

/** Kinds of mutation {@link mutate} knows (its switch). */
const MUTATION_KINDS = 7;

const OTHER_TYPES: readonly Json[] = [null, true, 'text', 0, 2.5, -7, [], {}, [1], { x: 1 }];

/** Applies one mutation chosen by `pick` and `choice` to `doc` (in place); returns its description, or undefined. */
function mutate(root: Schema, doc: Json, pick: number, kind: number, choice: number): string | undefined {
  const paths = pathsOf(doc);
  const path = paths[pick % paths.length] ?? [];
  if (path.length === 0) return undefined;
  const parentPath = path.slice(0, -1);
  const key = path[path.length - 1]!;
  const parent = getAt(doc, parentPath) as Record<string | number, Json>;
  const value = getAt(doc, path);
  const schemas = subschemas(root, path);
  const set = (v: Json, what: string): string => {
    parent[key] = structuredClone(v); // never share a candidate between documents
    return `${label(path)} ${what} ${JSON.stringify(v)?.slice(0, 80)}`;
  };
  const u = (choice % 1000) / 1000;
  switch (kind % MUTATION_KINDS) {
    case 0: {
      const others = OTHER_TYPES.filter(
        (t) =>
          typeof t !== typeof value || Array.isArray(t) !== Array.isArray(value) || (t === null) !== (value === null),
      );
      return set(others[choice % others.length] ?? null, '→ (other type)');
    }
    case 1:
      if (Array.isArray(parent)) {
        parent.splice(key as number, 1);
        return `${label(path)} removed from its array`;
      }
      delete parent[key];
      return `${label(path)} deleted`;
    case 2:
      if (typeof value === 'number') {
        const c = numberCandidates(schemas, value);
        return set(c[choice % c.length]!, '→');
      }
      if (typeof value === 'string') {
        const enums = schemas.flatMap((s) => [
          ...(Array.isArray(s.enum) ? s.enum : []),
          ...('const' in s ? [s.const] : []),
        ]);
        const strings: Json[] = ['', ' ', value.toUpperCase(), `${value}x`, ...(enums as Json[])];
        if (/^\d{4}-\d\d-\d\dT/.test(value)) strings.push(...STAMP_EDITS.map((f) => f(value)));
        return set(strings[choice % strings.length]!, '→');
      }
      if (Array.isArray(value)) {
        const variants: Json[] = [[], value.slice(1), [...value, ...value.slice(0, 1)], value.slice(0, 1)];
        return set(variants[choice % variants.length]!, '→ array of length');
      }
      return undefined;
    case 3:
      if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
        const keys = Object.keys(value);
        const k = keys[choice % Math.max(1, keys.length)];
        if (k !== undefined && choice % 2 === 0) {
          value[`${k.slice(0, -1)}${k.endsWith('s') ? 'z' : 's'}`] = value[k]!;
          delete value[k];
          return `${label(path)}.${k} misspelt`;
        }
        value.unknownField = 1;
        return `${label(path)} gets an unknown key`;
      }
      return undefined;
    case 4:
    case 5: {
      // Mostly valid edits: an in-range number, or a sibling value from the seed (keeps the shape).
      if (typeof value === 'number') {
        const v = inRange(schemas, value, u);
        return v === undefined ? undefined : set(v, '→ (in range)');
      }
      if (typeof value === 'boolean') return set(!value, '→');
      return undefined;
    }
    default: {
      // Replace with the same field of another seed-shaped subtree: swap two array elements.
      if (Array.isArray(parent) && parent.length > 1) {
        const j = choice % parent.length;
        const tmp = parent[j]!;
        parent[j] = parent[key as number]!;
        parent[key as number] = tmp;
        return `${label(path)} swapped with element ${j}`;
      }
      return undefined;
    }
  }
}

interface Verdict {
  ok: boolean;
  error: string | null;
  path: string;
}

function validatorVerdict(spec: SchemaAgreementSpec, doc: unknown): Verdict {
  try {
    spec.validate(doc);
    return { ok: true, error: null, path: '' };
  } catch (e) {
    if (!(e instanceof Error) || !('code' in e)) throw e; // only the SDK's own errors are an answer
    return { ok: false, error: `${e.name}: ${e.message}`, path: String((e as { argument?: unknown }).argument ?? '') };
  }
}

/** Generates `runs` documents from the seeds and returns every disagreement between the schema and the validator. */
export function findSchemaDisagreements(spec: SchemaAgreementSpec): AgreementResult {
  const root = spec.schema as Schema;
  const schemaCheck = compile(spec.schema);
  const seeds = spec.seeds.map((s) => JSON.parse(JSON.stringify(s)) as Json);
  seeds.forEach((s, i) => {
    const schema = schemaCheck(s);
    const v = validatorVerdict(spec, s);
    if (!schema.ok || !v.ok) {
      throw new Error(`${spec.name}: seed ${i} is not valid (schema ${schema.errors}; validator ${v.error})`);
    }
  });
  const step = fc.tuple(fc.nat(), fc.nat(), fc.nat());
  const arb = fc.record({
    seed: fc.nat({ max: seeds.length - 1 }),
    steps: fc.array(step, { minLength: 1, maxLength: 3 }),
  });
  const samples = fc.sample(arb, { seed: spec.seed, numRuns: spec.runs ?? 1500 });
  // Then every path of every seed once per mutation kind, so no path is left to chance (array items past the
  // second are skipped: a schema's `items` treats them alike, and the random part reaches them).
  for (const [seed, doc] of seeds.entries()) {
    for (const [pick, path] of pathsOf(doc).entries()) {
      if (path.some((step) => typeof step === 'number' && step > 1)) continue;
      for (let kind = 0; kind < MUTATION_KINDS; kind++) {
        samples.push({ seed, steps: [[pick, kind, pick]] });
      }
    }
  }
  let bothAccept = 0;
  let bothReject = 0;
  let validatorOnly = 0;
  const disagreements: Disagreement[] = [];
  for (const { seed, steps } of samples) {
    const doc = structuredClone(seeds[seed]!);
    const mutations: string[] = [];
    for (const [pick, kind, choice] of steps) {
      const m = mutate(root, doc, pick, kind, choice);
      if (m) mutations.push(m);
    }
    const schema = schemaCheck(doc);
    const v = validatorVerdict(spec, doc);
    if (schema.ok && v.ok) bothAccept++;
    else if (!schema.ok && !v.ok) bothReject++;
    else if (schema.ok && spec.validatorOnly?.some((r) => r.path.test(v.path) && r.message.test(v.error ?? ''))) {
      validatorOnly++;
    } else {
      disagreements.push({ mutations, schemaAccepts: schema.ok, schemaErrors: schema.errors, validatorError: v.error });
    }
  }
  return { documents: samples.length, bothAccept, bothReject, validatorOnly, disagreements };
}
