// Starts a sweep worker from the TypeScript sources (vitest, tsx scripts). On Node 20,
// tsx does not register itself in worker threads (neither through `--import tsx` nor
// by inheriting it from the parent), so this bootstrap registers tsx's ESM hooks in the
// worker through tsx's public API and then loads the TypeScript worker. The built
// package (dist/) never uses this file: there the worker is plain JavaScript.
import { register } from 'tsx/esm/api';

register();
await import(new URL('./sweep-worker.ts', import.meta.url).href);
