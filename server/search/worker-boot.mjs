// Entry of the search worker thread. The app runs TypeScript through tsx, whose loader
// does not reach worker threads on its own: register it here, then load the worker.
import { workerData } from 'node:worker_threads';

if (workerData.entry.endsWith('.ts')) {
  const { register } = await import('tsx/esm/api');
  register();
}
await import(workerData.entry);
