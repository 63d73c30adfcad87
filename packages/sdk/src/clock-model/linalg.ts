/**
 * Small dense linear algebra for the clock models (matrices of order ≤ 3 plus tall design
 * matrices). Row-major nested arrays; every function returns new arrays.
 *
 * @internal
 */

/** A dense matrix as rows of numbers. */
export type Matrix = number[][];

/** n × n zero matrix. */
export function zeros(n: number, m = n): Matrix {
  return Array.from({ length: n }, () => new Array<number>(m).fill(0));
}

/** n × n identity. */
export function identity(n: number): Matrix {
  const out = zeros(n);
  for (let i = 0; i < n; i++) out[i]![i] = 1;
  return out;
}

/** Deep copy. */
export function copyMatrix(a: readonly (readonly number[])[]): Matrix {
  return a.map((row) => row.slice());
}

/** A·B. */
export function multiply(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix {
  const n = a.length;
  const k = b.length;
  const m = b[0]!.length;
  const out = zeros(n, m);
  for (let i = 0; i < n; i++) {
    const ai = a[i]!;
    const oi = out[i]!;
    for (let p = 0; p < k; p++) {
      const aip = ai[p]!;
      if (aip === 0) continue;
      const bp = b[p]!;
      for (let j = 0; j < m; j++) oi[j] = oi[j]! + aip * bp[j]!;
    }
  }
  return out;
}

/** Aᵀ. */
export function transpose(a: readonly (readonly number[])[]): Matrix {
  const n = a.length;
  const m = a[0]!.length;
  const out = zeros(m, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < m; j++) out[j]![i] = a[i]![j]!;
  return out;
}

/** A·v. */
export function multiplyVector(a: readonly (readonly number[])[], v: readonly number[]): number[] {
  return a.map((row) => {
    let s = 0;
    for (let j = 0; j < row.length; j++) s += row[j]! * v[j]!;
    return s;
  });
}

/** A·P·Aᵀ, symmetrised. */
export function congruence(a: readonly (readonly number[])[], p: readonly (readonly number[])[]): Matrix {
  return symmetrize(multiply(multiply(a, p), transpose(a)));
}

/** (A + Aᵀ)/2. */
export function symmetrize(a: Matrix): Matrix {
  const n = a.length;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const v = 0.5 * (a[i]![j]! + a[j]![i]!);
      a[i]![j] = v;
      a[j]![i] = v;
    }
  }
  return a;
}

/** A + B. */
export function add(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix {
  return a.map((row, i) => row.map((v, j) => v + b[i]![j]!));
}

/**
 * Cholesky factor L (lower triangular, A = L·Lᵀ) of a symmetric matrix, or `undefined` when a pivot
 * is not positive (Golub & Van Loan, Matrix Computations 4th ed., Alg. 4.2.1 [M]). Zero pivots are
 * accepted (positive semi-definite) when `allowSemidefinite`: the column is then set to zero.
 */
export function cholesky(a: readonly (readonly number[])[], allowSemidefinite = false): Matrix | undefined {
  const n = a.length;
  const l = zeros(n);
  for (let j = 0; j < n; j++) {
    const lj = l[j]!;
    let d = a[j]![j]!;
    for (let k = 0; k < j; k++) d -= lj[k]! ** 2;
    const scale = Math.abs(a[j]![j]!);
    if (!(d > 1e-14 * scale)) {
      if (allowSemidefinite && d >= -1e-12 * scale) {
        lj[j] = 0;
        continue;
      }
      return undefined;
    }
    const ljj = Math.sqrt(d);
    lj[j] = ljj;
    for (let i = j + 1; i < n; i++) {
      const li = l[i]!;
      let s = a[i]![j]!;
      for (let k = 0; k < j; k++) s -= li[k]! * lj[k]!;
      li[j] = s / ljj;
    }
  }
  return l;
}

/**
 * Inverse of a symmetric positive-definite matrix through its Cholesky factor; `undefined` if
 * the matrix is not positive definite.
 */
export function inverseSpd(a: readonly (readonly number[])[]): Matrix | undefined {
  const n = a.length;
  const l = cholesky(a);
  if (!l) return undefined;
  // inv(L) by forward substitution, then inv(A) = inv(L)ᵀ inv(L).
  const li = zeros(n);
  for (let j = 0; j < n; j++) {
    li[j]![j] = 1 / l[j]![j]!;
    for (let i = j + 1; i < n; i++) {
      let s = 0;
      for (let k = j; k < i; k++) s -= l[i]![k]! * li[k]![j]!;
      li[i]![j] = s / l[i]![i]!;
    }
  }
  return symmetrize(multiply(transpose(li), li));
}
