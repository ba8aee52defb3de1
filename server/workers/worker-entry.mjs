// The program each pool process runs (workerpool forks it; `run` reads one upload). The task code
// is TypeScript: tsx's module hooks are registered first, so one entry works whether the server
// runs under tsx (`npm start`, the bench), vitest, or plain node.
import workerpool from 'workerpool';
import { register } from 'tsx/esm/api';

register();
const { performTask } = await import('./tasks.ts');

workerpool.worker({
  run: (message) => performTask(message, () => workerpool.workerEmit('started')),
});
