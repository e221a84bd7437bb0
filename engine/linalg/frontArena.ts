/**
 * The front arena: the one flat memory in which every front is assembled and factored, apart from
 * the factor itself. The factor's panels live in an ordinary Float64Array (they may exceed what one
 * WebAssembly memory addresses, 4 GiB); each front is computed here, in memory that stays warm in
 * cache from one front to the next, and its panel copied out when done. With the SIMD kernels the
 * arena is a WebAssembly.Memory (shared when threads factor together); with the JS kernels a plain
 * ArrayBuffer of the same size, so that both have the same memory estimate.
 *
 * Regions, in doubles (complex entries interleaved):
 *  - front: maxFront² entries, the current front F × F row-major (row stride 2F), lower triangle;
 *  - w: workEntries complex, the scaled rows packed as pairs (denseKernels.ts);
 *  - wBlock: NB × NB pairs, the scaled rows of the current diagonal block;
 *  - d, inv: maxPivots complex each, the front's pivots and their inverses;
 *  - rel: maxFront Int32, a child's rows in the parent front;
 *  - stack: stackPeak complex, the update matrices waiting for their parent, packed lower triangles.
 */
import { jsKernels, type DenseKernels, type KernelKind } from './denseKernels.ts';
import { simdAvailable, simdKernels } from './simdKernels.ts';
import { wasmApi, type WasmMemory } from './wasmBinary.ts';

/** Pivot columns per block of the front's factorisation (frontal.ts). */
export const NB = 32;
const PAGE = 65536;
/** What one WebAssembly memory (32-bit addresses) holds. */
const WASM_LIMIT = 65536 * PAGE;

export interface ArenaSizes {
  maxFront: number; // largest front order ns + m
  maxPivots: number; // largest ns
  workEntries: number; // complex entries of the packed scaled rows
  stackPeak: number; // complex entries of the update stack at its peak
}

export interface ArenaLayout {
  front: number; w: number; wBlock: number; d: number; inv: number; stack: number; // offsets in doubles
  rel: number; // offset in Int32 entries
  bytes: number; // whole 64 KiB pages
}

/** Offsets of the regions; every region starts on a 16-byte boundary. */
export function arenaLayout(s: ArenaSizes): ArenaLayout {
  let at = 0;
  const take = (doubles: number): number => {
    const o = at;
    at += doubles + (doubles & 1);
    return o;
  };
  const front = take(2 * s.maxFront * s.maxFront), w = take(2 * s.workEntries), wBlock = take(4 * NB * NB);
  const d = take(2 * s.maxPivots), inv = take(2 * s.maxPivots), rel = 2 * take(Math.ceil(s.maxFront / 2)), stack = take(2 * s.stackPeak);
  return { front, w, wBlock, d, inv, rel, stack, bytes: Math.ceil(Math.max(8 * at, 1) / PAGE) * PAGE };
}

export interface FrontArena {
  layout: ArenaLayout;
  f64: Float64Array; // the whole arena
  i32: Int32Array; // the same memory, for rel
  kernels: DenseKernels;
  memory: WasmMemory | null; // the SIMD kernels' memory, null with the JS kernels
}

let preferred: KernelKind | null = null;

/** The kernels new workspaces use: SIMD where the runtime has it, unless set otherwise (setDefaultKernel). */
export function defaultKernel(): KernelKind {
  return preferred ?? (simdAvailable() ? 'simd' : 'js');
}

/** Chooses the kernels for workspaces made from now on ('simd' falls back to 'js' where SIMD is missing); null restores the default. */
export function setDefaultKernel(kind: KernelKind | null): void {
  if (kind !== null && kind !== 'simd' && kind !== 'js') throw new RangeError(`kernel must be 'simd' or 'js', got '${String(kind)}'`);
  preferred = kind;
}

/**
 * An arena for the given layout. 'simd' gives the JS kernels where SIMD is missing or the arena exceeds
 * one WebAssembly memory; shared puts it in shared memory (threads factoring together).
 */
export function createArena(layout: ArenaLayout, kind: KernelKind, shared = false): FrontArena {
  const W = wasmApi();
  if (kind === 'simd' && W && simdAvailable() && layout.bytes <= WASM_LIMIT) {
    const pages = layout.bytes / PAGE;
    const memory = new W.Memory(shared ? { initial: pages, maximum: pages, shared: true } : { initial: pages });
    return { layout, f64: new Float64Array(memory.buffer), i32: new Int32Array(memory.buffer), kernels: simdKernels(memory), memory };
  }
  const buffer = shared ? new SharedArrayBuffer(layout.bytes) : new ArrayBuffer(layout.bytes);
  const f64 = new Float64Array(buffer), i32 = new Int32Array(buffer);
  return { layout, f64, i32, kernels: jsKernels(f64, i32), memory: null };
}
