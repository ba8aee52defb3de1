// The file each pool thread loads (piscina imports it; its default export runs every task). The
// task code is TypeScript: tsx's module hooks are registered first, so one entry works whether the
// process runs under tsx (`npm start`, the bench), vitest, or plain node; a thread started from a
// tsx process already has them, and registering again only adds a second, unused resolver.
import { register } from 'tsx/esm/api';

register();
const { runTask } = await import('./tasks.ts');

export default runTask;
