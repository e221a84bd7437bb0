/**
 * The dense kernels of denseKernels.ts as WebAssembly 128-bit SIMD (f64x2: one complex number per
 * register), emitted as bytes by wasmBinary.ts when first used: no toolchain, no build step.
 *
 * The product kernels compute 3 × 2 blocks of the target as dot products over unit-stride rows:
 * twelve accumulators in registers, each loaded x serving two products and each loaded w three rows
 * (register blocking, Goto & van de Geijn, "Anatomy of high-performance matrix multiplication",
 * ACM TOMS 34(3), 2008). With W packed as pairs (w, swapped w), x·w needs two multiplies and two
 * adds of f64x2 and no shuffle inside the loop; the halves are combined once per entry.
 */
import { Code, moduleBytes, i32, v128, wasmApi, type ExportedFunction, type WasmMemory, type WasmModule } from './wasmBinary.ts';
import type { DenseKernels } from './denseKernels.ts';

// opcodes (WebAssembly Core Specification 2.0, §5.4)
const I32_ADD = 0x6a, I32_SUB = 0x6b, I32_MUL = 0x6c, I32_AND = 0x71, I32_SHL = 0x74, I32_SHR_U = 0x76;
const I32_EQZ = 0x45, I32_LT_U = 0x49, I32_GE_U = 0x4f;
const I32_LOAD = [0x28], V128_LOAD = [0xfd, 0x00], V128_STORE = [0xfd, 0x0b];
const F64X2_ADD = 0xf0, F64X2_SUB = 0xf1, F64X2_MUL = 0xf2, I8X16_SHUFFLE = 0x0d, V128_CONST = 0x0c;

/** Byte lanes of i8x16.shuffle(a, b) picking f64 lanes: 0, 1 from a, 2, 3 from b. */
function lanes(...f: number[]): number[] {
  return f.flatMap((l) => Array.from({ length: 8 }, (_, k) => 8 * l + k));
}
function f64pair(a: number, b: number): number[] {
  const v = new Float64Array([a, b]);
  return Array.from(new Uint8Array(v.buffer));
}
const LO = lanes(0, 2), HI = lanes(1, 3), SWAP = lanes(1, 0), BOTH0 = lanes(0, 0), BOTH1 = lanes(1, 1);

class K extends Code {
  v128load(offset = 0): this { return this.mem(V128_LOAD, offset, 4); }
  v128store(offset = 0): this { return this.mem(V128_STORE, offset, 4); }
  shuffle(l: number[]): this { this.simd(I8X16_SHUFFLE); return this.op(...l); }
  vconst(a: number, b: number): this { this.simd(V128_CONST); return this.op(...f64pair(a, b)); }
  add(): this { return this.op(I32_ADD); }
  fadd(): this { return this.simd(F64X2_ADD); }
  fsub(): this { return this.simd(F64X2_SUB); }
  fmul(): this { return this.simd(F64X2_MUL); }
  /** local += delta (i32 locals). */
  inc(l: number, delta: number | { local: number }): this {
    this.get(l);
    if (typeof delta === 'number') this.i32c(delta);
    else this.get(delta.local);
    return this.add().set(l);
  }
  /** Converts parameter i (an offset in doubles) to bytes in place. */
  toBytes(...ps: number[]): this {
    for (const p of ps) this.get(p).i32c(3).op(I32_SHL).set(p);
    return this;
  }
  /** Pushes the complex value Σ x·w from the accumulators a, b: (a₀ − a₁, b₀ + b₁). */
  combine(a: number, b: number): this {
    return this.get(a).get(b).shuffle(LO).get(a).get(b).shuffle(HI).vconst(-1, 1).fmul().fadd();
  }
}

/**
 * Micro kernel: R rows × C columns of T −= X·Wᵀ over len; params (bytes) tb, ts, xb, xs, wb, ws, len.
 * order 'x': each x is loaded once a step and the w it meets are loaded again for every row (fewer live
 * registers: 2RC accumulators, one x, one w); order 'w': the R x of a step stay in registers. unroll: steps a loop turn.
 */
