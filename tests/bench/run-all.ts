export {};
// `npm run bench [name…]`: runs each benchmark in turn (never part of `npm test`).
const BENCHES: Record<string, () => Promise<{ run: () => Promise<void> }>> = {
  'catalog-list': () => import('./catalog-list.bench'),
  'read-path': () => import('./read-path.bench'),
  stations: () => import('./stations.bench'),
  'stock-check': () => import('./stock-check.bench'),
  dxf: () => import('./dxf.bench'),
  'import-load': () => import('./import-load.bench'),
  manifest: () => import('./manifest.bench'),
  'job-package': () => import('./job-package.bench'),
  program: () => import('./program.bench'),
};

const wanted = process.argv.slice(2);
for (const [name, load] of Object.entries(BENCHES)) {
  if (wanted.length && !wanted.includes(name)) continue;
  console.log(`\n== ${name} ==`);
  await (await load()).run();
}
process.exit(0);
