export {};
/**
 * `npm run bench`: every benchmark in one run, each printing its own figures.
 * Targets: engine < 20 ms for 4,000 boundaries and ≥ 1,000× faster than quadrature; API ≥ 1,000 req/s
 * with p99 < 150 ms; initial JavaScript for sign-in and survey list ≤ 170 KB gzipped.
 * `npm run bench -- engine` (or sync, bundle) runs one section.
 */
const sections: Record<string, () => Promise<{ main: () => Promise<unknown> | unknown }>> = {
  engine: () => import('./bench-engine'),
  sync: () => import('./bench-sync'),
  bundle: () => import('./bench-bundle'),
};

const wanted = process.argv.slice(2).filter((a) => a in sections);
for (const name of wanted.length ? wanted : Object.keys(sections)) {
  console.log(`\n=== ${name} ===`);
  const mod = await sections[name]();
  await mod.main();
}
process.exit(0);