export function micro(R: number, C: number, order: 'x' | 'w' = 'x', unroll = 2): K {
  const k = new K([i32, i32, i32, i32, i32, i32, i32]);
  const [tb, ts, xb, xs, wb, ws, len] = [0, 1, 2, 3, 4, 5, 6];
  const px = Array.from({ length: R }, () => k.local(i32));
  const pw = Array.from({ length: C }, () => k.local(i32));
  const n2 = k.local(i32), ta = k.local(i32);
  const a = Array.from({ length: R }, () => Array.from({ length: C }, () => k.local(v128)));
  const b = Array.from({ length: R }, () => Array.from({ length: C }, () => k.local(v128)));
  const xv = Array.from({ length: R }, () => k.local(v128));
  const wv = k.local(v128);
  for (let r = 0; r < R; r++) { k.get(r ? px[r - 1] : xb); if (r) k.get(xs).add(); k.set(px[r]); }
  for (let c = 0; c < C; c++) { k.get(c ? pw[c - 1] : wb); if (c) k.get(ws).add(); k.set(pw[c]); }
  const step = (s: number): void => {
    if (order === 'x') {
      for (let r = 0; r < R; r++) {
        k.get(px[r]).v128load(16 * s).set(xv[0]);
        for (let c = 0; c < C; c++) {
          k.get(a[r][c]).get(xv[0]).get(pw[c]).v128load(32 * s).fmul().fadd().set(a[r][c]);
          k.get(b[r][c]).get(xv[0]).get(pw[c]).v128load(32 * s + 16).fmul().fadd().set(b[r][c]);
        }
      }
      return;
    }
    for (let r = 0; r < R; r++) k.get(px[r]).v128load(16 * s).set(xv[r]);
    for (let c = 0; c < C; c++) {
      for (const [acc, off] of [[a, 0], [b, 16]] as const) {
        k.get(pw[c]).v128load(32 * s + off).set(wv);
        for (let r = 0; r < R; r++) k.get(acc[r][c]).get(xv[r]).get(wv).fmul().fadd().set(acc[r][c]);
      }
    }
  };
  const shift = Math.log2(unroll);
  k.get(len).i32c(shift).op(I32_SHR_U).set(n2);
  k.begin(0x02).get(n2).op(I32_EQZ).brIf(0);
  k.begin(0x03);
  for (let u = 0; u < unroll; u++) step(u);
  for (const p of px) k.inc(p, 16 * unroll);
  for (const p of pw) k.inc(p, 32 * unroll);
  k.get(n2).i32c(1).op(I32_SUB).tee(n2).brIf(0);
  k.end().end();
  // the len mod unroll steps left
  k.get(len).i32c(unroll - 1).op(I32_AND).set(n2);
  k.begin(0x02).get(n2).op(I32_EQZ).brIf(0);
  k.begin(0x03);
  step(0);
  for (const p of px) k.inc(p, 16);
  for (const p of pw) k.inc(p, 32);
  k.get(n2).i32c(1).op(I32_SUB).tee(n2).brIf(0);
  k.end().end();
  for (let r = 0; r < R; r++) {
    k.get(r ? ta : tb);
    if (r) k.get(ts).add();
    k.set(ta);
    for (let c = 0; c < C; c++) {
      k.get(ta).get(ta).v128load(16 * c).combine(a[r][c], b[r][c]).fsub().v128store(16 * c);
    }
  }
  return k;
}

const MICRO = { k32: 5, k31: 6, k22: 7, k21: 8, k12: 9, k11: 10 };
const MICRO_OF: Record<number, [number, number]> = { 3: [MICRO.k32, MICRO.k31], 2: [MICRO.k22, MICRO.k21], 1: [MICRO.k12, MICRO.k11] };

/** Calls micro kernel f with (tb, ts, xb, xs, wb, ws, len) from locals. */
function callMicro(k: K, f: number, tb: number, ts: number, xb: number, xs: number, wb: number, ws: number, len: number): void {
  k.get(tb).get(ts).get(xb).get(xs).get(wb).get(ws).get(len).call(f);
}

