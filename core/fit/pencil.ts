// Matrix pencil estimate of the poles of a sum of damped exponentials (Hua and Sarkar, IEEE Trans. ASSP 38(5), 1990).

import { EigenvalueDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';

export interface Pole {
  /** ln|z| per sample (negative for decay). */
  re: number;
  /** arg z per sample, rad, in (-pi, pi]. */
  im: number;
}

/**
 * Poles (per sample) of `modes` damped exponentials fitted to uniformly sampled y, by the
 * total-least-squares pencil with pencil parameter L = N/3 and rank truncation to `modes`.
 */
export function matrixPencil(y: ArrayLike<number>, modes: number): Pole[] {
  const n = y.length;
  // A constant sequence has no poles to find, and ml-matrix's SVD can loop forever on its rank-one
  // Hankel matrix (seen with 63 samples of 12.4); a ramp's differences are such a sequence.
  if (isConstant(y)) return [];
  const pencil = Math.max(modes, Math.floor(n / 3));
  const rows = n - pencil;
  if (rows <= modes) return [];
  const hankel = new Matrix(rows, pencil + 1);
  for (let i = 0; i < rows; i++) for (let j = 0; j <= pencil; j++) hankel.set(i, j, y[i + j]);
  const svd = new SingularValueDecomposition(hankel, { computeLeftSingularVectors: false, autoTranspose: true });
  const v = svd.rightSingularVectors.subMatrix(0, pencil, 0, modes - 1);
  const v1 = v.subMatrix(0, pencil - 1, 0, modes - 1);
  const v2 = v.subMatrix(1, pencil, 0, modes - 1);
  // pinv(V1) V2 is modes x modes; its eigenvalues are the poles z.
  const system = new SingularValueDecomposition(v1).solve(v2);
  const eig = new EigenvalueDecomposition(system);
  return eig.realEigenvalues.map((re, k) => {
    const im = eig.imaginaryEigenvalues[k];
    return { re: 0.5 * Math.log(re * re + im * im), im: Math.atan2(im, re) };
  });
}

function isConstant(y: ArrayLike<number>): boolean {
  for (let i = 1; i < y.length; i++) if (y[i] !== y[0]) return false;
  return true;
}
