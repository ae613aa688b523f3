// Entry of the upload parse worker: the app runs TypeScript through tsx, and a worker thread
// does not inherit the loader, so it registers tsx before loading the worker's code.
import { register } from 'tsx/esm/api';

register();
await import('./parse-worker.ts');