/**
 * products(t, ts, x, xs, w, ws, rows, cols, len), offsets in doubles: strips of three rows (3 × 2 blocks:
 * twelve accumulators, the most that x86-64's sixteen vector registers hold with the operands), then
 * a strip of two or one for the remaining rows.
 */
function products(): K {
  const k = new K([i32, i32, i32, i32, i32, i32, i32, i32, i32]);
  const [t, ts, x, xs, w, ws, rows, cols, len] = [0, 1, 2, 3, 4, 5, 6, 7, 8];
  const i = k.local(i32), j = k.local(i32), tj = k.local(i32), wj = k.local(i32), ws2 = k.local(i32);
  k.toBytes(t, ts, x, xs, w, ws);
  k.get(ws).i32c(1).op(I32_SHL).set(ws2);
  /** One strip of R rows at t, x: blocks of two columns, then the odd column; advances t, x and i by R rows. */
  const strip = (R: number): void => {
    const [pair, single] = MICRO_OF[R];
    k.get(t).set(tj).get(w).set(wj).i32c(0).set(j);
    k.begin(0x02).begin(0x03);
    k.get(j).i32c(2).add().get(cols).op(0x4b /* i32.gt_u */).brIf(1);
    callMicro(k, pair, tj, ts, x, xs, wj, ws, len);
    k.inc(tj, 32).inc(wj, { local: ws2 }).inc(j, 2).br(0);
    k.end().end();
    k.get(j).get(cols).op(I32_LT_U).begin(0x04);
    callMicro(k, single, tj, ts, x, xs, wj, ws, len);
    k.end();
    for (let r = 0; r < R; r++) k.inc(t, { local: ts }).inc(x, { local: xs });
    k.inc(i, R);
  };
  k.begin(0x02).begin(0x03);
  k.get(i).i32c(3).add().get(rows).op(0x4b).brIf(1);
  strip(3);
  k.br(0);
  k.end().end();
  k.get(i).i32c(2).add().get(rows).op(0x4d /* i32.le_u */).begin(0x04);
  strip(2);
  k.end();
  k.get(i).get(rows).op(I32_LT_U).begin(0x04);
  strip(1);
  k.end();
  return k;
}

/** lowerProducts(t, ts, x, xs, w, ws, m, len), offsets in doubles. */
function lowerProducts(): K {
  const k = new K([i32, i32, i32, i32, i32, i32, i32, i32]);
  const [t, ts, x, xs, w, ws, m, len] = [0, 1, 2, 3, 4, 5, 6, 7];
  const i = k.local(i32), j = k.local(i32), tj = k.local(i32), wj = k.local(i32), ts2 = k.local(i32), ws2 = k.local(i32), xs2 = k.local(i32);
  k.toBytes(t, ts, x, xs, w, ws);
  k.get(ts).i32c(1).op(I32_SHL).set(ts2);
  k.get(ws).i32c(1).op(I32_SHL).set(ws2);
  k.get(xs).i32c(1).op(I32_SHL).set(xs2);
  k.begin(0x02).begin(0x03);
  k.get(i).i32c(2).add().get(m).op(0x4b).brIf(1);
  k.get(t).set(tj).get(w).set(wj).i32c(0).set(j);
  // blocks (i, j) for j ≤ i, the diagonal block whole
  k.begin(0x02).begin(0x03);
  k.get(j).get(i).op(0x4b).brIf(1);
  callMicro(k, MICRO.k22, tj, ts, x, xs, wj, ws, len);
  k.inc(tj, 32).inc(wj, { local: ws2 }).inc(j, 2).br(0);
  k.end().end();
  k.inc(t, { local: ts2 }).inc(x, { local: xs2 }).inc(i, 2).br(0);
  k.end().end();
  k.get(i).get(m).op(I32_LT_U).begin(0x04);
  k.get(t).set(tj).get(w).set(wj).i32c(0).set(j);
  k.begin(0x02).begin(0x03);
  k.get(j).i32c(1).add().get(i).op(0x4b).brIf(1);
  callMicro(k, MICRO.k12, tj, ts, x, xs, wj, ws, len);
  k.inc(tj, 32).inc(wj, { local: ws2 }).inc(j, 2).br(0);
  k.end().end();
  k.get(j).get(i).op(0x4d /* i32.le_u */).begin(0x04);
  callMicro(k, MICRO.k11, tj, ts, x, xs, wj, ws, len);
  k.end();
  k.end();
  return k;
}

