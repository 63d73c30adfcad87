/**
 * Provenance of the citations in the SDK sources, counted mechanically so that the READMEs say
 * honestly how much of the sourcing was verified. A citation tag is a bracket whose first token is
 * V1, V2, M or C: `[V1]`, `[M section]`, `[V2 abstract]`, `[M, BDS-SIS-ICD §3.3]`,
 * `[M section; reproduced against SP 1065 test data, C]` (counted by its first token, here M).
 * Legend: packages/sdk/docs/physics-refs.md (V1 primary text read, V2 secondary source, C computed
 * independently, M from memory).
 *
 * After adding or changing tags, regenerate the list and counts with
 *   PROVENANCE_WRITE=1 npx vitest run test/cross/provenance.test.ts
 * and copy the printed sentence into README.md and packages/sdk/README.md if the test says so.
 */
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const SRC = join(ROOT, 'packages/sdk/src');
const LIST = join(ROOT, 'packages/sdk/docs/provenance.md');
const TAG = /\[(V1|V2|M|C)(?=[\]\s,;])[^\]\n]*\]/g;
type Tag = 'V1' | 'V2' | 'M' | 'C';

interface Citation {
  readonly file: string;
  readonly tag: Tag;
  readonly text: string;
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true })
    .flatMap((e) =>
      e.isDirectory() ? sourceFiles(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : [],
    )
    .sort();
}

function citations(): Citation[] {
  const out: Citation[] = [];
  for (const path of sourceFiles(SRC)) {
    const file = relative(ROOT, path).split('\\').join('/');
    for (const line of readFileSync(path, 'utf8').split('\n')) {
      for (const match of line.matchAll(TAG)) {
        out.push({
          file,
          tag: match[1] as Tag,
          text: line
            .trim()
            .replace(/^(\/\*\*|\/\/|\*)\s?/, '')
            .trim(),
        });
      }
    }
  }
  return out;
}

function summary(list: readonly Citation[]): string {
  const n = (t: Tag) => list.filter((c) => c.tag === t).length;
  return (
    `${list.length} provenance tags in the SDK sources: ${n('V1')} [V1] read in the primary text, ` +
    `${n('V2')} [V2] read only in a secondary source, ${n('C')} [C] computed independently, ${n('M')} [M] from memory`
  );
}

function listDocument(list: readonly Citation[]): string {
  const lines = [
    "# Provenance of the SDK's citations",
    '',
    'Generated from the tags in `packages/sdk/src` by `test/cross/provenance.test.ts` (which also keeps the',
    'counts in the READMEs in step). Tags: **[V1]** read in the primary text, **[V2]** read only in a secondary',
    'source, **[C]** computed independently, **[M]** from memory, not verified (legend: [physics-refs.md](physics-refs.md)).',
    'A bracket is counted by its first token, so `[M section; reproduced …, C]` counts as [M]: the section',
    'number is from memory even where the values were reproduced.',
    '',
    `Counts: ${summary(list)}.`,
    '',
    '## Citations from memory ([M])',
    '',
    'Each line is the source line that carries the tag. These are leads, not verified references; where a test',
    'checks the same value against an independent computation, the line says so ([C]).',
  ];
  let current = '';
  for (const c of list.filter((x) => x.tag === 'M')) {
    if (c.file !== current) {
      current = c.file;
      lines.push('', `### \`${c.file}\``, '');
    }
    lines.push(`- ${c.text.replace(/\|/g, '\\|')}`);
  }
  return `${lines.join('\n')}\n`;
}

describe('provenance counts of the SDK citations', () => {
  const list = citations();
  const expected = summary(list);
  const document = listDocument(list);
  if (process.env.PROVENANCE_WRITE === '1') writeFileSync(LIST, document);

  it('README.md and packages/sdk/README.md state the tag counts found in packages/sdk/src (counted here)', () => {
    for (const readme of ['README.md', 'packages/sdk/README.md']) {
      const text = readFileSync(join(ROOT, readme), 'utf8').replace(/\s+/g, ' ');
      expect(text.includes(expected), `${readme} should contain: "${expected}"`).toBe(true);
    }
  });

  it('packages/sdk/docs/provenance.md lists every [M] citation and the counts (regenerate with PROVENANCE_WRITE=1)', () => {
    expect(readFileSync(LIST, 'utf8')).toBe(document);
  });
});
