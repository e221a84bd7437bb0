// Node 20 cannot start a worker thread from a .ts file: register the TypeScript loader first.
import { register } from 'tsx/esm/api';

register();
await import('./factorHelper.ts');