/** packScaled(x, xs, rows, cols, d, w, ws), offsets in doubles. */
function packScaled(): K {
  const k = new K([i32, i32, i32, i32, i32, i32, i32]);
  const [x, xs, rows, cols, d, w, ws] = [0, 1, 2, 3, 4, 5, 6];
  const r = k.local(i32), c = k.local(i32), px = k.local(i32), pw = k.local(i32), pd = k.local(i32);
  const l = k.local(v128), dv = k.local(v128), pr = k.local(v128);
  k.toBytes(x, xs, d, w, ws);
  k.begin(0x02).begin(0x03);
  k.get(r).get(rows).op(I32_GE_U).brIf(1);
  k.get(x).set(px).get(w).set(pw).get(d).set(pd).i32c(0).set(c);
  k.begin(0x02).begin(0x03);
  k.get(c).get(cols).op(I32_GE_U).brIf(1);
  k.get(px).v128load().set(l).get(pd).v128load().set(dv);
  // (lr·dr − li·di, li·dr + lr·di) = l·(dr, dr) + swap(l)·(−di, di)
  k.get(l).get(dv).get(dv).shuffle(BOTH0).fmul();
  k.get(l).get(l).shuffle(SWAP).get(dv).get(dv).shuffle(BOTH1).vconst(-1, 1).fmul().fmul().fadd().set(pr);
  k.get(pw).get(pr).v128store(0);
  k.get(pw).get(pr).get(pr).shuffle(SWAP).v128store(16);
  k.inc(px, 16).inc(pd, 16).inc(pw, 32).inc(c, 1).br(0);
  k.end().end();
  k.inc(x, { local: xs }).inc(w, { local: ws }).inc(r, 1).br(0);
  k.end().end();
  return k;
}

/** solveRows(p, ps, rows, nb, w, ws, inv), offsets in doubles. */
function solveRows(): K {
  const k = new K([i32, i32, i32, i32, i32, i32, i32]);
  const [p, ps, rows, nb, w, ws, inv] = [0, 1, 2, 3, 4, 5, 6];
  const r = k.local(i32), kk = k.local(i32), t = k.local(i32), px = k.local(i32), pw = k.local(i32), wk = k.local(i32), pk = k.local(i32), pi = k.local(i32);
  const a = k.local(v128), b = k.local(v128), xv = k.local(v128), s = k.local(v128), iv = k.local(v128);
  k.toBytes(p, ps, w, ws, inv);
  k.begin(0x02).begin(0x03);
  k.get(r).get(rows).op(I32_GE_U).brIf(1);
  k.get(w).set(wk).get(p).set(pk).get(inv).set(pi).i32c(0).set(kk);
  k.begin(0x02).begin(0x03);
  k.get(kk).get(nb).op(I32_GE_U).brIf(1);
  k.vconst(0, 0).tee(a).set(b);
  k.get(p).set(px).get(wk).set(pw).i32c(0).set(t);
  k.begin(0x02).begin(0x03);
  k.get(t).get(kk).op(I32_GE_U).brIf(1);
  k.get(px).v128load().set(xv);
  k.get(a).get(xv).get(pw).v128load(0).fmul().fadd().set(a);
  k.get(b).get(xv).get(pw).v128load(16).fmul().fadd().set(b);
  k.inc(px, 16).inc(pw, 32).inc(t, 1).br(0);
  k.end().end();
  k.get(pk).v128load().combine(a, b).fsub().set(s);
  k.get(pi).v128load().set(iv);
  // s·inv = s·(ir, ir) + swap(s)·(−ii, ii)
  k.get(pk);
  k.get(s).get(iv).get(iv).shuffle(BOTH0).fmul();
  k.get(s).get(s).shuffle(SWAP).get(iv).get(iv).shuffle(BOTH1).vconst(-1, 1).fmul().fmul().fadd();
  k.v128store();
  k.inc(wk, { local: ws }).inc(pk, 16).inc(pi, 16).inc(kk, 1).br(0);
  k.end().end();
  k.inc(p, { local: ps }).inc(r, 1).br(0);
  k.end().end();
  return k;
}

