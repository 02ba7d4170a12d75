/**
 * Cholesky factor L (lower triangular, row-major) of a symmetric positive-definite matrix, A = L L^T (Golub & Van
 * Loan, Matrix Computations, algorithm 4.2.1). Returns null when A is not positive definite.
 */
export function choleskyLower(a: readonly (readonly number[])[]): number[][] | null {
  const n = a.length;
  const l = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    let d = a[j][j];
    for (let k = 0; k < j; k++) d -= l[j][k] * l[j][k];
    if (!(d > 0)) return null;
    const ljj = Math.sqrt(d);
    l[j][j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = a[i][j];
      for (let k = 0; k < j; k++) s -= l[i][k] * l[j][k];
      l[i][j] = s / ljj;
    }
  }
  return l;
}
