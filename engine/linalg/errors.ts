/**
 * Failures of the sparse direct solver. The solver speaks in matrix terms (pivot, row, size);
 * the caller adds the physical wording (frequency, resonance of a closed space).
 */

export interface PivotLocation {
  permuted: number; // index in the factor's elimination order
  original: number; // row/column of the matrix as handed to factor()
}

/** A pivot of LDLᵀ was zero, not finite, or too small too often to be trusted. */
export class SingularSystemError extends Error {
  readonly pivot: PivotLocation;
  readonly magnitude: number; // |d| of the offending pivot
  readonly scale: number; // max |A_ij| over the original row of that pivot

  constructor(pivot: PivotLocation, magnitude: number, scale: number, detail = '') {
    super(
      `the matrix is singular or nearly so (pivot ${pivot.permuted} = row ${pivot.original} ` +
        `of size ${magnitude.toExponential(3)} against ${scale.toExponential(3)})${detail ? ': ' + detail : ''}`,
    );
    this.name = 'SingularSystemError';
    this.pivot = pivot;
    this.magnitude = magnitude;
    this.scale = scale;
  }
}

/** The matrix handed to the solver holds NaN or ±Infinity. */
export class NonFiniteMatrixError extends Error {
  readonly row: number;
  readonly col: number;

  constructor(row: number, col: number) {
    super(`matrix entry (${row}, ${col}) is not finite (NaN or Infinity); the assembled system is invalid`);
    this.name = 'NonFiniteMatrixError';
    this.row = row;
    this.col = col;
  }
}
