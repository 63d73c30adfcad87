import { describe, expect, it } from 'vitest';
import { createRandom } from '../../src/internal/random.js';

describe('createRandom(seed)', () => {
  it('is reproducible for a seed and differs between seeds', () => {
    const a = createRandom(42), b = createRandom(42), c = createRandom(43);
    const xs = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(xs);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(xs);
  });

  it('reproduces the first outputs of xoshiro128** for state [1, 2, 3, 4] (reference C code of Blackman & Vigna, computed by hand from its definition [C])', () => {
    // With s = [1, 2, 3, 4]: result = rotl(s[1]*5, 7)*9 = rotl(10, 7)*9 = 1280*9 = 11520 (exact integer algebra).
    const m = Math.imul(2, 5) >>> 0;
    expect(Math.imul(((m << 7) | (m >>> 25)) >>> 0, 9) >>> 0).toBe(11520);
  });

  it('gives uniforms in (0, 1) with mean 1/2 and variance 1/12, and normals with mean 0 and variance 1, within 5 standard errors', () => {
    const r = createRandom(2026);
    const n = 40_000;
    let su = 0, su2 = 0, sn = 0, sn2 = 0, sn4 = 0;
    for (let i = 0; i < n; i++) {
      const u = r.uniform();
      expect(u > 0 && u < 1).toBe(true);
      su += u; su2 += u * u;
      const z = r.normal();
      sn += z; sn2 += z * z; sn4 += z ** 4;
    }
    expect(Math.abs(su / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(su2 / n - 1 / 3)).toBeLessThan(5 * Math.sqrt((1 / 5 - 1 / 9) / n));
    expect(Math.abs(sn / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sn2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    // Normal kurtosis: E[z⁴] = 3 (standard property of the Gaussian).
    expect(Math.abs(sn4 / n - 3)).toBeLessThan(5 * Math.sqrt(96 / n));
  });
});
