/**
 * Runs a real worker module (workers/solver.worker.ts, or the one named by workerData.module,
 * e.g. '../../../workers/summary.worker.ts') in a Node worker thread, for
 * tests/unit/worker. The browser gives a worker a global scope with addEventListener and
 * postMessage, which `Comlink.expose(api)` uses; here those come from comlink's own Node
 * adapter over `parentPort`, and tsx compiles the TypeScript (its loader is registered below,
 * so the '@/…' paths of tsconfig.json resolve as in the app).
 */
import { parentPort, workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';

const ep = nodeEndpoint(parentPort);
globalThis.addEventListener = ep.addEventListener;
globalThis.removeEventListener = ep.removeEventListener;
globalThis.postMessage = ep.postMessage;

register();
await import(workerData?.module ?? '../../../workers/solver.worker.ts');
