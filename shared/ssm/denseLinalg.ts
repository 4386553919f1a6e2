/**
 * Small dense linear-algebra kernels on row-major Float64Array blocks, used inside the state-space
 * engine. Every routine works in place on caller-provided storage (with an offset where a block lives
 * inside a larger per-step array) so the filter and smoother allocate nothing per sample.
 *
 * Internal to `shared/ssm/`; not re-exported by the index.
 */

/**
 * Cholesky factorisation A = L L' of the k x k symmetric matrix stored at `a[aOff...]`, writing the
 * lower factor (upper part zeroed) into `l[0 .. k*k)`.
 * @returns true when A is numerically positive definite (every pivot > 0 and finite), false otherwise.
 */
export function choleskyLower(a: Float64Array, aOff: number, k: number, l: Float64Array): boolean {
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[aOff + i * k + j];
      for (let p = 0; p < j; p++) s -= l[i * k + p] * l[j * k + p];
      if (i === j) {
        if (!(s > 0) || !Number.isFinite(s)) return false;
        l[i * k + i] = Math.sqrt(s);
      } else {
        l[i * k + j] = s / l[j * k + j];
      }
    }
    for (let j = i + 1; j < k; j++) l[i * k + j] = 0;
  }
  return true;
}

/**
 * Solves (L L') X = B in place for X, where L is the k x k lower Cholesky factor and B is k x c
 * (row-major, `b[0 .. k*c)`): forward then backward substitution, no explicit inverse.
 */
export function choleskySolveInPlace(l: Float64Array, k: number, b: Float64Array, c: number): void {
  // L Y = B
  for (let col = 0; col < c; col++) {
    for (let i = 0; i < k; i++) {
      let s = b[i * c + col];
      for (let p = 0; p < i; p++) s -= l[i * k + p] * b[p * c + col];
      b[i * c + col] = s / l[i * k + i];
    }
    // L' X = Y
    for (let i = k - 1; i >= 0; i--) {
      let s = b[i * c + col];
      for (let p = i + 1; p < k; p++) s -= l[p * k + i] * b[p * c + col];
      b[i * c + col] = s / l[i * k + i];
    }
  }
}

/** Sum of log of the diagonal of L, times two: log det(L L'). */
export function logDetFromCholesky(l: Float64Array, k: number): number {
  let s = 0;
  for (let i = 0; i < k; i++) s += Math.log(l[i * k + i]);
  return 2 * s;
}

/** Replaces the n x n block at `a[off...]` by (A + A')/2. */
export function symmetrize(a: Float64Array, off: number, n: number): void {
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const s = 0.5 * (a[off + i * n + j] + a[off + j * n + i]);
      a[off + i * n + j] = s;
      a[off + j * n + i] = s;
    }
  }
}

/** out = A B with A r x q at `a[aOff]`, B q x c at `b[bOff]`, out r x c at `out[oOff]` (out must not alias). */
export function matMul(
  a: Float64Array, aOff: number, b: Float64Array, bOff: number,
  out: Float64Array, oOff: number, r: number, q: number, c: number,
): void {
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < c; j++) {
      let s = 0;
      for (let p = 0; p < q; p++) s += a[aOff + i * q + p] * b[bOff + p * c + j];
      out[oOff + i * c + j] = s;
    }
  }
}

/** out = A B' with A r x q at `a[aOff]`, B c x q at `b[bOff]`, out r x c at `out[oOff]` (out must not alias). */
export function matMulTransB(
  a: Float64Array, aOff: number, b: Float64Array, bOff: number,
  out: Float64Array, oOff: number, r: number, q: number, c: number,
): void {
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < c; j++) {
      let s = 0;
      for (let p = 0; p < q; p++) s += a[aOff + i * q + p] * b[bOff + j * q + p];
      out[oOff + i * c + j] = s;
    }
  }
}
