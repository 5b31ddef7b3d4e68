/**
 * Solves L x = b for the weighted graph Laplacian L of an edge list
 * (L_ii = sum of the weights at i, L_ij = -weight of edge ij) by conjugate
 * gradients with a diagonal (Jacobi) preconditioner. L is symmetric positive
 * semidefinite with the constants on each connected component as its null
 * space, so b is first made to sum to zero over the nodes that have edges,
 * and x is returned with mean zero over them (the gauge); nodes without
 * edges get 0. Assumes the nodes with edges form one component, as the
 * cells of a tiling of a convex region do.
 */
export function solveLaplacian(
  n: number, pairs: Int32Array, coef: Float64Array, b: Float64Array, relTol: number, maxIter: number,
): Float64Array {
  const m = coef.length;
  const diag = new Float64Array(n);
  for (let e = 0; e < m; e++) { diag[pairs[2 * e]] += coef[e]; diag[pairs[2 * e + 1]] += coef[e]; }
  let active = 0, mean = 0;
  for (let i = 0; i < n; i++) if (diag[i] > 0) { active++; mean += b[i]; }
  const x = new Float64Array(n);
  if (active === 0) return x;
  mean /= active;
  const r = new Float64Array(n), z = new Float64Array(n), p = new Float64Array(n), q = new Float64Array(n);
  let rr0 = 0;
  for (let i = 0; i < n; i++) if (diag[i] > 0) { r[i] = b[i] - mean; rr0 += r[i] * r[i]; }
  const stop = relTol * relTol * rr0;
  let rz = 0;
  for (let i = 0; i < n; i++) if (diag[i] > 0) { z[i] = r[i] / diag[i]; p[i] = z[i]; rz += r[i] * z[i]; }
  let rr = rr0;
  for (let it = 0; it < maxIter && rr > stop; it++) {
    q.fill(0);
    for (let e = 0; e < m; e++) {
      const a = pairs[2 * e], c = pairs[2 * e + 1], f = coef[e] * (p[a] - p[c]);
      q[a] += f; q[c] -= f;
    }
    let pq = 0;
    for (let i = 0; i < n; i++) pq += p[i] * q[i];
    if (!(pq > 0)) break;
    const alpha = rz / pq;
    let rzNext = 0;
    rr = 0;
    for (let i = 0; i < n; i++) {
      if (diag[i] === 0) continue;
      x[i] += alpha * p[i];
      r[i] -= alpha * q[i];
      z[i] = r[i] / diag[i];
      rzNext += r[i] * z[i];
      rr += r[i] * r[i];
    }
    const beta = rzNext / rz;
    rz = rzNext;
    for (let i = 0; i < n; i++) if (diag[i] > 0) p[i] = z[i] + beta * p[i];
  }
  let xm = 0;
  for (let i = 0; i < n; i++) if (diag[i] > 0) xm += x[i];
  xm /= active;
  for (let i = 0; i < n; i++) if (diag[i] > 0) x[i] -= xm;
  return x;
}

/**
 * The edge weights of the Laplacian of power-cell sizes: l_ij / (2 |s_i - s_j|)
 * for cells sharing an edge of length l_ij (how fast area crosses that edge
 * per unit of weight), times `density(a, b)` when sizes are masses.
 */
export function radicalCoefficients(
  sites: Float64Array, pairs: Int32Array, lengths: Float64Array, density?: (a: number, b: number) => number,
): Float64Array {
  const coef = new Float64Array(lengths.length);
  for (let e = 0; e < lengths.length; e++) {
    const a = pairs[2 * e], b = pairs[2 * e + 1];
    coef[e] = lengths[e] / (2 * Math.hypot(sites[2 * a] - sites[2 * b], sites[2 * a + 1] - sites[2 * b + 1]));
    if (density) coef[e] *= density(a, b);
  }
  return coef;
}
