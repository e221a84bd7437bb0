/**
 * QUIETGRID_KERNEL=js|simd chooses the factorisation's dense kernels for this process (the CLI, its
 * worker threads, the tests): 'simd' is the default where the runtime has WebAssembly SIMD; 'js' runs
 * the plain-JavaScript kernels, for comparison or where SIMD misbehaves.
 */
import { setDefaultKernel } from '../linalg/index.ts';

export function applyKernelChoice(env: NodeJS.ProcessEnv = process.env): void {
  const v = env.QUIETGRID_KERNEL?.trim();
  if (!v) return;
  if (v !== 'js' && v !== 'simd') throw new Error(`QUIETGRID_KERNEL must be 'js' or 'simd' (got '${v}'); unset it for the default`);
  setDefaultKernel(v);
}
