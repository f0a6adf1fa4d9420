// Boot file for worker_threads under tsx: register the TypeScript loader, then
// import the real entry (Node 20 does not pass tsx's loader on to workers).
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
