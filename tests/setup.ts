// The dense kernels follow QUIETGRID_KERNEL in tests as in the CLI (tests/linalg/bothKernels.test.ts runs the solver tests with 'js').
import { applyKernelChoice } from '../engine/node/kernelChoice.ts';

applyKernelChoice();
