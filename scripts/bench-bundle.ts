/**
 * Bundle size: builds the client (Vite, into a temporary folder) and prints the JavaScript a first
 * visit downloads before it can show the sign-in screen and the survey list: the entry chunk, its
 * static imports, and each route's lazy chunk with its static imports, gzipped. Goal ≤ 170 KB per
 * route. Also prints the 3D model's chunk, which must stay out of both.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { fileURLToPath } from 'node:url';
import { build } from 'vite';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const GOAL_KB = 170;

interface ManifestChunk {
  file: string;
  imports?: string[];
  dynamicImports?: string[];
  isEntry?: boolean;
  src?: string;
}
type Manifest = Record<string, ManifestChunk>;

/** Files loaded with a chunk: itself and its static imports, recursively. */
function closure(manifest: Manifest, key: string, into = new Set<string>()): Set<string> {
  const c = manifest[key];
  if (!c || into.has(c.file)) return into;
  into.add(c.file);
  for (const i of c.imports ?? []) closure(manifest, i, into);
  return into;
}

const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`;

export async function main(): Promise<{ routes: Record<string, number>; model3dKb: number }> {
  const outDir = fs.mkdtempSync(path.join(os.tmpdir(), 'brineline-bundle-'));
  try {
    await build({ configFile: path.join(ROOT, 'vite.config.ts'), logLevel: 'error', build: { outDir, emptyOutDir: true, manifest: true } });
    const manifest = JSON.parse(fs.readFileSync(path.join(outDir, '.vite', 'manifest.json'), 'utf8')) as Manifest;
    const gz = (file: string) => gzipSync(fs.readFileSync(path.join(outDir, file))).length;
    const entryKey = Object.keys(manifest).find((k) => manifest[k].isEntry)!;
    const shell = closure(manifest, entryKey);
    const routes: Record<string, number> = {};
    const results: { route: string; files: number; bytes: number }[] = [];
    for (const [route, src] of [
      ['sign-in', 'src/app/routes/sign-in.tsx'],
      ['survey list', 'src/app/routes/surveys.tsx'],
    ] as const) {
      const files = new Set(shell);
      if (manifest[src]) closure(manifest, src, files);
      else console.warn(`  (no chunk for ${src}; counting the shell only)`);
      const bytes = [...files].filter((f) => f.endsWith('.js')).reduce((s, f) => s + gz(f), 0);
      routes[route] = bytes / 1024;
      results.push({ route, files: files.size, bytes });
    }
    console.log(`Initial JavaScript, gzipped (goal ≤ ${GOAL_KB} KB):`);
    for (const r of results) {
      console.log(`  ${r.route.padEnd(12)} ${kb(r.bytes).padStart(9)}  (${r.files} files)  ${r.bytes / 1024 <= GOAL_KB ? 'OK' : 'OVER GOAL'}`);
    }
    const sceneKey = Object.keys(manifest).find((k) => k.includes('features/model3d/components/survey-scene'));
    let model3dKb = 0;
    if (sceneKey) {
      const own = closure(manifest, sceneKey);
      const initial = new Set<string>([...shell]);
      for (const src of ['src/app/routes/sign-in.tsx', 'src/app/routes/surveys.tsx']) closure(manifest, src, initial);
      const extra = [...own].filter((f) => !initial.has(f) && f.endsWith('.js'));
      model3dKb = extra.reduce((s, f) => s + gz(f), 0) / 1024;
      const leaked = [...own].filter((f) => f === manifest[sceneKey].file && initial.has(f));
      console.log(`  3D model     ${kb(model3dKb * 1024).padStart(9)}  in its own chunks (${extra.length} files)${leaked.length ? ' — LEAKED INTO THE INITIAL LOAD' : ''}`);
    }
    return { routes, model3dKb };
  } finally {
    fs.rmSync(outDir, { recursive: true, force: true });
  }
}

const invokedDirectly = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (invokedDirectly) await main();
