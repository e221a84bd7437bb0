/** A factorisation helper thread (factorThreads.ts): serves its workspace's factorisations until told to stop. */
import { workerData } from 'node:worker_threads';
import { serveFactorHelper, type HelperSetup } from '../linalg/index.ts';
import { applyKernelChoice } from './kernelChoice.ts';

applyKernelChoice();
serveFactorHelper(workerData as HelperSetup);
