/**
 * A minimal writer of WebAssembly binary modules: enough to emit the dense kernels of the
 * factorisation as bytes at start-up, with no toolchain and no build step.
 *
 * Only what the kernels use: one imported memory (plain or shared), functions with i32/f64/v128
 * locals, structured control flow, loads and stores, and the 128-bit SIMD opcodes. Encoding from the
 * WebAssembly Core Specification 2.0 (W3C, 2022), §5 "Binary Format", and the fixed-width SIMD
 * proposal's opcode table (merged into that specification).
 */

export const i32 = 0x7f, f64 = 0x7c, v128 = 0x7b;
export type ValueType = typeof i32 | typeof f64 | typeof v128;

/** Unsigned LEB128. */
function uleb(v: number, out: number[]): void {
  do {
    let b = v & 0x7f;
    v = Math.floor(v / 128);
    if (v !== 0) b |= 0x80;
    out.push(b);
  } while (v !== 0);
}

/** Signed LEB128 of a 32-bit integer. */
function sleb(v: number, out: number[]): void {
  v |= 0;
  for (;;) {
    const b = v & 0x7f;
    v >>= 7;
    if ((v === 0 && (b & 0x40) === 0) || (v === -1 && (b & 0x40) !== 0)) {
      out.push(b);
      return;
    }
    out.push(b | 0x80);
  }
}

function vector(items: number[][], out: number[]): void {
  uleb(items.length, out);
  for (const it of items) out.push(...it);
}

function section(id: number, body: number[], out: number[]): void {
  out.push(id);
  uleb(body.length, out);
  out.push(...body);
}

/** Body of one function: locals are numbered after the parameters, in the order asked for. */
export class Code {
  readonly bytes: number[] = [];
  private readonly extra: ValueType[] = [];

  constructor(readonly params: ValueType[]) {}

  /** A new local of type t; returns its index. */
  local(t: ValueType): number {
    this.extra.push(t);
    return this.params.length + this.extra.length - 1;
  }

  op(...b: number[]): this { this.bytes.push(...b); return this; }
  get(i: number): this { this.bytes.push(0x20); uleb(i, this.bytes); return this; }
  set(i: number): this { this.bytes.push(0x21); uleb(i, this.bytes); return this; }
  tee(i: number): this { this.bytes.push(0x22); uleb(i, this.bytes); return this; }
  i32c(v: number): this { this.bytes.push(0x41); sleb(v, this.bytes); return this; }
  /** 0xfd-prefixed SIMD instruction. */
  simd(code: number): this { this.bytes.push(0xfd); uleb(code, this.bytes); return this; }
  /** Memory access with static offset (bytes) and alignment 2^align. */
  mem(opcodeBytes: number[], offset: number, align: number): this {
    this.bytes.push(...opcodeBytes);
    uleb(align, this.bytes);
    uleb(offset, this.bytes);
    return this;
  }
  /** block/loop/if without result. */
  begin(kind: 0x02 | 0x03 | 0x04): this { this.bytes.push(kind, 0x40); return this; }
  end(): this { this.bytes.push(0x0b); return this; }
  br(depth: number): this { this.bytes.push(0x0c); uleb(depth, this.bytes); return this; }
  brIf(depth: number): this { this.bytes.push(0x0d); uleb(depth, this.bytes); return this; }
  call(f: number): this { this.bytes.push(0x10); uleb(f, this.bytes); return this; }

  encode(): number[] {
    const out: number[] = [];
    const groups: number[][] = [];
    for (const t of this.extra) {
      const last = groups[groups.length - 1];
      if (last && last[1] === t) last[0]++;
      else groups.push([1, t]);
    }
    const body: number[] = [];
    uleb(groups.length, body);
    for (const [count, t] of groups) {
      uleb(count, body);
      body.push(t);
    }
    body.push(...this.bytes, 0x0b);
    uleb(body.length, out);
    out.push(...body);
    return out;
  }
}

export interface ExportedFunction { name: string; code: Code }

/**
 * A module importing memory "env"."memory" (at least `minPages` pages of 64 KiB; a shared memory
 * declares a maximum, and the memory given must not exceed it) and exporting the given functions, which may call each other by their index in
 * the list. No results: every kernel writes to memory.
 */
export function moduleBytes(functions: ExportedFunction[], memory: { minPages: number; maxPages: number; shared: boolean }): Uint8Array<ArrayBuffer> {
  const out = [0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00];
  const types: number[][] = functions.map(({ code }) => [0x60, code.params.length, ...code.params, 0x00]);
  const typeSec: number[] = [];
  vector(types, typeSec);
  section(1, typeSec, out);
  const imp: number[] = [];
  uleb(1, imp);
  for (const s of ['env', 'memory']) {
    uleb(s.length, imp);
    for (const ch of s) imp.push(ch.charCodeAt(0));
  }
  imp.push(0x02, memory.shared ? 0x03 : 0x00);
  uleb(memory.minPages, imp);
  if (memory.shared) uleb(memory.maxPages, imp);
  section(2, imp, out);
  const funcSec: number[] = [];
  vector(functions.map((_, i) => { const b: number[] = []; uleb(i, b); return b; }), funcSec);
  section(3, funcSec, out);
  const exp: number[] = [];
  vector(functions.map(({ name }, i) => {
    const b: number[] = [];
    uleb(name.length, b);
    for (const ch of name) b.push(ch.charCodeAt(0));
    b.push(0x00);
    uleb(i, b);
    return b;
  }), exp);
  section(7, exp, out);
  const code: number[] = [];
  vector(functions.map(({ code: c }) => c.encode()), code);
  section(10, code, out);
  return Uint8Array.from(out);
}

/** The part of the runtime's WebAssembly API the kernels use (the engine is compiled without DOM or Node types). */
export interface WasmMemory { readonly buffer: ArrayBuffer | SharedArrayBuffer }
export interface WasmModule { readonly wasmModule?: never }
export interface WasmApi {
  validate(bytes: Uint8Array): boolean;
  Module: new (bytes: Uint8Array) => WasmModule;
  Instance: new (m: WasmModule, imports: { env: { memory: WasmMemory } }) => { exports: Record<string, unknown> };
  Memory: new (d: { initial: number; maximum?: number; shared?: boolean }) => WasmMemory;
}

/** The runtime's WebAssembly, or null where there is none. */
export function wasmApi(): WasmApi | null {
  return (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly ?? null;
}
