// `npm start`: builds the client when needed, then serves everything (server/index.ts).
import { buildClientIfStale } from './build-client';

buildClientIfStale();
await import('../server/index');
