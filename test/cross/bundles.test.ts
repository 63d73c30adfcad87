// The one-file bundles for pages without a bundler (scripts/build-bundles.mjs, run by `npm run build`,
// which `npm test` runs before this suite): self-contained, minified, with source maps, their gzip
// sizes as stated in the package READMEs; and the README quotes of the embedding examples are the
// example files themselves (the browser suite loads those files from a static server).
import { existsSync, readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';

const ROOT = new URL('../../', import.meta.url);
const read = (path: string): string => readFileSync(new URL(path, ROOT), 'utf8');

const BUNDLES = [
  {
    file: 'packages/elements/dist/bundle/tauline-elements.js',
    readme: 'packages/elements/README.md',
    exportKey: './bundle',
    manifest: 'packages/elements/package.json',
  },
  {
    file: 'packages/sdk/dist/bundle/tauline-sdk.js',
    readme: 'packages/sdk/README.md',
    exportKey: './bundle',
    manifest: 'packages/sdk/package.json',
  },
];

/** Stated sizes may drift by this fraction before the README must be updated (common practice, no source). */
const SIZE_TOLERANCE = 0.1;

/** The README's statement "Size of `<name>`: N KiB minified, M KiB gzipped" for a bundle file name. */
function statedSizes(readme: string, name: string): { minified: number; gzipped: number } {
  const text = readme.replace(/\s+/g, ' ');
  const m = new RegExp(`Size of \`${name.replace('.', '\\.')}\`: ([\\d.]+) KiB minified, ([\\d.]+) KiB gzipped`).exec(
    text,
  );
  expect(m, `README states the size of ${name}`).not.toBeNull();
  return { minified: Number(m![1]), gzipped: Number(m![2]) };
}

describe('one-file bundles (@tauline/elements/bundle, @tauline/sdk/bundle)', () => {
  for (const b of BUNDLES) {
    const name = b.file.split('/').pop()!;
    it(`${name} is exported as ${b.exportKey}, minified, self-contained (no bare imports) and has a source map`, () => {
      const manifest = JSON.parse(read(b.manifest)) as { exports: Record<string, { import: string }> };
      expect(manifest.exports[b.exportKey]!.import).toBe(`./${b.file.split('/').slice(2).join('/')}`);
      const code = read(b.file);
      // Minified: long lines (multi-line template literals keep their line breaks). Self-contained: no
      // static or dynamic import statement is left (everything is inlined). Booleans keep failures short.
      expect(code.length / code.split('\n').length, 'average line length').toBeGreaterThan(150);
      expect(/(^|[;}\n])\s*import\s*(["'{*]|[\w$]+\s*from)/.test(code), 'a static import is left').toBe(false);
      expect(/\bimport\s*\(/.test(code), 'a dynamic import is left').toBe(false);
      expect(code.trimEnd().endsWith(`//# sourceMappingURL=${name}.map`)).toBe(true);
      const map = JSON.parse(read(`${b.file}.map`)) as { version: number; sources: string[] };
      expect(map.version).toBe(3);
      expect(map.sources.some((s) => s.endsWith('.ts'))).toBe(true);
    });
    it(`${b.readme} states the gzip size of ${name} within ${SIZE_TOLERANCE * 100} % of the built file`, () => {
      const bytes = readFileSync(new URL(b.file, ROOT));
      const stated = statedSizes(read(b.readme), name);
      const gzipped = gzipSync(bytes, { level: 9 }).length / 1024;
      const minified = bytes.length / 1024;
      expect(
        Math.abs(gzipped - stated.gzipped) / gzipped,
        `built: ${gzipped.toFixed(1)} KiB gzipped`,
      ).toBeLessThanOrEqual(SIZE_TOLERANCE);
      expect(
        Math.abs(minified - stated.minified) / minified,
        `built: ${minified.toFixed(0)} KiB minified`,
      ).toBeLessThanOrEqual(SIZE_TOLERANCE);
    });
  }

  it('tauline-elements.js registers the five tags and inlines Lit', () => {
    const code = read('packages/elements/dist/bundle/tauline-elements.js');
    for (const tag of ['steering-schedule', 'rate-budget', 'stability-plot', 'review-findings', 'fleet-timeline'])
      expect(code.includes(`"tauline-${tag}"`), tag).toBe(true);
    expect(code.includes('adoptedStyleSheets'), "Lit's reactive-element inlined").toBe(true);
  });
});

describe('README quotes of the embedding examples', () => {
  const QUOTES = [
    ['README.md', 'packages/elements/examples/plain.html'],
    ['packages/elements/README.md', 'packages/elements/examples/plain.html'],
    ['packages/elements/README.md', 'packages/elements/examples/import-map.html'],
  ] as const;
  for (const [readme, example] of QUOTES) {
    it(`${readme} quotes ${example} exactly, after its "quote:" marker`, () => {
      const text = read(readme);
      const marker = `<!-- quote: ${example} -->\n\`\`\`html\n`;
      const at = text.indexOf(marker);
      expect(at, 'marker followed by an html block').toBeGreaterThanOrEqual(0);
      const body = text.slice(at + marker.length, text.indexOf('```', at + marker.length));
      expect(body).toBe(read(example));
      expect(existsSync(new URL(example, ROOT))).toBe(true);
    });
  }
});
