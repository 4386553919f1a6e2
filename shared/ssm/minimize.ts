/**
 * Derivative-free minimisers used by the likelihood fits (the engine's own and the timing analysis's noise search).
 */

/**
 * Nelder-Mead minimisation in two dimensions with the standard coefficients (reflection 1, expansion 2,
 * contraction 0.5, shrink 0.5), from a unit simplex at (a0, b0).
 * @param f - the function to minimise (may return Infinity where undefined)
 * @param a0 - start, first coordinate
 * @param b0 - start, second coordinate
 * @param tol - relative tolerance on the spread of the simplex values
 * @param maxEval - evaluation cap
 * @returns best point, its value and whether the tolerances (values and 1e-10 in size) were met
 * @see Nelder & Mead (1965), Computer J. 7:308-313
 */
export function nelderMead2(f: (a: number, b: number) => number, a0: number, b0: number, tol: number, maxEval: number) {
  const P = [[a0, b0], [a0 + 1, b0], [a0, b0 + 1]];
  const V = P.map((p) => f(p[0], p[1]));
  let evals = 3;
  let converged = false;
  while (evals < maxEval) {
    const idx = [0, 1, 2].sort((i, j) => V[i] - V[j]);
    const [b, m, w] = idx;
    const spreadF = Math.abs(V[w] - V[b]);
    const size = Math.max(Math.abs(P[w][0] - P[b][0]) + Math.abs(P[w][1] - P[b][1]), Math.abs(P[m][0] - P[b][0]) + Math.abs(P[m][1] - P[b][1]));
    if (spreadF <= tol * Math.max(1, Math.abs(V[b])) && size <= 1e-10) { converged = true; break; }
    if (size <= 1e-13) { converged = spreadF <= tol * Math.max(1, Math.abs(V[b])); break; }
    const c = [(P[b][0] + P[m][0]) / 2, (P[b][1] + P[m][1]) / 2];
    const pt = (t: number) => [c[0] + t * (P[w][0] - c[0]), c[1] + t * (P[w][1] - c[1])];
    const xr = pt(-1); const fr = f(xr[0], xr[1]); evals++;
    if (fr < V[b]) {
      const xe = pt(-2); const fe = f(xe[0], xe[1]); evals++;
      if (fe < fr) { P[w] = xe; V[w] = fe; } else { P[w] = xr; V[w] = fr; }
    } else if (fr < V[m]) {
      P[w] = xr; V[w] = fr;
    } else {
      const xc = fr < V[w] ? pt(-0.5) : pt(0.5);
      const fc = f(xc[0], xc[1]); evals++;
      if (fc < Math.min(fr, V[w])) { P[w] = xc; V[w] = fc; } else {
        for (const i of [m, w]) {
          P[i] = [(P[i][0] + P[b][0]) / 2, (P[i][1] + P[b][1]) / 2];
          V[i] = f(P[i][0], P[i][1]); evals++;
        }
      }
    }
  }
  let best = 0;
  for (let i = 1; i < 3; i++) if (V[i] < V[best]) best = i;
  return { x: P[best], fx: V[best], converged };
}

/**
 * Golden-section minimisation of a 1-D function: brackets a minimum from x0 by doubling steps, then
 * narrows the bracket to 1e-10.
 * @param f - the function to minimise
 * @param x0 - start
 * @param maxEval - evaluation cap
 * @returns best point, its value and whether the bracket reached 1e-10
 * @see Kiefer (1953), Proc. Amer. Math. Soc. 4:502-506 (pages from memory)
 */
export function golden1d(f: (x: number) => number, x0: number, maxEval: number) {
  let step = 1;
  let a = x0 - step, b = x0 + step;
  let fa = f(a), fx = f(x0), fb = f(b);
  let evals = 3;
  // widen until x0 region is a bracket (fa >= fx <= fb)
  let mid = x0;
  while ((fa < fx || fb < fx) && evals < maxEval) {
    if (fa < fx) { b = mid; fb = fx; mid = a; fx = fa; step *= 2; a = mid - step; fa = f(a); }
    else { a = mid; fa = fx; mid = b; fx = fb; step *= 2; b = mid + step; fb = f(b); }
    evals++;
  }
  const gr = (Math.sqrt(5) - 1) / 2;
  let c = b - gr * (b - a), d = a + gr * (b - a);
  let fc = f(c), fd = f(d);
  evals += 2;
  while (b - a > 1e-10 && evals < maxEval) {
    if (fc < fd) { b = d; d = c; fd = fc; c = b - gr * (b - a); fc = f(c); }
    else { a = c; c = d; fc = fd; d = a + gr * (b - a); fd = f(d); }
    evals++;
  }
  const x = fc < fd ? c : d;
  return { x, fx: Math.min(fc, fd), converged: b - a <= 1e-10 };
}
