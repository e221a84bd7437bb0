#!/usr/bin/env node
// The quietgrid command. Node 20 cannot run TypeScript itself: register the tsx loader, then start the CLI.
import { register } from 'tsx/esm/api';

register();
await import('../cli/quietgrid.ts');
