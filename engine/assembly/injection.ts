/**
 * Launching an incident wave through an absorbing inlet by a total-field / scattered-field split
 * (the dofs on the total side T carry the total field, those on the scattered side S the outgoing field
 * alone, which the inlet layers absorb). The assembled matrix stays as it is; only the right-hand side
 * changes:  b_T = −A_TS·u_inc|_S,  b_S = +A_ST·u_inc|_T.
 * Only rows and columns of the elements that straddle the split contribute. (The same construction as
 * the connecting boundary of Mur's total/scattered formulation: Mur, IEEE Trans. EMC 23, 1981.)
 */
import type { ComplexCsr, ComplexVector } from '../linalg/sparse.ts';

/** onTotalSide[i] = 1 for dofs on T; uInc the incident field at every dof (only dofs near the split are read). */
export function addSplitLoad(A: ComplexCsr, onTotalSide: Uint8Array, uInc: ComplexVector, b: ComplexVector): void {
  for (let i = 0; i < A.n; i++) {
    const ti = onTotalSide[i];
    let sr = 0, si = 0;
    for (let k = A.rowPtr[i]; k < A.rowPtr[i + 1]; k++) {
      const j = A.colIdx[k];
      if (onTotalSide[j] === ti) continue;
      const ar = A.re[k], ai = A.im[k], ur = uInc.re[j], ui = uInc.im[j];
      sr += ar * ur - ai * ui;
      si += ar * ui + ai * ur;
    }
    const sign = ti ? -1 : 1;
    b.re[i] += sign * sr;
    b.im[i] += sign * si;
  }
}