/** extendAdd(src, rel, mc, f, fs): src, f, fs in doubles, rel an Int32 index. */
function extendAdd(): K {
  const k = new K([i32, i32, i32, i32, i32]);
  const [src, rel, mc, f, fs] = [0, 1, 2, 3, 4];
  const a = k.local(i32), bb = k.local(i32), row = k.local(i32), pr = k.local(i32), d = k.local(i32);
  k.toBytes(src, f, fs);
  k.get(rel).i32c(2).op(I32_SHL).set(rel);
  k.begin(0x02).begin(0x03);
  k.get(a).get(mc).op(I32_GE_U).brIf(1);
  k.get(f).get(rel).get(a).i32c(2).op(I32_SHL).add().mem(I32_LOAD, 0, 2).get(fs).op(I32_MUL).add().set(row);
  k.get(rel).set(pr).i32c(0).set(bb);
  k.begin(0x02).begin(0x03);
  k.get(bb).get(a).op(0x4b).brIf(1);
  k.get(row).get(pr).mem(I32_LOAD, 0, 2).i32c(4).op(I32_SHL).add().tee(d);
  k.get(d).v128load().get(src).v128load().fadd().v128store();
  k.inc(src, 16).inc(pr, 4).inc(bb, 1).br(0);
  k.end().end();
  k.inc(a, 1).br(0);
  k.end().end();
  return k;
}

let compiled: { plain: WasmModule; shared: WasmModule } | null | undefined;

function build(shared: boolean): Uint8Array<ArrayBuffer> {
  const fns: ExportedFunction[] = [
    { name: 'products', code: products() }, { name: 'lowerProducts', code: lowerProducts() }, { name: 'packScaled', code: packScaled() },
    { name: 'solveRows', code: solveRows() }, { name: 'extendAdd', code: extendAdd() },
    { name: 'k32', code: micro(3, 2) }, { name: 'k31', code: micro(3, 1) }, { name: 'k22', code: micro(2, 2) }, { name: 'k21', code: micro(2, 1) },
    { name: 'k12', code: micro(1, 2) }, { name: 'k11', code: micro(1, 1) },
  ];
  return moduleBytes(fns, { minPages: 1, maxPages: 65536, shared });
}

/** The compiled modules, or null where WebAssembly or its SIMD is missing (the JS kernels are used then). */
function modules(): { plain: WasmModule; shared: WasmModule } | null {
  if (compiled !== undefined) return compiled;
  try {
    const W = wasmApi(), plain = build(false), shared = build(true);
    compiled = W && W.validate(plain) ? { plain: new W.Module(plain), shared: new W.Module(shared) } : null;
  } catch {
    compiled = null;
  }
  return compiled;
}

/** True where this runtime runs the SIMD kernels. */
export function simdAvailable(): boolean {
  return modules() !== null;
}

/** The kernels bound to a WebAssembly memory (plain or shared); throws where SIMD is missing. */
export function simdKernels(memory: WasmMemory): DenseKernels {
  const m = modules(), W = wasmApi();
  if (!m || !W) throw new Error('WebAssembly SIMD is not available in this runtime');
  const shared = typeof SharedArrayBuffer !== 'undefined' && memory.buffer instanceof SharedArrayBuffer;
  const e = new W.Instance(shared ? m.shared : m.plain, { env: { memory } }).exports as unknown as Omit<DenseKernels, 'kind'>;
  return {
    kind: 'simd', products: e.products, lowerProducts: e.lowerProducts, packScaled: e.packScaled, solveRows: e.solveRows, extendAdd: e.extendAdd,
  };
}

/** The module's bytes (for tests and for hosts that compile it themselves). */
export function simdModuleBytes(shared = false): Uint8Array<ArrayBuffer> {
  return build(shared);
}
