// Starts a TypeScript worker module through tsx (workers do not inherit the main thread's loader
// when tsx was registered from code). The compiled build starts its .js worker directly.
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
