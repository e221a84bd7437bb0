/**
 * Assembly of the Helmholtz operator a(p, v) = ∫ (1/ρ) ∇̃p·∇̃v − (ω²/κ) p v dṼ into a complex symmetric CSR
 * matrix. Symbolic phase once per mesh (pattern and the element-to-CSR scatter map), numeric phase per
 * frequency (1D factors per grid cell and axis, Kronecker element matrices, scatter-add).
 */
import type { ComplexCsr, ComplexVector, SparsePattern } from '../linalg/sparse.ts';
import type { Mesh } from '../grid/mesh.ts';
import { element1D, elementWork, kroneckerElement, type Matrix1D } from '../fe/element.ts';
import type { AxisStretch } from '../fe/stretch.ts';
import type { Complex } from '../core/complex.ts';

export interface AssemblyPattern {
  pattern: SparsePattern;
  scatter: Int32Array; // nElements × n3 × n3: CSR position of element entry (I, J)
}

export function symbolicAssembly(mesh: Mesh): AssemblyPattern {
  const { ndofs, nodesPerElement: n3, elementDofs } = mesh.numbering, nel = mesh.elements.length;
  // dof → (element, local index) incidence, counting sort
  const incPtr = new Int32Array(ndofs + 1);
  for (let k = 0; k < elementDofs.length; k++) incPtr[elementDofs[k] + 1]++;
  for (let i = 0; i < ndofs; i++) incPtr[i + 1] += incPtr[i];
  const incElem = new Int32Array(elementDofs.length), incLocal = new Int32Array(elementDofs.length), fill = incPtr.slice(0, ndofs);
  for (let e = 0; e < nel; e++) for (let I = 0; I < n3; I++) {
    const d = elementDofs[e * n3 + I], at = fill[d]++;
    incElem[at] = e;
    incLocal[at] = I;
  }
  // row patterns: union of the dofs of the row's elements (marker per row)
  const mark = new Int32Array(ndofs).fill(-1), rowPtr = new Int32Array(ndofs + 1);
  for (let r = 0; r < ndofs; r++) {
    let count = 0;
    for (let t = incPtr[r]; t < incPtr[r + 1]; t++) {
      const base = incElem[t] * n3;
      for (let J = 0; J < n3; J++) {
        const c = elementDofs[base + J];
        if (mark[c] !== r) { mark[c] = r; count++; }
      }
    }
    rowPtr[r + 1] = rowPtr[r] + count;
  }
  const colIdx = new Int32Array(rowPtr[ndofs]), pos = new Int32Array(ndofs);
  mark.fill(-1);
  const scatter = new Int32Array(nel * n3 * n3);
  for (let r = 0; r < ndofs; r++) {
    let at = rowPtr[r];
    for (let t = incPtr[r]; t < incPtr[r + 1]; t++) {
      const base = incElem[t] * n3;
      for (let J = 0; J < n3; J++) {
        const c = elementDofs[base + J];
        if (mark[c] !== r) { mark[c] = r; colIdx[at++] = c; }
      }
    }
    const row = colIdx.subarray(rowPtr[r], rowPtr[r + 1]);
    row.sort();
    for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) pos[colIdx[k]] = k;
    for (let t = incPtr[r]; t < incPtr[r + 1]; t++) {
      const e = incElem[t], I = incLocal[t], base = e * n3, out = (e * n3 + I) * n3;
      for (let J = 0; J < n3; J++) scatter[out + J] = pos[elementDofs[base + J]];
    }
  }
  return { pattern: { n: ndofs, rowPtr, colIdx }, scatter };
}

/** Per-element material: 1/ρ and 1/κ (complex for equivalent fluids), as indices into a small table. */
export interface Materials {
  rhoInv: Complex[];
  kappaInv: Complex[];
  ofElement: Int32Array; // nElements
}

export function uniformMaterials(nElements: number, density: number, bulkModulus: number): Materials {
  return { rhoInv: [{ re: 1 / density, im: 0 }], kappaInv: [{ re: 1 / bulkModulus, im: 0 }], ofElement: new Int32Array(nElements) };
}

/** 1D factors of every grid cell along every axis: cell1D[d][i]. */
export function cellFactors(mesh: Mesh, stretches: AxisStretch[][]): Matrix1D[][] {
  return mesh.grid.axes.map((axis, d) => {
    const out: Matrix1D[] = [];
    for (let i = 0; i < axis.nodes.length - 1; i++) out.push(element1D(mesh.order, axis.nodes[i], axis.nodes[i + 1], stretches[d][i]));
    return out;
  });
}

/**
 * A = K̃ − ω²M̃ with the given stretches and materials, a CSR on the shared pattern; its values go into
 * `into` when given (overwritten: a sweep reuses one pair of arrays), else into fresh arrays.
 */
export function assembleHelmholtz(mesh: Mesh, sym: AssemblyPattern, omega: number, stretches: AxisStretch[][], mat: Materials, into?: ComplexVector): ComplexCsr {
  const nnz = sym.pattern.colIdx.length;
  if (into && (into.re.length !== nnz || into.im.length !== nnz)) throw new RangeError(`assembleHelmholtz: room for ${into.re.length} values, the pattern has ${nnz}`);
  const re = into?.re.fill(0) ?? new Float64Array(nnz), im = into?.im.fill(0) ?? new Float64Array(nnz);
  const factors = cellFactors(mesh, stretches);
  const [nx, ny] = mesh.grid.dims, n3 = mesh.numbering.nodesPerElement, w = elementWork(mesh.order), w2 = omega * omega;
  for (let e = 0; e < mesh.elements.length; e++) {
    const c = mesh.elements[e], i = c % nx, j = Math.floor(c / nx) % ny, k = Math.floor(c / (nx * ny));
    const m = mat.ofElement[e], c1 = mat.rhoInv[m], c2 = mat.kappaInv[m];
    kroneckerElement(factors[0][i], factors[1][j], factors[2][k], c1.re, c1.im, w2 * c2.re, w2 * c2.im, w);
    const base = e * n3 * n3;
    for (let t = 0; t < n3 * n3; t++) {
      const at = sym.scatter[base + t];
      re[at] += w.re[t];
      im[at] += w.im[t];
    }
  }
  return { ...sym.pattern, re, im };
}
