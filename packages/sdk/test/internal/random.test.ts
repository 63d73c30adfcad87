import { describe, expect, it } from 'vitest';
import { createRandom, type NormalMethod } from '../../src/internal/random.js';
import { normalCdf } from '../../src/internal/special-functions.js';

describe('createRandom(seed)', () => {
  it('is reproducible for a seed and differs between seeds', () => {
    const a = createRandom(42),
      b = createRandom(42),
      c = createRandom(43);
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
    let su = 0,
      su2 = 0,
      sn = 0,
      sn2 = 0,
      sn4 = 0;
    for (let i = 0; i < n; i++) {
      const u = r.uniform();
      expect(u > 0 && u < 1).toBe(true);
      su += u;
      su2 += u * u;
      const z = r.normal();
      sn += z;
      sn2 += z * z;
      sn4 += z ** 4;
    }
    expect(Math.abs(su / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(su2 / n - 1 / 3)).toBeLessThan(5 * Math.sqrt((1 / 5 - 1 / 9) / n));
    expect(Math.abs(sn / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sn2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    // Normal kurtosis: E[z⁴] = 3 (standard property of the Gaussian).
    expect(Math.abs(sn4 / n - 3)).toBeLessThan(5 * Math.sqrt(96 / n));
  });
});

describe('createRandom(seed, method)', () => {
  it('createRandom(seed) keeps the polar stream the committed fixtures were made with (regression pin of the first draws, seed 20261202)', () => {
    const r = createRandom(20261202);
    const draws = [r.uniform(), r.uniform(), r.uniform(), r.normal(), r.normal(), r.normal()];
    expect(draws).toEqual([
      0.08774911181535572, 0.19129661528859288, 0.8677619084483013, 2.8763057806956547, -0.5430388612464208,
      -0.05510473638873007,
    ]);
  });

  const methods: NormalMethod[] = ['polar', 'ziggurat'];

  it.each(methods)(
    'createRandom(seed, %s) normals have the moments of N(0, 1) within 5 standard errors over 10^6 draws (mean 0, variance 1, skewness 0, E[z⁴] = 3)',
    (method) => {
      const r = createRandom(77, method);
      const n = 1_000_000;
      let s1 = 0,
        s2 = 0,
        s3 = 0,
        s4 = 0;
      for (let i = 0; i < n; i++) {
        const z = r.normal();
        s1 += z;
        s2 += z * z;
        s3 += z ** 3;
        s4 += z ** 4;
      }
      expect(Math.abs(s1 / n)).toBeLessThan(5 / Math.sqrt(n));
      expect(Math.abs(s2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
      expect(Math.abs(s3 / n)).toBeLessThan(5 * Math.sqrt(15 / n));
      expect(Math.abs(s4 / n - 3)).toBeLessThan(5 * Math.sqrt(96 / n));
    },
  );

  it.each(methods)(
    'createRandom(seed, %s) normals pass a Kolmogorov–Smirnov test against the normal CDF at the 0.1 percent level (n = 200 000; critical value √(−ln(α/2)/2)/√n = 1.9495/√n, the Smirnov asymptotic distribution [C])',
    (method) => {
      const r = createRandom(4242, method);
      const n = 200_000;
      const z = new Float64Array(n);
      for (let i = 0; i < n; i++) z[i] = r.normal();
      z.sort();
      let d = 0;
      for (let i = 0; i < n; i++) {
        const f = normalCdf(z[i]!);
        d = Math.max(d, (i + 1) / n - f, f - i / n);
      }
      expect(d).toBeLessThan(1.9495 / Math.sqrt(n));
    },
  );

  it.each(methods)(
    'createRandom(seed, %s) puts the N(0, 1) share of draws beyond ±1, ±2, ±3 and ±3.4426 (the ziggurat base strip) within 5 binomial standard errors',
    (method) => {
      const r = createRandom(9001, method);
      const n = 2_000_000;
      const edges = [1, 2, 3, 3.442619855899];
      const counts = edges.map(() => 0);
      for (let i = 0; i < n; i++) {
        const a = Math.abs(r.normal());
        for (let k = 0; k < edges.length; k++) if (a > edges[k]!) counts[k]!++;
      }
      edges.forEach((edge, k) => {
        const p = 2 * (1 - normalCdf(edge));
        expect(Math.abs(counts[k]! / n - p)).toBeLessThan(5 * Math.sqrt((p * (1 - p)) / n));
      });
    },
  );

  it('createRandom(seed, "ziggurat") is reproducible for a seed and shares the uniform stream of the polar method', () => {
    const a = createRandom(5, 'ziggurat'),
      b = createRandom(5, 'ziggurat'),
      p = createRandom(5);
    const xs = Array.from({ length: 1000 }, () => a.normal());
    expect(Array.from({ length: 1000 }, () => b.normal())).toEqual(xs);
    expect(createRandom(5, 'ziggurat').uniform()).toBe(p.uniform());
  });
});
