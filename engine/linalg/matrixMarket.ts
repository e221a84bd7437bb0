/**
 * Matrix Market exchange format, so systems can be checked with other solvers.
 * Boisvert, Pozo & Remington, "The Matrix Market Exchange Formats: Initial Design",
 * NIST IR 5935 (1996): a header line "%%MatrixMarket matrix <format> <field> <symmetry>",
 * comment lines starting with %, a size line, then 1-based entries; "coordinate" lists
 * "i j value" (symmetric: lower triangle only), "array" lists values column by column.
 * Numbers are written in the shortest form that reads back to the same double.
 */
import type { ComplexCsr, ComplexVector } from './sparse.ts';

/** Lower triangle as "coordinate complex symmetric", or every entry as "coordinate complex general". */
export function writeMatrixMarket(A: ComplexCsr, symmetricLowerOnly = true): string {
  return [...matrixMarketChunks(A, symmetricLowerOnly)].join('');
}

/**
 * The text of writeMatrixMarket in pieces of about `rowsPerChunk` rows each, for systems whose file
 * exceeds the longest string a JavaScript engine holds (about 2^29 characters in V8).
 */
export function* matrixMarketChunks(A: ComplexCsr, symmetricLowerOnly = true, rowsPerChunk = 4096): Generator<string> {
  const { n, rowPtr, colIdx, re, im } = A;
  let count = 0;
  for (let i = 0; i < n; i++) {
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) if (!symmetricLowerOnly || colIdx[k] <= i) count++;
  }
  const symmetry = symmetricLowerOnly ? 'symmetric' : 'general';
  yield `%%MatrixMarket matrix coordinate complex ${symmetry}\n${n} ${n} ${count}\n`;
  for (let i0 = 0; i0 < n; i0 += rowsPerChunk) {
    const lines: string[] = [];
    for (let i = i0; i < Math.min(n, i0 + rowsPerChunk); i++) {
      for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
        const j = colIdx[k];
        if (symmetricLowerOnly && j > i) continue;
        lines.push(`${i + 1} ${j + 1} ${re[k]} ${im[k]}\n`);
      }
    }
    yield lines.join('');
  }
  if (count === 0) yield '\n';
}

/** A column vector as "array complex general". */
export function writeMatrixMarketVector(v: ComplexVector): string {
  const n = v.re.length;
  const lines = new Array<string>(n);
  for (let i = 0; i < n; i++) lines[i] = `${v.re[i]} ${v.im[i]}`;
  return `%%MatrixMarket matrix array complex general\n${n} 1\n${lines.join('\n')}\n`;
}

interface Header {
  format: 'coordinate' | 'array';
  field: 'real' | 'complex' | 'integer' | 'pattern';
  symmetry: 'general' | 'symmetric' | 'skew-symmetric' | 'hermitian';
}

/** Header and the whitespace-separated numbers after the comments. */
function parse(text: string): { header: Header; tokens: string[] } {
  const lines = text.split(/\r?\n/);
  const head = lines[0].trim().toLowerCase().split(/\s+/);
  if (head[0] !== '%%matrixmarket' || head[1] !== 'matrix') throw new SyntaxError(`Matrix Market: bad header "${lines[0]}"`);
  const [format, field, symmetry] = head.slice(2) as [Header['format'], Header['field'], Header['symmetry']];
  if (!['coordinate', 'array'].includes(format)) throw new SyntaxError(`Matrix Market: unknown format "${format}"`);
  if (!['real', 'complex', 'integer', 'pattern'].includes(field)) throw new SyntaxError(`Matrix Market: unknown field "${field}"`);
  if (!['general', 'symmetric', 'skew-symmetric', 'hermitian'].includes(symmetry)) throw new SyntaxError(`Matrix Market: unknown symmetry "${symmetry}"`);
  const tokens: string[] = [];
  for (let l = 1; l < lines.length; l++) {
    const line = lines[l].trim();
    if (line === '' || line.startsWith('%')) continue;
    for (const t of line.split(/\s+/)) tokens.push(t);
  }
  return { header: { format, field, symmetry }, tokens };
}

function number(tokens: string[], at: number): number {
  if (at >= tokens.length) throw new SyntaxError('Matrix Market: the file ends early');
  const v = Number(tokens[at]);
  if (Number.isNaN(v) && tokens[at].toLowerCase() !== 'nan') throw new SyntaxError(`Matrix Market: "${tokens[at]}" is not a number`);
  return v;
}

