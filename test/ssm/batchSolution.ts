/**
 * Dense batch least-squares (maximum a posteriori) solution of the stacked linear-Gaussian system,
 * built with ml-matrix: the reference the RTS smoother must equal (a mathematical identity; see
 * shared/reference/FACTS.md, "RTS smoother on a linear-Gaussian model equals the batch least-squares
 * solution of the stacked system").
 *
 * Unknowns X = [x_0; ...; x_{T-1}]. Minimise
 *   |x_0 - x0|^2_{P0^-1} + sum_k |x_k - F_k x_{k-1} - u_k|^2_{Q_k^-1} + sum_k |z_k - H x_k|^2_{R^-1} (observed rows).
 * Normal equations J X = b; the posterior covariance is J^-1.
 */
import { Matrix, inverse } from 'ml-matrix';
import type { StateSpaceModel } from '../../shared/ssm/stateSpaceModel';

export function batchSolution(model: StateSpaceModel, z: Float64Array, timesS: Float64Array): { x: Float64Array; cov: Matrix } {
  const { n, m } = model;
  const T = timesS.length;
  const N = T * n;
  const J = Matrix.zeros(N, N);
  const b = Matrix.zeros(N, 1);
  const addBlock = (r0: number, c0: number, M: Matrix, sign = 1): void => {
    for (let i = 0; i < M.rows; i++) for (let j = 0; j < M.columns; j++) J.set(r0 + i, c0 + j, J.get(r0 + i, c0 + j) + sign * M.get(i, j));
  };
  const addRhs = (r0: number, v: Matrix, sign = 1): void => {
    for (let i = 0; i < v.rows; i++) b.set(r0 + i, 0, b.get(r0 + i, 0) + sign * v.get(i, 0));
  };
  const mat = (a: ArrayLike<number>, r: number, c: number): Matrix => {
    const M = new Matrix(r, c);
    for (let i = 0; i < r; i++) for (let j = 0; j < c; j++) M.set(i, j, a[i * c + j]);
    return M;
  };
  // prior
  const P0i = inverse(mat(model.P0, n, n));
  addBlock(0, 0, P0i);
  addRhs(0, P0i.mmul(mat(model.x0, n, 1)));
  // dynamics
  const F = new Float64Array(n * n), u = new Float64Array(n), Q = new Float64Array(n * n);
  for (let k = 1; k < T; k++) {
    model.discretize(timesS[k] - timesS[k - 1], F, u, Q);
    const Fm = mat(F, n, n), um = mat(u, n, 1), Qi = inverse(mat(Q, n, n));
    const FtQi = Fm.transpose().mmul(Qi);
    addBlock(k * n, k * n, Qi);
    addBlock((k - 1) * n, (k - 1) * n, FtQi.mmul(Fm));
    addBlock(k * n, (k - 1) * n, Qi.mmul(Fm), -1);
    addBlock((k - 1) * n, k * n, FtQi, -1);
    addRhs(k * n, Qi.mmul(um));
    addRhs((k - 1) * n, FtQi.mmul(um), -1);
  }
  // observations (observed components only)
  for (let k = 0; k < T; k++) {
    const obs: number[] = [];
    for (let a = 0; a < m; a++) if (!Number.isNaN(z[k * m + a])) obs.push(a);
    if (obs.length === 0) continue;
    const d = obs.length;
    const Hs = new Matrix(d, n), Rs = new Matrix(d, d), zs = new Matrix(d, 1);
    obs.forEach((ra, i) => {
      for (let j = 0; j < n; j++) Hs.set(i, j, model.H[ra * n + j]);
      obs.forEach((rb, j) => Rs.set(i, j, model.R[ra * m + rb]));
      zs.set(i, 0, z[k * m + ra]);
    });
    const HtRi = Hs.transpose().mmul(inverse(Rs));
    addBlock(k * n, k * n, HtRi.mmul(Hs));
    addRhs(k * n, HtRi.mmul(zs));
  }
  const cov = inverse(J);
  const x = cov.mmul(b).getColumn(0);
  return { x: Float64Array.from(x), cov };
}
