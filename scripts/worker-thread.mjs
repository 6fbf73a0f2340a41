// A worker thread of `npm run worker`: registers tsx's loader in this thread (a thread does not inherit it),
// then runs the thread's half of scripts/worker.ts.
import { register } from 'tsx/esm/api';

register();
await import('./worker.ts');
