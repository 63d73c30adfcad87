// The built @tauline/elements entry must register every element: its `*.define` modules are side
// effects, which a bundler drops if the package's "sideEffects" list does not cover the files it
// builds from. (`npm test` builds before this suite runs.)
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const dist = new URL('../../packages/elements/dist/', import.meta.url);
const TAGS = ['steering-schedule', 'rate-budget', 'stability-plot', 'review-findings'];

describe('@tauline/elements build', () => {
  it('dist/index.js imports the define module of every element', () => {
    const index = readFileSync(new URL('index.js', dist), 'utf8');
    for (const tag of TAGS) expect(index, tag).toContain(`import './${tag}/${tag}.define.js';`);
  });
  it('each define module registers its tag', () => {
    for (const tag of TAGS) {
      const define = readFileSync(new URL(`${tag}/${tag}.define.js`, dist), 'utf8');
      expect(define, tag).toContain(`customElements.define('tauline-${tag}'`);
    }
  });
});
