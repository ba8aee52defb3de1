// `npm start`: checks the port, builds the client when needed, then serves everything (server/index.ts).
import { buildClientIfStale } from './build-client';
import { ConfigError, portOf } from '../server/config';
import { checkPortFree, PortTakenError } from '../server/listen';

// A second start on a taken port stops here, in one sentence, before a client build rewrites the
// dist/ folder the running Gridset is serving.
try {
  await checkPortFree(portOf());
} catch (err) {
  if (!(err instanceof PortTakenError || err instanceof ConfigError)) throw err;
  console.error(err instanceof ConfigError ? `Gridset cannot start: ${err.message}` : err.message);
  process.exit(1);
}
buildClientIfStale();
await import('../server/index');
