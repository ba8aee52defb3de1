import { buildClientIfStale } from '../scripts/build-client';

// The browser tests serve the built client; build it once before any test file runs.
export default async function setup() {
  buildClientIfStale();
}