/**
 * A square coordinate matrix as CSR with both triangles (symmetric, skew-symmetric and Hermitian
 * files are expanded), columns sorted, duplicates summed, and an explicit zero on any missing
 * diagonal entry so the result meets the ComplexCsr conventions.
 */
export function readMatrixMarket(text: string): ComplexCsr {
  const { header, tokens } = parse(text);
  if (header.format !== 'coordinate') throw new SyntaxError('Matrix Market: readMatrixMarket expects the coordinate format');
  const rows = number(tokens, 0), cols = number(tokens, 1), nnz = number(tokens, 2);
  if (rows !== cols) throw new RangeError(`Matrix Market: matrix is ${rows}×${cols}, not square`);
  const n = rows;
  const per = header.field === 'complex' ? 4 : header.field === 'pattern' ? 2 : 3;
  const mirror = header.symmetry !== 'general';
  const cap = (mirror ? 2 * nnz : nnz) + n;
  const I = new Int32Array(cap), J = new Int32Array(cap), R = new Float64Array(cap), M = new Float64Array(cap);
  let e = 0;
  for (let t = 0; t < nnz; t++) {
    const at = 3 + t * per;
    const i = number(tokens, at) - 1, j = number(tokens, at + 1) - 1;
    if (!(i >= 0 && i < n && j >= 0 && j < n)) throw new RangeError(`Matrix Market: entry ${t + 1} at (${i + 1}, ${j + 1}) is outside ${n}×${n}`);
    const vr = per === 2 ? 1 : number(tokens, at + 2);
    const vi = per === 4 ? number(tokens, at + 3) : 0;
    I[e] = i; J[e] = j; R[e] = vr; M[e] = vi; e++;
    if (mirror && i !== j) {
      const sign = header.symmetry === 'skew-symmetric' ? -1 : 1;
      const conj = header.symmetry === 'hermitian' ? -1 : 1;
      I[e] = j; J[e] = i; R[e] = sign * vr; M[e] = sign * conj * vi; e++;
    }
  }
  for (let i = 0; i < n; i++) { // zero diagonal entries; summed away if the file has them
    I[e] = i; J[e] = i; R[e] = 0; M[e] = 0; e++;
  }
  return cooToCsr(n, e, I, J, R, M);
}

function cooToCsr(n: number, e: number, I: Int32Array, J: Int32Array, R: Float64Array, M: Float64Array): ComplexCsr {
  const count = new Int32Array(n + 1);
  for (let t = 0; t < e; t++) count[I[t] + 1]++;
  for (let i = 0; i < n; i++) count[i + 1] += count[i];
  const order = new Int32Array(e);
  const fill = count.slice(0, n);
  for (let t = 0; t < e; t++) order[fill[I[t]]++] = t;
  const rowPtr = new Int32Array(n + 1);
  const colIdx = new Int32Array(e), re = new Float64Array(e), im = new Float64Array(e);
  let q = 0;
  for (let i = 0; i < n; i++) {
    const row = Array.from(order.subarray(count[i], count[i + 1])).sort((a, b) => J[a] - J[b]);
    for (const t of row) {
      if (q > rowPtr[i] && colIdx[q - 1] === J[t]) {
        re[q - 1] += R[t];
        im[q - 1] += M[t];
      } else {
        colIdx[q] = J[t]; re[q] = R[t]; im[q] = M[t]; q++;
      }
    }
    rowPtr[i + 1] = q;
  }
  return { n, rowPtr, colIdx: colIdx.slice(0, q), re: re.slice(0, q), im: im.slice(0, q) };
}

/** A column vector from the array format (real or complex). */
export function readMatrixMarketVector(text: string): ComplexVector {
  const { header, tokens } = parse(text);
  if (header.format !== 'array') throw new SyntaxError('Matrix Market: readMatrixMarketVector expects the array format');
  if (header.field === 'pattern') throw new SyntaxError('Matrix Market: an array cannot have the pattern field');
  const rows = number(tokens, 0), cols = number(tokens, 1);
  if (cols !== 1) throw new RangeError(`Matrix Market: array is ${rows}×${cols}, not a column vector`);
  const per = header.field === 'complex' ? 2 : 1;
  const v = { re: new Float64Array(rows), im: new Float64Array(rows) };
  for (let i = 0; i < rows; i++) {
    v.re[i] = number(tokens, 2 + i * per);
    if (per === 2) v.im[i] = number(tokens, 3 + i * per);
  }
  return v;
}
