/**
 * `npm run lint:imports` (run by `npm test`): the import graph of client/src, server, shared and
 * scripts has no circles, and nothing in server/ or client/ imports from scripts/ (scripts start and
 * drive the app; the app never reaches back into them). Type-only imports count too: a circle of
 * types still ties two rooms together. Prints every offence and exits 1 when there is one.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseCircular, parseDependencyTree, type DependencyTree } from 'dpdm';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const ENTRIES = ['client/src/**/*.{ts,tsx}', 'server/**/*.ts', 'shared/**/*.ts', 'scripts/**/*.ts'];

/** Imports from server/ or client/ into scripts/, as "importer -> imported". */
export function wrongWayImports(tree: DependencyTree): string[] {
  const out: string[] = [];
  for (const [file, deps] of Object.entries(tree)) {
    if (!/^(server|client)\//.test(file)) continue;
    for (const d of deps ?? []) if (d.id?.startsWith('scripts/')) out.push(`${file} -> ${d.id}`);
  }
  return out;
}

const tree = await parseDependencyTree(ENTRIES, {
  cwd: ROOT,
  context: ROOT,
  tsconfig: path.join(ROOT, 'tsconfig.json'),
  transform: false,
  skipDynamicImports: false,
  // Packages are leaves: reading node_modules would only slow the walk down.
  exclude: /node_modules/,
});
const circles = parseCircular(tree);
const wrongWay = wrongWayImports(tree);
for (const c of circles) console.error(`circular import: ${[...c, c[0]].join(' -> ')}`);
for (const w of wrongWay) console.error(`import into scripts/ from the app: ${w}`);
if (circles.length || wrongWay.length) process.exit(1);
console.log(`imports: ${Object.keys(tree).length} files, no circles, nothing in server/ or client/ imports scripts/`);
